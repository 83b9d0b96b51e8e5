import Dexie, { type EntityTable } from 'dexie';
import type { ConflictView, PanTestData, PileData, PhotoData, SampleData } from '../../../../shared/sync/protocol';
import type { OutboxEntry } from '../sync/sync-engine';

/** Sync columns every local record carries: the server revision it was last seen at (null: never synced). */
export interface LocalSyncFields {
  readonly revision: number | null;
  readonly deletedAt: string | null;
  /** True while a change to it waits in the outbox. */
  readonly hasPendingChange: boolean;
}

export type LocalPile = PileData & LocalSyncFields;
export type LocalSample = SampleData & LocalSyncFields;
export type LocalPanTest = PanTestData & LocalSyncFields;
/** A photo record with its bytes (resized on the device) and a small thumbnail for lists. */
export type LocalPhoto = PhotoData & LocalSyncFields & { readonly blob: Blob; readonly thumbnail: Blob; readonly isUploaded: boolean };

/** One value kept per device: pull cursor, device number, code sequences, last sync. */
export interface SyncStateRow {
  readonly key: string;
  readonly value: unknown;
}

/** A form left half-filled, restored when the user comes back. */
export interface DraftRow {
  readonly key: string;
  readonly value: unknown;
  readonly savedAt: string;
}

/**
 * The device database (DESIGN §4, §5). Every write of a record goes in one transaction with its
 * outbox entry. Add a version (never edit one) when the schema changes.
 */
export class HeapsightDb extends Dexie {
  piles!: EntityTable<LocalPile, 'id'>;
  samples!: EntityTable<LocalSample, 'id'>;
  panTests!: EntityTable<LocalPanTest, 'id'>;
  photos!: EntityTable<LocalPhoto, 'id'>;
  outbox!: EntityTable<OutboxEntry, 'mutationId'>;
  syncState!: EntityTable<SyncStateRow, 'key'>;
  conflicts!: EntityTable<ConflictView, 'id'>;
  drafts!: EntityTable<DraftRow, 'key'>;

  constructor(name = 'heapsight') {
    super(name);
    this.version(1).stores({
      piles: 'id, siteId, code',
      samples: 'id, pileId, code, collectedAt',
      panTests: 'id, sampleId',
      photos: 'id, ownerId',
      outbox: 'mutationId, queuedAt, [entity+id]',
      syncState: 'key',
      conflicts: 'id',
      drafts: 'key',
    });
    // deletedAt indexed so screens count and list live records without reading every row: IndexedDB
    // leaves a record out of an index when the key is null, so the index holds only the deleted ones.
    this.version(2).stores({
      piles: 'id, siteId, code, deletedAt',
      samples: 'id, pileId, code, collectedAt, deletedAt',
      panTests: 'id, sampleId, deletedAt',
    });
  }
}

let instance: HeapsightDb | null = null;

/** The one device database of this app. */
export function heapsightDb(): HeapsightDb {
  instance ??= new HeapsightDb();
  return instance;
}
