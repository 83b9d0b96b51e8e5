import { Op, type Model, type WhereOptions } from 'sequelize';
import { pileSchema, sampleSchema, panTestSchema, type EntityData, type PileData, type SampleData } from '../../shared/sync/protocol';
import { tableRecordStore, type RecordStore } from '../sync/record-store';
import { RevisionCache, perDatabase, readDataRevision } from './data-revision';
import { PanTest } from './pan-test.model';
import { Pile } from './pile.model';
import { Sample } from './sample.model';

type FieldsOf<E extends 'pile' | 'sample' | 'panTest'> = (keyof EntityData[E] & string)[];

/** How sync reads and writes piles: top-level records of a site, with a code unique in the site. */
export const pileStore: RecordStore<'pile'> = tableRecordStore({
  entity: 'pile',
  model: Pile,
  fields: Object.keys(pileSchema.shape) as FieldsOf<'pile'>,
  hasCode: true,
});

/** How sync reads and writes samples: each belongs to a pile (and its site), with a code unique in the site. */
export const sampleStore: RecordStore<'sample'> = tableRecordStore({
  entity: 'sample',
  model: Sample,
  fields: Object.keys(sampleSchema.shape) as FieldsOf<'sample'>,
  dateFields: ['collectedAt'],
  parentOf: (sample) => ({ entity: 'pile', id: sample.pileId, field: 'pileId' }),
  hasCode: true,
});

/** How sync reads and writes pan tests: each belongs to a sample. */
export const panTestStore: RecordStore<'panTest'> = tableRecordStore({
  entity: 'panTest',
  model: PanTest,
  fields: Object.keys(panTestSchema.shape) as FieldsOf<'panTest'>,
  dateFields: ['testedAt'],
  parentOf: (panTest) => ({ entity: 'sample', id: panTest.sampleId, field: 'sampleId' }),
});

/** One page of a list. */
export interface Page<T> {
  readonly items: readonly T[];
  readonly total: number;
  readonly limit: number;
  readonly offset: number;
}

/** A record as the read routes show it: its data plus where it stands in sync. */
export type RecordView<T> = T & { readonly revision: number; readonly updatedAt: string; readonly createdById: string };

function toView<T>(row: Model, fields: readonly string[], dateFields: readonly string[] = []): RecordView<T> {
  const plain = row.get({ plain: true }) as Record<string, unknown>;
  const view: Record<string, unknown> = {};
  for (const field of fields) {
    const value = plain[field];
    view[field] = dateFields.includes(field) && value instanceof Date ? value.toISOString() : value;
  }
  view['revision'] = Number(plain['revision']);
  view['updatedAt'] = (plain['updatedAt'] as Date).toISOString();
  view['createdById'] = plain['createdById'];
  return view as RecordView<T>;
}

const PILE_FIELDS = Object.keys(pileSchema.shape);
const SAMPLE_FIELDS = Object.keys(sampleSchema.shape);

/** A stored date as ISO 8601 text: SQLite hands raw rows text (`2026-11-12 07:30:00.000 +00:00`), PostgreSQL a Date. */
function isoOf(value: unknown): string {
  return (value instanceof Date ? value : new Date(value as string)).toISOString();
}

/**
 * A sample as the read routes show it (the same object `toView` makes from a model instance),
 * from a raw row: reading rows raw skips Sequelize's per-instance work, which cost about 0.2 ms a
 * row (4 s for a site of 20,000 samples). SQLite gives JSON columns as text, PostgreSQL parsed.
 */
export function sampleViewOfRow(row: Record<string, unknown>): RecordView<SampleData> {
  const view: Record<string, unknown> = {};
  for (const field of SAMPLE_FIELDS) {
    view[field] = row[field];
  }
  const location = row['location'];
  view['location'] = typeof location === 'string' ? JSON.parse(location) : (location ?? null);
  view['collectedAt'] = isoOf(row['collectedAt']);
  view['revision'] = Number(row['revision']);
  view['updatedAt'] = isoOf(row['updatedAt']);
  view['createdById'] = row['createdById'];
  return view as RecordView<SampleData>;
}

/** The columns `sampleViewOfRow` reads. */
export const SAMPLE_VIEW_COLUMNS: readonly string[] = [...SAMPLE_FIELDS, 'revision', 'updatedAt', 'createdById'];

/** Live piles of some sites, by code. */
export async function findPiles(siteIds: 'all' | readonly string[], filter: { siteId?: string; limit: number; offset: number }): Promise<Page<RecordView<PileData>>> {
  const where: WhereOptions = { deletedAt: null, ...siteWhere(siteIds, filter.siteId) };
  const { rows, count } = await Pile.findAndCountAll({ where, order: [['code', 'ASC']], limit: filter.limit, offset: filter.offset });
  return { items: rows.map((row) => toView<PileData>(row, PILE_FIELDS)), total: count, limit: filter.limit, offset: filter.offset };
}

