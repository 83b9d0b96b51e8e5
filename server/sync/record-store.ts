import { Op, type Model, type ModelStatic, type Transaction } from 'sequelize';
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
  const toStored = (row: Model): StoredRecord<E> => {
    const plain = row.get({ plain: true }) as Record<string, unknown>;
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
      const rows = await model.findAll({ where: { id: { [Op.in]: [...new Set(ids)] } }, transaction });
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
