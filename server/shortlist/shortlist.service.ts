import type { CurrentUser } from '../accounts/current-user';
import { assertCan } from '../accounts/policy';
import { Pile } from '../capture/pile.model';
import { PARAMETER_NAMES, type EconomicParameters, type EconomicsOverrides, type ParameterName, type ParameterSource } from '../economics/economics-parameters';
import type { EconomicsService } from '../economics/economics.service';
import { AppError } from '../lib/errors';
import { engineErrorDetails } from '../trials/trial-figures';
import type { TrialsService } from '../trials/trials.service';
import { buildShortlist, type Economics, type LonLat, type ScenarioRanks, type ShortlistPile } from '../../shared/engine';
import type { PileData } from '../../shared/sync/protocol';
import { estimatePileKept } from '../review/estimate-cache';
import { sampleGradesForSitePiles, type PileSampleGrades } from './sample-grades';

/** Where the recovery in force came from. */
export type RecoverySource = 'trials' | 'default' | 'query';

/** One pile on the shortlist: ranked with its money, or marked as too thin to rank and why. */
export interface ShortlistRow {
  readonly pileId: string;
  readonly code: string;
  readonly material: PileData['material'];
  readonly isRankable: boolean;
  /** Why the pile is not ranked (empty when it is). */
  readonly thinDataReasons: readonly string[];
  /** Counted samples with a grade (blanks and standards left out). */
  readonly sampleCount: number;
  readonly samplesWithoutGrade: number;
  readonly gradeSource: string | null;
  readonly dryTonnes: number | null;
  /** Best estimate of grade (mean), g/t. */
  readonly gradeGpt: number | null;
  /** Conservative grade: lower bound of the grade's confidence interval, g/t. */
  readonly gradeLowGpt: number | null;
  readonly gradeHighGpt: number | null;
  readonly centroid: LonLat | null;
  readonly footprint: PileData['footprint'];
  readonly containedAuG: number | null;
  readonly recoverableAuG: number | null;
  readonly grossValue: number | null;
  readonly haulDistanceKm: number | null;
  readonly haulCost: number | null;
  readonly processingCost: number | null;
  readonly fixedCost: number | null;
  readonly ownerShare: number | null;
  readonly netValue: number | null;
  readonly valuePerTonne: number | null;
  /** Null when no grade pays (a pile with no tonnes). */
  readonly breakEvenGradeGpt: number | null;
  readonly conservativeNetValue: number | null;
  readonly rank: number | null;
  readonly conservativeRank: number | null;
  readonly ranks: ScenarioRanks | null;
  readonly netValueByScenario: Readonly<Record<keyof ScenarioRanks, number>> | null;
  readonly warnings: readonly string[];
}

/** The shortlist of a site, with everything it was computed from. */
export interface ShortlistView {
  readonly site: { readonly id: string; readonly code: string; readonly name: string; readonly processingPoint: LonLat | null };
  readonly generatedAt: string;
  readonly parameters: EconomicParameters & { readonly recovery: number };
  readonly sources: Readonly<Record<ParameterName, ParameterSource>>;
  readonly recoverySource: RecoverySource;
  readonly acceptedTrialCount: number;
  readonly sensitivityStep: number;
  /** Ranked piles by rank, then the piles too thin to rank, by code. */
  readonly rows: readonly ShortlistRow[];
  readonly assumptions: readonly string[];
}

const EMPTY_MONEY = {
  containedAuG: null, recoverableAuG: null, grossValue: null, haulDistanceKm: null, haulCost: null, processingCost: null, fixedCost: null,
  ownerShare: null, netValue: null, valuePerTonne: null, breakEvenGradeGpt: null, conservativeNetValue: null, rank: null, conservativeRank: null,
  ranks: null, netValueByScenario: null,
} as const;

/** Sensitivity step of the ranks, from the engine's result; 0.2 when nothing was ranked. */
const DEFAULT_SENSITIVITY_STEP = 0.2;

