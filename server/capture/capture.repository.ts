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

/** Filters for the sample table. */
export interface SampleFilter {
  readonly siteId?: string;
  readonly pileId?: string;
  readonly sampleType?: SampleData['sampleType'];
  readonly codePrefix?: string;
  readonly collectedFrom?: string;
  readonly collectedTo?: string;
  readonly limit: number;
  readonly offset: number;
}

/**
 * How many samples match a filter, kept per data revision: counting is a scan of the site's index
 * entries (about 4 ms at 20,000 samples), repeated for every page otherwise. The key is the
 * filter and the sites it may see; any write of a sample anywhere moves the revision.
 */
const sampleTotals = perDatabase(() => new RevisionCache<number>(500));

/** Live samples of some sites, newest first, with the filters applied. */
export async function findSamples(siteIds: 'all' | readonly string[], filter: SampleFilter): Promise<Page<RecordView<SampleData>>> {
  const where = sampleWhere(siteIds, filter);
  const { limit, offset, ...filters } = filter;
  const totalKey = JSON.stringify([siteIds === 'all' ? 'all' : [...siteIds].sort(), filters]);
  // The revision is read before the rows, so the rows are at least as new as the total kept under it.
  const revision = await readDataRevision();
  const [rows, total] = await Promise.all([
    Sample.findAll({ attributes: [...SAMPLE_VIEW_COLUMNS], where, order: [['collectedAt', 'DESC'], ['code', 'ASC']], limit, offset, raw: true }),
    sampleTotals().get(totalKey, revision, () => Sample.count({ where })),
  ]);
  return { items: (rows as unknown as Record<string, unknown>[]).map(sampleViewOfRow), total, limit, offset };
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
