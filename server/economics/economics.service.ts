import { randomUUID } from 'node:crypto';
import type { CurrentUser } from '../accounts/current-user';
import { assertCan } from '../accounts/policy';
import type { Database } from '../db/database';
import type { SitesService, SiteView } from '../sites/sites.service';
import {
  BUILT_IN_ECONOMICS,
  PARAMETER_NAMES,
  fromSiteDefaults,
  type EconomicParameters,
  type ParameterName,
  type ParameterSource,
} from './economics-parameters';
import { EconomicsChange, SiteEconomicsRecord } from './economics.model';

/** One recorded change of a parameter. */
export interface EconomicsChangeView {
  readonly id: string;
  readonly parameter: ParameterName;
  readonly oldValue: string | number | null;
  readonly newValue: string | number | null;
  readonly changedById: string;
  readonly changedByName: string;
  readonly changedAt: string;
}

/** A site's parameters in force, where each came from, and the history of changes (newest first). */
export interface EconomicsView {
  readonly siteId: string;
  readonly parameters: EconomicParameters;
  readonly sources: Readonly<Record<ParameterName, ParameterSource>>;
  readonly updatedAt: string | null;
  readonly history: readonly EconomicsChangeView[];
}

/** Longest history the screen shows; older changes stay in the table. */
const HISTORY_LIMIT = 200;

function changeView(change: EconomicsChange): EconomicsChangeView {
  return {
    id: change.id, parameter: change.parameter as ParameterName, oldValue: change.oldValue, newValue: change.newValue,
    changedById: change.changedById, changedByName: change.changedByName, changedAt: change.changedAt.toISOString(),
  };
}

/**
 * Economic parameters per site. In force: what the manager set, else the site's defaults (set by an
 * admin on the site), else the built-in starting values, each labelled with its source. A change
 * stores the whole set and one history row per parameter that really changed, in one transaction.
 */
export function createEconomicsService({ database, sites }: { database: Database; sites: SitesService }) {
  async function inForce(site: SiteView): Promise<{ parameters: EconomicParameters; sources: Record<ParameterName, ParameterSource>; updatedAt: string | null }> {
    const record = await SiteEconomicsRecord.findByPk(site.id);
    const siteDefaults = fromSiteDefaults(site.economics);
    const stored = (record?.parameters ?? {}) as Partial<EconomicParameters>;
    const parameters: Record<string, unknown> = {};
    const sources = {} as Record<ParameterName, ParameterSource>;
    for (const name of PARAMETER_NAMES) {
      if (stored[name] !== undefined) {
        parameters[name] = stored[name];
        sources[name] = 'site';
      } else if (siteDefaults[name] !== undefined) {
        parameters[name] = siteDefaults[name];
        sources[name] = 'site-default';
      } else {
        parameters[name] = BUILT_IN_ECONOMICS[name];
        sources[name] = 'built-in';
      }
    }
    return { parameters: parameters as unknown as EconomicParameters, sources, updatedAt: record?.updatedAt?.toISOString() ?? null };
  }

  async function get(user: CurrentUser, siteId: string): Promise<EconomicsView> {
    const site = await sites.get(user, siteId);
    assertCan(user, 'shortlist:read', { siteId: site.id });
    const current = await inForce(site);
    const history = await EconomicsChange.findAll({ where: { siteId: site.id }, order: [['changedAt', 'DESC'], ['id', 'ASC']], limit: HISTORY_LIMIT });
    return { siteId: site.id, ...current, history: history.map(changeView) };
  }

  return {
    /** The parameters in force for a site (no history), for the shortlist. */
    async parametersInForce(user: CurrentUser, siteId: string) {
      const site = await sites.get(user, siteId);
      return { site, ...(await inForce(site)) };
    },

    /** The parameters and their history, for anyone who may read the shortlist. */
    get,

    /** Sets some parameters (managers of the site), recording each change. */
    async update(user: CurrentUser, siteId: string, changes: Partial<EconomicParameters>): Promise<EconomicsView> {
      const site = await sites.get(user, siteId);
      assertCan(user, 'economics:manage', { siteId: site.id });
      await database.transaction(async (transaction) => {
        const current = await inForce(site);
        const record = await SiteEconomicsRecord.findByPk(site.id, { transaction });
        const next = { ...current.parameters, ...changes };
        // Only what the manager set is stored, so defaults stay labelled as defaults.
        const stored = { ...((record?.parameters ?? {}) as Partial<EconomicParameters>), ...changes };
        const now = new Date();
        for (const name of PARAMETER_NAMES) {
          const oldValue = current.parameters[name];
          const newValue = next[name];
          if (changes[name] !== undefined && oldValue !== newValue) {
            await EconomicsChange.create(
              { id: randomUUID(), siteId: site.id, parameter: name, oldValue, newValue, changedById: user.id, changedByName: user.name, changedAt: now },
              { transaction },
            );
          }
        }
        if (record) {
          await record.update({ parameters: stored as EconomicParameters, updatedById: user.id, revision: (record.revision ?? 0) + 1 }, { transaction });
        } else {
          await SiteEconomicsRecord.create({ siteId: site.id, parameters: stored as EconomicParameters, updatedById: user.id, revision: 1 }, { transaction });
        }
      });
      return get(user, siteId);
    },
  };
}

/** The economics service as routes and the shortlist use it. */
export type EconomicsService = ReturnType<typeof createEconomicsService>;
