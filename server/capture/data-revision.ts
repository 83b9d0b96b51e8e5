import { SyncRevision } from '../sync/sync.models';

/**
 * The server-wide data revision: the sync counter that every write of piles, samples, pan tests
 * and photos moves in the same transaction (a device's push, a web edit, a resolved conflict).
 * Whatever is read from those tables after this value was read is at least as new as it, so a
 * result computed from them can be kept under it and reused until the counter moves.
 * One primary-key read of one row, in plain Sequelize (SQLite and PostgreSQL alike).
 */
export async function readDataRevision(): Promise<number> {
  const row = (await SyncRevision.findOne({ where: { id: 1 }, attributes: ['value'], raw: true })) as { value: number | string } | null;
  return row ? Number(row.value) : 0;
}

/**
 * A small in-process cache of values worked out from the field-record tables, each kept under the
 * data revision it was read at: a lookup at another revision misses, and the oldest key goes once
 * `capacity` keys are held. A value still being worked out is shared by every caller that asks
 * for it meanwhile; a failed one is forgotten, so the next caller tries again.
 */
export class RevisionCache<T> {
  private readonly entries = new Map<string, { readonly revision: number | string; readonly value: Promise<T> }>();

  constructor(private readonly capacity: number) {}

  /** The value kept under `key` at `revision` (a number, or a string naming several versions), else `make()`'s. */
  async get(key: string, revision: number | string, make: () => Promise<T>): Promise<T> {
    const held = this.entries.get(key);
    if (held && held.revision === revision) {
      // Most recently used last, so the first key is the one to drop.
      this.entries.delete(key);
      this.entries.set(key, held);
      return held.value;
    }
    const value = make();
    this.entries.delete(key);
    this.entries.set(key, { revision, value });
    while (this.entries.size > this.capacity) {
      this.entries.delete(this.entries.keys().next().value as string);
    }
    value.catch(() => {
      if (this.entries.get(key)?.value === value) this.entries.delete(key);
    });
    return value;
  }

  /** How many keys are held (for tests). */
  get size(): number {
    return this.entries.size;
  }
}

/**
 * One value per open database (the models are bound to one Sequelize instance at a time; tests
 * open several databases in one process, and a cache must never answer from another one's rows).
 */
export function perDatabase<T extends object>(make: () => T): () => T {
  const byDatabase = new WeakMap<object, T>();
  return () => {
    const database = SyncRevision.sequelize;
    if (!database) {
      throw new Error('The models are not bound to a database');
    }
    let value = byDatabase.get(database);
    if (!value) {
      value = make();
      byDatabase.set(database, value);
    }
    return value;
  };
}
