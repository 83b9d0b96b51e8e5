import { DataTypes, Op, type Model, type ModelStatic, type Order, type Transaction, type WhereOptions } from 'sequelize';
import type { EntityData, SyncEntity } from '../../shared/sync/protocol';
import { insertRows } from './insert-rows';

/** A synced record as the sync service sees it: where it lives, who owns it, and its data in API names. */
export interface StoredRecord<E extends SyncEntity = SyncEntity> {
  readonly entity: E;
  readonly id: string;
  readonly siteId: string;
  readonly ownerId: string;
  readonly revision: number;
  readonly deletedAt: Date | null;
  readonly data: EntityData[E];
}

/** A reference from a record to the record it belongs to (a sample's pile, a photo's sample). */
export interface ParentRef {
  readonly entity: SyncEntity;
  readonly id: string;
  /** The data field that holds the reference, for the error message. */
  readonly field: string;
}

/** One record to write: its data (null keeps the stored data, for a delete) and its new sync columns. */
export interface RecordWrite<E extends SyncEntity = SyncEntity> {
  readonly id: string;
  readonly siteId: string;
  readonly data: EntityData[E];
  readonly revision: number;
  readonly deletedAt: Date | null;
  readonly createdById: string;
  readonly deviceId: string | null;
}

/** How the sync service reads and writes one entity's table (Sequelize in, plain objects out). */
export interface RecordStore<E extends SyncEntity = SyncEntity> {
  readonly entity: E;
  /** Records by id, deleted ones included. */
  findMany(ids: readonly string[], transaction?: Transaction): Promise<Map<string, StoredRecord<E>>>;
  /** The record this one belongs to, or null for a top-level record (a pile belongs to its site). */
  parentOf(data: EntityData[E]): ParentRef | null;
  /** The site a top-level record names itself. */
  ownSiteId(data: EntityData[E]): string | null;
  /** The human code a record carries, if its kind has one (unique per site). */
  codeOf(data: EntityData[E]): string | null;
  /** Ids of records holding each of these codes at a site. */
  findIdsByCode(siteId: string, codes: readonly string[], transaction: Transaction): Promise<Map<string, string>>;
  /** Creates or replaces the rows, in one statement (an upsert on the id). */
  writeMany(writes: readonly RecordWrite<E>[], transaction: Transaction): Promise<void>;
}

/** What a table-backed store needs to know about its entity. */
export interface TableStoreOptions<E extends SyncEntity> {
  readonly entity: E;
  readonly model: ModelStatic<Model>;
  /** The data fields in API names, which are also the column names. */
  readonly fields: readonly (keyof EntityData[E] & string)[];
  /** Fields stored as DATE and sent as ISO 8601 text. */
  readonly dateFields?: readonly string[];
  readonly parentOf?: (data: EntityData[E]) => ParentRef | null;
  readonly hasCode?: boolean;
  /** Columns set on a write besides the data fields (e.g. a photo's stored sizes on create). */
  readonly extraOnCreate?: Record<string, unknown>;
}

/** A RecordStore over one Sequelize model whose columns are the API field names. */
export function tableRecordStore<E extends SyncEntity>(options: TableStoreOptions<E>): RecordStore<E> {
  const { entity, model, fields, dateFields = [], hasCode = false } = options;
  const toData = (row: Record<string, unknown>): EntityData[E] => {
    const data: Record<string, unknown> = {};
    for (const field of fields) {
      const value = row[field];
      data[field] = dateFields.includes(field) && value instanceof Date ? value.toISOString() : value;
    }
    return data as EntityData[E];
  };
  // Made on first read: the store is declared before its model is bound to a database.
  let reader: RawRowReader | null = null;
  const readRow = (): RawRowReader => (reader ??= rawRowReader(model, ['id', 'siteId', 'createdById', 'revision', 'deletedAt', ...fields]));
  const toStored = (raw: Record<string, unknown>): StoredRecord<E> => {
    const plain = readRow()(raw);
    return {
      entity,
      id: plain['id'] as string,
      siteId: plain['siteId'] as string,
      ownerId: plain['createdById'] as string,
      revision: Number(plain['revision']),
      deletedAt: (plain['deletedAt'] as Date | null) ?? null,
      data: toData(plain),
    };
  };
  const writableColumns = [...new Set([...fields, 'siteId', 'revision', 'deletedAt', 'deviceId', 'updatedAt'])];

  return {
    entity,
    async findMany(ids, transaction) {
      if (ids.length === 0) {
        return new Map();
      }
      // Raw rows of only the columns used: building a model instance per row cost most of a pull's
      // time (about 0.05 ms a row); `readRow` gives the values an instance would have held.
      const rows = await selectRaw(model, { attributes: readRow().columns, where: { id: { [Op.in]: [...new Set(ids)] } }, transaction });
      return new Map(rows.map((row) => {
        const stored = toStored(row);
        return [stored.id, stored];
      }));
    },
    parentOf: (data) => options.parentOf?.(data) ?? null,
    ownSiteId: (data) => (options.parentOf ? null : ((data as { siteId?: string }).siteId ?? null)),
    codeOf: (data) => (hasCode ? (data as { code: string }).code : null),
    async findIdsByCode(siteId, codes, transaction) {
      if (!hasCode || codes.length === 0) {
        return new Map();
      }
      const rows = await model.findAll({ attributes: ['id', 'code'], where: { siteId, code: { [Op.in]: [...new Set(codes)] } }, transaction });
      return new Map(rows.map((row) => [row.get('code') as string, row.get('id') as string]));
    },
    async writeMany(writes, transaction) {
      if (writes.length === 0) {
        return;
      }
      const rows = writes.map((write) => {
        const row: Record<string, unknown> = {
          ...options.extraOnCreate,
          // A sample names the device it was collected on; other records take the pushing device.
          deviceId: write.deviceId,
          ...(write.data as Record<string, unknown>),
          id: write.id,
          siteId: write.siteId,
          revision: write.revision,
          deletedAt: write.deletedAt,
          createdById: write.createdById,
        };
        // The data carries dates as ISO 8601 text; the DATE columns take Date objects.
        for (const field of dateFields) {
          if (typeof row[field] === 'string') {
            row[field] = new Date(row[field] as string);
          }
        }
        return row;
      });
      await insertRows(model, rows, { transaction, updateOnDuplicate: writableColumns });
    },
  };
}

