import { randomUUID } from 'node:crypto';
import { Op } from 'sequelize';
import type { CurrentUser } from '../accounts/current-user';
import { assertCan, can } from '../accounts/policy';
import { Pile } from '../capture/pile.model';
import type { Database } from '../db/database';
import type { EconomicsService } from '../economics/economics.service';
import { AppError } from '../lib/errors';
import { engineErrorDetails, trialFigures, workingRecovery, type TrialFigures, type WorkingRecovery } from './trial-figures';
import type { TrialInput } from './trial-schemas';
import { Trial, type TrialStatus } from './trial.model';

/** A trial as the API answers it: the record, the pile codes and the computed figures. */
export interface TrialView extends TrialFigures {
  readonly id: string;
  readonly siteId: string;
  readonly pileIds: readonly string[];
  readonly pileCodes: readonly string[];
  readonly trialDate: string;
  readonly equipmentNote: string;
  readonly feedMassKg: number;
  readonly feedGradeGpt: number;
  readonly concentrateMassKg: number;
  readonly concentrateGradeGpt: number;
  readonly tailingsGradeGpt: number;
  readonly middlingsMassKg: number | null;
  readonly middlingsGradeGpt: number | null;
  readonly status: TrialStatus;
  readonly createdById: string;
  readonly createdAt: string | null;
}

/** One site's trials with the recovery the shortlist takes from them. */
export interface TrialList {
  readonly siteId: string;
  readonly items: readonly TrialView[];
  readonly workingRecovery: WorkingRecovery;
  readonly discrepancyTolerance: number;
}

function assertMayRead(user: CurrentUser, siteId: string): void {
  if (!can(user, 'trials:manage', { siteId }) && !can(user, 'shortlist:read', { siteId })) {
    throw new AppError('forbidden', 'You do not have permission to do this', { permission: 'trials:manage' });
  }
}

/**
 * Trials: geologists and managers of a site record them; the server computes every figure with
 * the numbers engine (never trusting the client's) and refuses a trial the formula cannot take.
 */
export function createTrialsService({ database, economics }: { database: Database; economics: EconomicsService }) {
  async function pileCodes(ids: readonly string[]): Promise<Map<string, string>> {
    const piles = ids.length === 0 ? [] : await Pile.findAll({ where: { id: { [Op.in]: [...ids] } }, attributes: ['id', 'code'] });
    return new Map(piles.map((pile) => [pile.id, pile.code]));
  }

  function view(trial: Trial, codes: Map<string, string>, tolerance: number): TrialView {
    const figures = trialFigures(trial, tolerance);
    if (!figures.ok) {
      // Stored trials were checked on the way in; a failure here is a broken invariant.
      throw new Error(`stored trial ${trial.id} no longer evaluates: ${figures.errors.map((error) => error.message).join('; ')}`);
    }
    return {
      id: trial.id, siteId: trial.siteId, pileIds: trial.pileIds, pileCodes: trial.pileIds.map((id) => codes.get(id) ?? '(removed pile)'),
      trialDate: trial.trialDate, equipmentNote: trial.equipmentNote,
      feedMassKg: trial.feedMassKg, feedGradeGpt: trial.feedGradeGpt, concentrateMassKg: trial.concentrateMassKg,
      concentrateGradeGpt: trial.concentrateGradeGpt, tailingsGradeGpt: trial.tailingsGradeGpt,
      middlingsMassKg: trial.middlingsMassKg, middlingsGradeGpt: trial.middlingsGradeGpt,
      status: trial.status, createdById: trial.createdById, createdAt: trial.createdAt?.toISOString() ?? null,
      ...figures.value,
    };
  }

  async function listViews(siteId: string, tolerance: number): Promise<TrialView[]> {
    const trials = await Trial.findAll({ where: { siteId }, order: [['trialDate', 'DESC'], ['createdAt', 'DESC']] });
    const codes = await pileCodes([...new Set(trials.flatMap((trial) => trial.pileIds))]);
    return trials.map((trial) => view(trial, codes, tolerance));
  }

  /** The site's working recovery from its accepted trials, or the stated default. */
  async function recoveryFor(siteId: string, defaultRecovery: number, tolerance: number): Promise<WorkingRecovery> {
    const accepted = (await listViews(siteId, tolerance)).filter((trial) => trial.status === 'accepted');
    return workingRecovery(accepted, defaultRecovery);
  }

  return {
    recoveryFor,

    async list(user: CurrentUser, siteId: string): Promise<TrialList> {
      const { site, parameters } = await economics.parametersInForce(user, siteId);
      assertMayRead(user, site.id);
      const items = await listViews(site.id, parameters.discrepancyTolerance);
      const accepted = items.filter((trial) => trial.status === 'accepted');
      return { siteId: site.id, items, workingRecovery: workingRecovery(accepted, parameters.defaultRecovery), discrepancyTolerance: parameters.discrepancyTolerance };
    },

    async create(user: CurrentUser, input: TrialInput): Promise<TrialView> {
      const { site, parameters } = await economics.parametersInForce(user, input.siteId);
      assertCan(user, 'trials:manage', { siteId: site.id });
      const figures = trialFigures({ ...input }, parameters.discrepancyTolerance);
      if (!figures.ok) {
        throw new AppError('validation_failed', 'The trial is not valid', engineErrorDetails(figures.errors));
      }
      const pileIds = [...new Set(input.pileIds)];
      const trial = await database.transaction(async (transaction) => {
        const piles = await Pile.findAll({ where: { id: { [Op.in]: pileIds }, siteId: site.id, deletedAt: null }, attributes: ['id'], transaction });
        const found = new Set(piles.map((pile) => pile.id));
        const missing = pileIds.filter((id) => !found.has(id));
        if (missing.length > 0) {
          throw new AppError('validation_failed', 'The trial is not valid', missing.map((id) => ({ path: 'pileIds', message: `no pile ${id} at this site` })));
        }
        return Trial.create(
          {
            id: randomUUID(), siteId: site.id, pileIds, trialDate: input.trialDate, equipmentNote: input.equipmentNote,
            feedMassKg: input.feedMassKg, feedGradeGpt: input.feedGradeGpt, concentrateMassKg: input.concentrateMassKg,
            concentrateGradeGpt: input.concentrateGradeGpt, tailingsGradeGpt: input.tailingsGradeGpt,
            middlingsMassKg: input.middlingsMassKg, middlingsGradeGpt: input.middlingsGradeGpt, status: input.status,
            createdById: user.id, revision: 1,
          },
          { transaction },
        );
      });
      return view(trial, await pileCodes(trial.pileIds), parameters.discrepancyTolerance);
    },

    async setStatus(user: CurrentUser, id: string, status: TrialStatus): Promise<TrialView> {
      const trial = await Trial.findByPk(id);
      if (!trial) {
        throw new AppError('not_found', 'No such trial');
      }
      const { site, parameters } = await economics.parametersInForce(user, trial.siteId);
      assertCan(user, 'trials:manage', { siteId: site.id });
      await database.transaction((transaction) => trial.update({ status, revision: (trial.revision ?? 0) + 1 }, { transaction }));
      return view(trial, await pileCodes(trial.pileIds), parameters.discrepancyTolerance);
    },
  };
}

/** The trials service as routes and the shortlist use it. */
export type TrialsService = ReturnType<typeof createTrialsService>;
