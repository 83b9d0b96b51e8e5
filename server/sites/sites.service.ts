import { randomUUID } from 'node:crypto';
import type { CurrentUser } from '../accounts/current-user';
import { assertCan, readableSiteIds } from '../accounts/policy';
import type { Database } from '../db/database';
import { AppError } from '../lib/errors';
import { readEconomics, type SiteEconomics } from './site-economics';
import { Site } from './site.model';

/** A site as the API answers it. */
export interface SiteView {
  readonly id: string;
  readonly organizationId: string;
  readonly code: string;
  readonly name: string;
  readonly processingLat: number | null;
  readonly processingLon: number | null;
  readonly economics: SiteEconomics | null;
  readonly createdAt: string | null;
  readonly updatedAt: string | null;
}

/** What a new site needs, and what a change may carry. */
export interface SiteInput {
  readonly code: string;
  readonly name: string;
  readonly processingLat?: number | null;
  readonly processingLon?: number | null;
  readonly economics?: SiteEconomics | null;
}

function view(site: Site): SiteView {
  return {
    id: site.id, organizationId: site.organizationId, code: site.code, name: site.name,
    processingLat: site.processingLat, processingLon: site.processingLon, economics: readEconomics(site.economics),
    createdAt: site.createdAt?.toISOString() ?? null, updatedAt: site.updatedAt?.toISOString() ?? null,
  };
}

/** Sites: everyone reads the ones they belong to (admins all of their organisation); admins add and edit. */
export function createSitesService({ database }: { database: Database }) {
  async function loadSite(user: CurrentUser, id: string): Promise<Site> {
    const site = await Site.findOne({ where: { id, organizationId: user.organizationId } });
    if (!site) {
      throw new AppError('not_found', 'No such site');
    }
    return site;
  }

  async function assertCodeFree(code: string, exceptId: string | null): Promise<void> {
    const taken = await Site.findOne({ where: { code }, paranoid: false });
    if (taken && taken.id !== exceptId) {
      throw new AppError('conflict', `Site code ${code} is already used`, { field: 'code' });
    }
  }

  return {
    async list(user: CurrentUser): Promise<SiteView[]> {
      const readable = readableSiteIds(user);
      const where = readable === 'all' ? { organizationId: user.organizationId } : { organizationId: user.organizationId, id: [...readable] };
      return (await Site.findAll({ where, order: [['code', 'ASC']] })).map(view);
    },

    async get(user: CurrentUser, id: string): Promise<SiteView> {
      const site = await loadSite(user, id);
      assertCan(user, 'site:read', { siteId: site.id });
      return view(site);
    },

    async create(user: CurrentUser, input: SiteInput): Promise<SiteView> {
      assertCan(user, 'sites:manage');
      return database.transaction(async (transaction) => {
        await assertCodeFree(input.code, null);
        const site = await Site.create(
          {
            id: randomUUID(), organizationId: user.organizationId, code: input.code, name: input.name,
            processingLat: input.processingLat ?? null, processingLon: input.processingLon ?? null,
            economics: input.economics ? JSON.stringify(input.economics) : null,
          },
          { transaction },
        );
        return view(site);
      });
    },

    async update(user: CurrentUser, id: string, changes: Partial<SiteInput>): Promise<SiteView> {
      assertCan(user, 'sites:manage');
      const site = await loadSite(user, id);
      return database.transaction(async (transaction) => {
        if (changes.code && changes.code !== site.code) {
          await assertCodeFree(changes.code, site.id);
        }
        await site.update(
          {
            code: changes.code ?? site.code,
            name: changes.name ?? site.name,
            processingLat: changes.processingLat === undefined ? site.processingLat : changes.processingLat,
            processingLon: changes.processingLon === undefined ? site.processingLon : changes.processingLon,
            economics: changes.economics === undefined ? site.economics : changes.economics ? JSON.stringify(changes.economics) : null,
          },
          { transaction },
        );
        return view(site);
      });
    },
  };
}

/** The sites service as routes use it. */
export type SitesService = ReturnType<typeof createSitesService>;