/**
 * Raw rows of a model's table, Sequelize building the SQL as `findAll` does (portable). Not
 * through `findAll`: before every SELECT of a model, Sequelize's SQLite dialect runs
 * `PRAGMA table_info` for the table (to parse an instance's columns), a second round trip to SQLite
 * that raw rows never use; naming no tables to look up (`tableNames: []`, which `findAll` always
 * overwrites) skips it, about a quarter of a 500-row read. PostgreSQL ignores the option.
 * Columns are named as attributes (no model here maps a field to another column name).
 */
export async function selectRaw(
  model: ModelStatic<Model>,
  options: { attributes: string[]; where: WhereOptions; order?: Order; limit?: number; transaction?: Transaction | null },
): Promise<Record<string, unknown>[]> {
  if (!model.sequelize) {
    throw new Error(`${model.name} is not bound to a database`);
  }
  const query = { ...options, raw: true, tableNames: [] as string[] };
  return (await model.sequelize.getQueryInterface().select(model, model.getTableName(), query)) as Record<string, unknown>[];
}

/** Reads raw rows of some columns as a model instance holds them. */
interface RawRowReader {
  (row: Record<string, unknown>): Record<string, unknown>;
  /** The columns to select (those of the model among the asked ones, each once). */
  readonly columns: string[];
}

/**
 * Converts a raw row's values to what a model instance of `model` holds for them (its
 * `get({ plain: true })`, getters aside). On SQLite Sequelize parses an instance's values by column
 * type (DATETIME to Date, JSON text parsed, floating text such as "NaN" to numbers) and hands raw
 * rows the stored text; this applies the dialect's own parsers, the same way. PostgreSQL's driver
 * parses raw rows and instances alike, so they are kept as they come.
 */
export function rawRowReader(model: ModelStatic<Model>, wanted: readonly string[]): RawRowReader {
  const attributes = model.getAttributes() as Record<string, { type: { key?: string } }>;
  const columns = [...new Set(wanted)].filter((column) => Object.hasOwn(attributes, column));
  const parsers: [string, (value: unknown) => unknown][] = [];
  if (model.sequelize?.getDialect() === 'sqlite') {
    // Sequelize's typings leave out the dialect types and the instance options; both are public at run time.
    const sqliteTypes = (DataTypes as unknown as { sqlite: Record<string, { parse(value: unknown, options?: unknown): unknown }> }).sqlite;
    const options = { timezone: (model.sequelize as unknown as { options: { timezone: string } }).options.timezone };
    const parserOf: Record<string, (value: unknown) => unknown> = {
      DATE: (value) => sqliteTypes['DATE'].parse(value, options),
      JSON: (value) => sqliteTypes['JSON'].parse(value),
      'DOUBLE PRECISION': (value) => (typeof value === 'string' ? sqliteTypes['DOUBLE PRECISION'].parse(value) : value),
      FLOAT: (value) => (typeof value === 'string' ? sqliteTypes['FLOAT'].parse(value) : value),
      REAL: (value) => (typeof value === 'string' ? sqliteTypes['REAL'].parse(value) : value),
    };
    for (const column of columns) {
      const parse = parserOf[attributes[column].type.key ?? ''];
      if (parse) {
        parsers.push([column, parse]);
      }
    }
  }
  const read = (row: Record<string, unknown>): Record<string, unknown> => {
    for (const [column, parse] of parsers) {
      const value = row[column];
      if (value !== null && value !== undefined) {
        row[column] = parse(value);
      }
    }
    return row;
  };
  return Object.assign(read, { columns });
}
