import type { Table } from 'dexie';
import type { EntityData, MutationResult, PulledChange, SyncEntity } from '../../../../shared/sync/protocol';
import type { HeapsightDb, LocalPhoto } from '../db/heapsight-db';
import type { OutboxEntry, OutboxPort, PendingPhotoUpload } from './sync-engine';

const CURSOR_KEY = 'pullCursor';

/** The local table of each synced entity. */
export function tableOf(db: HeapsightDb, entity: SyncEntity): Table<Record<string, unknown>, string> {
  const tables = { pile: db.piles, sample: db.samples, panTest: db.panTests, photo: db.photos };
  return tables[entity] as unknown as Table<Record<string, unknown>, string>;
}

/**
 * Saves a record and queues its mutation in one Dexie transaction, so a crash never leaves a record
 * without its outbox entry or the other way round. `extra` holds local-only fields (a photo's bytes).
 */
export async function saveRecord<E extends SyncEntity>(
  db: HeapsightDb, entity: E, data: EntityData[E], ids: { mutationId: string; now: string }, extra: Record<string, unknown> = {},
): Promise<void> {
  const table = tableOf(db, entity);
  await db.transaction('rw', [table, db.outbox], async () => {
    const current = await table.get(data.id);
    const baseRevision = (current?.['revision'] as number | null | undefined) ?? null;
    await table.put({ ...current, ...extra, ...data, revision: baseRevision, deletedAt: null, hasPendingChange: true });
    await db.outbox.add({
      mutationId: ids.mutationId, entity, id: data.id, op: 'upsert', baseRevision, data, isInFlight: false, rejectedErrors: null, queuedAt: ids.now,
    });
  });
}

/** The outbox port over Dexie. */
export class DeviceOutbox implements OutboxPort {
  /** `deviceId` names this device on the conflicts it keeps. */
  constructor(private readonly db: HeapsightDb, private readonly deviceId = '') {}

  async pendingEntries(): Promise<OutboxEntry[]> {
    const entries = await this.db.outbox.orderBy('queuedAt').toArray();
    return entries.filter((entry) => entry.rejectedErrors === null);
  }

  async replacePending(keep: readonly OutboxEntry[], droppedMutationIds: readonly string[]): Promise<void> {
    await this.db.transaction('rw', this.db.outbox, async () => {
      await this.db.outbox.bulkDelete([...droppedMutationIds]);
      await this.db.outbox.bulkPut([...keep]);
    });
  }

  async markInFlight(mutationIds: readonly string[]): Promise<void> {
    await this.db.outbox.where('mutationId').anyOf([...mutationIds]).modify({ isInFlight: true });
  }

  async applyResults(sent: readonly OutboxEntry[], results: readonly MutationResult[]): Promise<void> {
    const db = this.db;
    await db.transaction('rw', [db.outbox, db.piles, db.samples, db.panTests, db.photos, db.conflicts], async () => {
      for (const result of results) {
        const entry = sent.find((candidate) => candidate.mutationId === result.mutationId);
        if (!entry) {
          continue;
        }
        if (result.status === 'rejected') {
          await db.outbox.update(entry.mutationId, { isInFlight: false, rejectedErrors: result.errors });
          continue;
        }
        await db.outbox.delete(entry.mutationId);
        if (result.status === 'conflict' && result.conflictId) {
          // Kept on the device too, so the Sync screen shows its own conflicts with no connection.
          await db.conflicts.put({
            id: result.conflictId, entity: entry.entity, recordId: entry.id, siteId: await this.siteOf(entry.entity, entry.data), deviceId: this.deviceId,
            baseRevision: entry.baseRevision, serverRevision: result.revision ?? 0, deviceOp: entry.op, deviceData: entry.data, serverData: null,
            status: 'open', createdAt: entry.queuedAt,
          });
        }
        const table = tableOf(db, entry.entity);
        const others = await db.outbox.where('[entity+id]').equals([entry.entity, entry.id]).toArray();
        if (result.status !== 'conflict' && result.revision !== null) {
          // Later queued changes of the same record now build on the revision just applied.
          for (const other of others.filter((candidate) => !candidate.isInFlight)) {
            await db.outbox.update(other.mutationId, { baseRevision: result.revision });
          }
          await table.update(entry.id, { revision: result.revision, hasPendingChange: others.length > 0 });
        } else {
          await table.update(entry.id, { hasPendingChange: others.length > 0 });
        }
      }
    });
  }

  /** The site a record belongs to, from its own data (a pile) or its parents on this device. */
  private async siteOf(entity: SyncEntity, data: unknown): Promise<string> {
    const record = (data ?? {}) as { siteId?: string; pileId?: string; sampleId?: string; ownerEntity?: 'pile' | 'sample'; ownerId?: string };
    if (entity === 'pile') {
      return record.siteId ?? '';
    }
    const sampleId = entity === 'panTest' ? record.sampleId : entity === 'photo' && record.ownerEntity === 'sample' ? record.ownerId : undefined;
    const pileId = entity === 'sample' ? record.pileId : entity === 'photo' && record.ownerEntity === 'pile' ? record.ownerId : (await this.db.samples.get(sampleId ?? ''))?.pileId;
    return (await this.db.piles.get(pileId ?? ''))?.siteId ?? '';
  }

  async pendingPhotoUploads(): Promise<PendingPhotoUpload[]> {
    const photos = await this.db.photos.filter((photo) => !photo.isUploaded && photo.revision !== null).toArray();
    return photos.map((photo) => ({ id: photo.id, byteSize: photo.blob.size }));
  }

  async photoBytes(photoId: string): Promise<Blob | null> {
    return (await this.db.photos.get(photoId))?.blob ?? null;
  }

  async markPhotoUploaded(photoId: string): Promise<void> {
    await this.db.photos.update(photoId, { isUploaded: true } as Partial<LocalPhoto>);
  }

  async pullCursor(): Promise<number> {
    return ((await this.db.syncState.get(CURSOR_KEY))?.value as number | undefined) ?? 0;
  }

  async applyPulled(changes: readonly PulledChange[], cursor: number): Promise<void> {
    const db = this.db;
    await db.transaction('rw', [db.syncState, db.outbox, db.piles, db.samples, db.panTests, db.photos], async () => {
      for (const change of changes) {
        const table = tableOf(db, change.entity);
        const local = await table.get(change.id);
        if (local?.['hasPendingChange']) {
          // The device's own queued edit wins locally; the server decides (conflict) when it goes up.
          continue;
        }
        // A photo pulled from another device has no bytes here; lists fetch its thumbnail from the server.
        const photoFields = change.entity === 'photo' ? { isUploaded: true, blob: local?.['blob'] ?? null, thumbnail: local?.['thumbnail'] ?? null } : {};
        await table.put({ ...photoFields, ...(change.data as object), revision: change.revision, deletedAt: change.deletedAt, hasPendingChange: false });
      }
      await db.syncState.put({ key: CURSOR_KEY, value: cursor });
    });
  }
}