/** One live pile, or null. */
export async function findPile(id: string): Promise<RecordView<PileData> | null> {
  const row = await Pile.findOne({ where: { id, deletedAt: null } });
  return row ? toView<PileData>(row, PILE_FIELDS) : null;
}

/** The columns the sample list may be sorted by. */
export const SAMPLE_SORTS = ['code', 'collectedAt', 'sampleType', 'wetMassKg', 'pileCode'] as const;
/** A sample list's sort column. */
export type SampleSort = (typeof SAMPLE_SORTS)[number];
/** Which way a sort runs. */
export type SortDirection = 'asc' | 'desc';

/** Filters for the sample table. */
export interface SampleFilter {
  readonly siteId?: string;
  readonly pileId?: string;
  readonly sampleType?: SampleData['sampleType'];
  readonly codePrefix?: string;
  readonly collectedFrom?: string;
  readonly collectedTo?: string;
  /** Absent: newest first (`collectedAt` descending, then code), the order the list always had. */
  readonly sort?: SampleSort;
  readonly direction?: SortDirection;
  readonly limit: number;
  readonly offset: number;
}

/** A listed sample: the record and its pile's code. */
export type SampleListItem = RecordView<SampleData> & { readonly pileCode: string };

/** One page of samples, with the data revision it was read at and each item's site (not shown, for grading). */
export interface SamplePage extends Page<SampleListItem> {
  readonly revision: number;
  readonly itemSiteIds: readonly string[];
}

/**
 * How many samples match a filter, kept per data revision: counting is a scan of the site's index
 * entries (about 4 ms at 20,000 samples), repeated for every page otherwise. The key is the
 * filter and the sites it may see; any write of a sample anywhere moves the revision.
 */
const sampleTotals = perDatabase(() => new RevisionCache<number>(500));

/** Samples per pile under a filter, kept like the totals: the pile-code order pages through them. */
const samplesPerPile = perDatabase(() => new RevisionCache<ReadonlyMap<string, number>>(100));

type OrderTerm = [string, string];

/**
 * Each sort in its ascending form; descending is the exact reverse of every term, so each order
 * is one walk of an index, forwards or backwards (0007 and 0009 read indexes), and every order
 * ends on code (unique in a site, then the site) so pages never overlap. Sample weights may be
 * unknown: they sort as the smallest, stated in both dialects (SQLite's own NULL order,
 * which PostgreSQL reverses unless told).
 */
const ASCENDING: Record<Exclude<SampleSort, 'pileCode'>, readonly OrderTerm[]> = {
  code: [['code', 'ASC'], ['siteId', 'ASC']],
  collectedAt: [['collectedAt', 'ASC'], ['code', 'DESC'], ['siteId', 'DESC']],
  sampleType: [['sampleType', 'ASC'], ['collectedAt', 'DESC'], ['code', 'ASC'], ['siteId', 'ASC']],
  wetMassKg: [['wetMassKg', 'ASC NULLS FIRST'], ['collectedAt', 'DESC'], ['code', 'ASC'], ['siteId', 'ASC']],
};

/** Within one pile (the pile-code order): newest first ascending, its reverse descending. */
const WITHIN_PILE: readonly OrderTerm[] = [['collectedAt', 'DESC'], ['code', 'ASC']];

const REVERSED: Record<string, string> = { 'ASC': 'DESC', 'DESC': 'ASC', 'ASC NULLS FIRST': 'DESC NULLS LAST' };

function ordered(terms: readonly OrderTerm[], direction: SortDirection): OrderTerm[] {
  return terms.map(([column, way]) => [column, direction === 'asc' ? way : REVERSED[way]]);
}

/** The default order (no sort asked): newest first, then code, as the list always had it. */
const NEWEST_FIRST: readonly OrderTerm[] = [['collectedAt', 'DESC'], ['code', 'ASC']];

/**
 * Live samples of some sites with the filters applied, newest first unless another sort is asked,
 * each with its pile's code.
 */
export async function findSamples(siteIds: 'all' | readonly string[], filter: SampleFilter): Promise<SamplePage> {
  const where = sampleWhere(siteIds, filter);
  const { limit, offset, sort, direction, ...filters } = filter;
  const totalKey = JSON.stringify([siteIds === 'all' ? 'all' : [...siteIds].sort(), filters]);
  // The revision is read before the rows, so the rows are at least as new as the total kept under it.
  const revision = await readDataRevision();
  const [rows, total] = sort === 'pileCode'
    ? await byPileCode(siteIds, filter, where, totalKey, revision)
    : await Promise.all([
      Sample.findAll({
        attributes: [...SAMPLE_VIEW_COLUMNS, 'siteId'], where, limit, offset, raw: true,
        order: sort ? ordered(ASCENDING[sort], direction ?? 'asc') : [...NEWEST_FIRST],
      }) as unknown as Promise<Record<string, unknown>[]>,
      sampleTotals().get(totalKey, revision, () => Sample.count({ where })),
    ]);
  const codes = await pileCodesOf(rows.map((row) => row['pileId'] as string), revision);
  const items = rows.map((row) => ({ ...sampleViewOfRow(row), pileCode: codes.get(row['pileId'] as string) ?? '' }));
  return { items, total, limit, offset, revision, itemSiteIds: rows.map((row) => row['siteId'] as string) };
}

