import type { Table } from 'dexie';
import type { HeapsightDb, LocalPhoto, LocalPile, LocalSample } from './heapsight-db';

/**
 * Reads for screens that must open fast on a phone holding tens of thousands of records: counts come
 * from the indexes, lists are a page at a time, and nothing reads every row to show a screen.
 */

/** Records not deleted: the table's count less the entries of its `deletedAt` index (which holds only deleted ones). */
export async function countLive(table: Table<{ deletedAt: string | null }, string>): Promise<number> {
  const [all, deleted] = await Promise.all([table.count(), table.orderBy('deletedAt').count()]);
  return all - deleted;
}

/** The `limit` most recently collected live samples, newest first (a cursor on `collectedAt` that stops at `limit`). */
export function latestSamples(db: HeapsightDb, limit: number): Promise<LocalSample[]> {
  return db.samples.orderBy('collectedAt').reverse().filter((sample) => sample.deletedAt === null).limit(limit).toArray();
}

/** A page of live piles in code order. */
export function pilesByCode(db: HeapsightDb, { offset = 0, limit }: { offset?: number; limit: number }): Promise<LocalPile[]> {
  return db.piles.orderBy('code').filter((pile) => pile.deletedAt === null).offset(offset).limit(limit).toArray();
}

/** The first photo of each of the given piles or samples (by the `ownerId` index), for list thumbnails. */
export async function firstPhotoOf(db: HeapsightDb, ownerIds: readonly string[]): Promise<Map<string, LocalPhoto>> {
  const photos = ownerIds.length === 0 ? [] : await db.photos.where('ownerId').anyOf([...ownerIds]).toArray();
  const byOwner = new Map<string, LocalPhoto>();
  for (const photo of photos.sort((a, b) => a.takenAt.localeCompare(b.takenAt))) {
    if (photo.deletedAt === null && !byOwner.has(photo.ownerId)) byOwner.set(photo.ownerId, photo);
  }
  return byOwner;
}