/**
 * The shortlist (DESIGN §2 step 8, §7), computed on the server from stored data only: piles and
 * their sample grades from the lab loop (assay, else calibrated pan, else pan), the site's parameters and
 * working recovery from its accepted trials, with any what-if override from the query. Every
 * figure comes from the numbers engine (`estimatePile`, `buildShortlist`).
 */
export function createShortlistService({ economics, trials }: { economics: EconomicsService; trials: TrialsService }) {
  return {
    async build(user: CurrentUser, siteId: string, overrides: EconomicsOverrides, now: Date = new Date()): Promise<ShortlistView> {
      const inForce = await economics.parametersInForce(user, siteId);
      const { site } = inForce;
      assertCan(user, 'shortlist:read', { siteId: site.id });

      const sources = { ...inForce.sources };
      const merged: Record<string, unknown> = { ...inForce.parameters };
      for (const name of PARAMETER_NAMES) {
        if (overrides[name] !== undefined) {
          merged[name] = overrides[name];
          sources[name] = 'query';
        }
      }
      const parameters = merged as unknown as EconomicParameters;
      const fromTrials = await trials.recoveryFor(site.id, parameters.defaultRecovery, parameters.discrepancyTolerance);
      const recovery = overrides.recovery ?? fromTrials.recovery;
      const recoverySource: RecoverySource = overrides.recovery !== undefined ? 'query' : fromTrials.source;
      const processingPoint = site.processingLat !== null && site.processingLon !== null ? { lon: site.processingLon, lat: site.processingLat } : null;

      const piles = await Pile.findAll({ where: { siteId: site.id, deletedAt: null }, order: [['code', 'ASC']] });
      const grades = await sampleGradesForSitePiles(site.id, piles.map((pile) => pile.id));
      const rows: ShortlistRow[] = [];
      const rankable: ShortlistPile[] = [];
      for (const pile of piles) {
        const pileGrades = grades.byPile.get(pile.id) as PileSampleGrades;
        const estimate = estimatePileKept(
          {
            material: pile.material, footprint: pile.footprint ?? undefined, heightM: pile.heightM ?? undefined, shapeModel: pile.shapeModel,
            angleOfReposeDeg: pile.angleOfReposeDeg, bulkDensityTPerM3: pile.bulkDensityTPerM3, moisturePct: pile.moisturePct,
            spotHeights: pile.spotHeights ?? undefined, sackCount: pile.sackCount ?? undefined, sackMassKg: pile.sackMassKg ?? undefined,
          },
          pileGrades.samples,
          { confidenceLevel: parameters.confidenceLevel, calibration: grades.calibration },
          pileGrades.samplesDigest,
        );
        const reasons: string[] = [];
        const value = estimate.ok ? estimate.value : null;
        if (!estimate.ok) {
          reasons.push(`no tonnage: ${estimate.errors.map((error) => error.message).join('; ')}`);
        } else if (!(estimate.value.dryTonnes > 0)) {
          reasons.push('no tonnage');
        }
        const grade = value?.grade ?? null;
        if (!grade) {
          reasons.push('no graded samples yet');
        } else if (grade.n < parameters.minSamplesToRank) {
          reasons.push(`too few samples: ${grade.n} graded, ${parameters.minSamplesToRank} needed to rank`);
        }
        if (estimate.ok && !value?.centroid) {
          reasons.push('no footprint, so no haul distance');
        }
        if (!processingPoint) {
          reasons.push('the site has no processing point, so no haul distance');
        }
        const row: ShortlistRow = {
          pileId: pile.id, code: pile.code, material: pile.material, isRankable: reasons.length === 0, thinDataReasons: reasons,
          sampleCount: grade?.n ?? 0, samplesWithoutGrade: pileGrades.withoutGrade, gradeSource: grade?.source ?? null,
          dryTonnes: value?.dryTonnes ?? null, gradeGpt: grade?.meanGpt ?? null, gradeLowGpt: grade?.ciLowGpt ?? null, gradeHighGpt: grade?.ciHighGpt ?? null,
          centroid: value?.centroid ?? null, footprint: pile.footprint, ...EMPTY_MONEY,
          warnings: value?.warnings.map((warning) => warning.message) ?? [],
        };
        rows.push(row);
        if (row.isRankable && value && grade && value.centroid && grade.ciLowGpt !== null) {
          rankable.push({ pileId: pile.id, code: pile.code, dryTonnes: value.dryTonnes, centroid: value.centroid, gradeGpt: grade.meanGpt, gradeLowGpt: Math.min(grade.ciLowGpt, grade.meanGpt) });
        }
      }

      const engineEconomics: Economics = {
        goldPricePerTroyOz: parameters.goldPricePerTroyOz, payableFraction: parameters.payableFraction, haulCostPerTKm: parameters.haulCostPerTKm,
        roadFactor: parameters.roadFactor, processingPoint: processingPoint ?? { lon: 0, lat: 0 }, processingCostPerT: parameters.processingCostPerT,
        fixedCostPerPile: parameters.fixedCostPerPile, ownerShareOfGross: parameters.ownerShareOfGross, recovery, confidenceLevel: parameters.confidenceLevel,
      };
      let notes: readonly string[] = [];
      let sensitivityStep = DEFAULT_SENSITIVITY_STEP;
      const ranked = new Map<string, Partial<ShortlistRow>>();
      if (rankable.length > 0) {
        const shortlist = buildShortlist(rankable, engineEconomics);
        if (!shortlist.ok) {
          throw new AppError('validation_failed', 'The economic parameters cannot be used', engineErrorDetails(shortlist.errors));
        }
        notes = shortlist.value.assumptions.notes;
        sensitivityStep = shortlist.value.assumptions.sensitivityStep;
        for (const entry of shortlist.value.entries) {
          ranked.set(entry.pileId, {
            containedAuG: entry.containedAuG, recoverableAuG: entry.recoverableAuG, grossValue: entry.grossValue, haulDistanceKm: entry.haulDistanceKm,
            haulCost: entry.haulCost, processingCost: entry.processingCost, fixedCost: entry.fixedCost, ownerShare: entry.ownerShare,
            netValue: entry.netValue, valuePerTonne: entry.valuePerTonne,
            breakEvenGradeGpt: Number.isFinite(entry.breakEvenGradeGpt) ? entry.breakEvenGradeGpt : null,
            conservativeNetValue: entry.conservativeNetValue, rank: entry.rank, conservativeRank: entry.conservativeRank,
            ranks: entry.ranks, netValueByScenario: entry.netValueByScenario,
          });
        }
      }
      const finalRows = rows
        .map((row) => ({ ...row, ...(ranked.get(row.pileId) ?? {}) }))
        .sort((a, b) => (a.rank ?? Infinity) - (b.rank ?? Infinity) || a.code.localeCompare(b.code));

      const assumptions = [
        recoverySource === 'trials'
          ? `recovery ${(recovery * 100).toFixed(1)} %: feed-mass-weighted two-product recovery of ${fromTrials.trialCount} accepted trial(s)`
          : recoverySource === 'query'
            ? `recovery ${(recovery * 100).toFixed(1)} %: what-if value, not from trials`
            : `recovery ${(recovery * 100).toFixed(1)} %: stated default, no accepted trial yet`,
        'grade: assay where present, else calibrated pan estimate, else pan estimate (flagged per pile)',
        `piles with fewer than ${parameters.minSamplesToRank} graded samples, no tonnage or no haul distance are listed but not ranked`,
        ...notes,
        ...PARAMETER_NAMES.filter((name) => sources[name] === 'built-in').map((name) => `${name} is the built-in default (${String(parameters[name])}), not set for this site`),
      ];
      return {
        site: { id: site.id, code: site.code, name: site.name, processingPoint },
        generatedAt: now.toISOString(),
        parameters: { ...parameters, recovery },
        sources,
        recoverySource,
        acceptedTrialCount: fromTrials.trialCount,
        sensitivityStep,
        rows: finalRows,
        assumptions,
      };
    },
  };
}

/** The shortlist service as routes use it. */
export type ShortlistService = ReturnType<typeof createShortlistService>;