/**
 * Pile codes by pile id, kept per data revision (a pile's code changes only through sync, which
 * moves it): the piles of every page are read once, not once a page.
 */
const pileCodes = perDatabase(() => new RevisionCache<ReadonlyMap<string, string>>(100));

/** The codes of these piles, by id (a page names a few piles: a site holds tens). */
async function pileCodesOf(pileIds: readonly string[], revision: number): Promise<ReadonlyMap<string, string>> {
  const unique = [...new Set(pileIds)].sort();
  if (unique.length === 0) {
    return new Map();
  }
  return pileCodes().get(JSON.stringify(unique), revision, async () => {
    const piles = (await Pile.findAll({ attributes: ['id', 'code'], where: { id: { [Op.in]: unique } }, raw: true })) as unknown as { id: string; code: string }[];
    return new Map(piles.map((pile) => [pile.id, pile.code]));
  });
}

/**
 * A page in pile-code order without a join: the piles the caller may read by code (a site holds
 * tens), how many matching samples each holds (one grouped count, kept per data revision), then
 * each pile that the page overlaps read in its own index order (0009's pileId index), skipping
 * into the first. Piles are ordered by code, then site, then id; samples within a pile newest
 * first. Descending reverses all three.
 */
async function byPileCode(
  siteIds: 'all' | readonly string[], filter: SampleFilter, where: WhereOptions, totalKey: string, revision: number,
): Promise<[Record<string, unknown>[], number]> {
  const direction = filter.direction ?? 'asc';
  const pileWhere: WhereOptions = { ...siteWhere(siteIds, filter.siteId), ...(filter.pileId ? { id: filter.pileId } : {}) };
  const [piles, counts] = await Promise.all([
    Pile.findAll({ attributes: ['id'], where: pileWhere, order: ordered([['code', 'ASC'], ['siteId', 'ASC'], ['id', 'ASC']], direction), raw: true }) as unknown as Promise<{ id: string }[]>,
    samplesPerPile().get(totalKey, revision, async () => {
      const grouped = (await Sample.count({ where, group: ['pileId'] })) as unknown as { pileId: string; count: number | string }[];
      return new Map(grouped.map((group) => [group.pileId, Number(group.count)]));
    }),
  ]);
  const total = [...counts.values()].reduce((sum, count) => sum + count, 0);
  const rows: Record<string, unknown>[] = [];
  let skip = filter.offset;
  for (const pile of piles) {
    const held = counts.get(pile.id) ?? 0;
    if (rows.length >= filter.limit) {
      break;
    }
    if (skip >= held) {
      skip -= held;
      continue;
    }
    const page = (await Sample.findAll({
      attributes: [...SAMPLE_VIEW_COLUMNS, 'siteId'], where: { ...where, pileId: pile.id } as WhereOptions,
      order: ordered(WITHIN_PILE, direction), limit: filter.limit - rows.length, offset: skip, raw: true,
    })) as unknown as Record<string, unknown>[];
    rows.push(...page);
    skip = 0;
  }
  return [rows, total];
}

/** The WHERE of a sample list: live samples of the sites the caller may read, with the filters applied. */
function sampleWhere(siteIds: 'all' | readonly string[], filter: SampleFilter): WhereOptions {
  const where: Record<string | symbol, unknown> = { deletedAt: null, ...siteWhere(siteIds, filter.siteId) };
  if (filter.pileId) {
    where['pileId'] = filter.pileId;
  }
  if (filter.sampleType) {
    where['sampleType'] = filter.sampleType;
  }
  if (filter.codePrefix) {
    where['code'] = { [Op.startsWith]: filter.codePrefix };
  }
  if (filter.collectedFrom || filter.collectedTo) {
    where['collectedAt'] = {
      ...(filter.collectedFrom ? { [Op.gte]: new Date(filter.collectedFrom) } : {}),
      ...(filter.collectedTo ? { [Op.lte]: new Date(filter.collectedTo) } : {}),
    };
  }
  return where;
}

function siteWhere(siteIds: 'all' | readonly string[], siteId: string | undefined): Record<string, unknown> {
  if (siteIds === 'all') {
    return siteId ? { siteId } : {};
  }
  if (siteId) {
    return { siteId: siteIds.includes(siteId) ? siteId : { [Op.in]: [] } };
  }
  return { siteId: { [Op.in]: [...siteIds] } };
}
