import 'fake-indexeddb/auto';
import Dexie from 'dexie';
import { deserialize, serialize } from 'node:v8';
import { HeapsightDb, type LocalPhoto, type LocalPile, type LocalSample } from './heapsight-db';
import { countLive, firstPhotoOf, latestSamples, pilesByCode } from './device-queries';

// jsdom has no structuredClone, which fake-indexeddb uses to store values; Node's serializer is the same algorithm.
globalThis.structuredClone ??= <T>(value: T): T => deserialize(serialize(value)) as T;

const PILE_ID = '6f0e2a53-8c1d-4b7a-9a51-2d3c4e5f6b02';
let databaseCount = 0;

function sample(index: number, overrides: Partial<LocalSample> = {}): LocalSample {
  return {
    id: `5b000000-0000-4000-8000-${index.toString(16).padStart(12, '0')}`, pileId: PILE_ID, code: `JR-90-${String(index).padStart(6, '0')}`,
    sampleType: 'routine', duplicateOfId: null, standardId: null, location: null, gpsAccuracyM: null, wetMassKg: 10, moisturePct: null,
    increments: 10, position: '', collectedAt: new Date(Date.UTC(2025, 0, 1) + index * 60_000).toISOString(),
    collectorId: '6f0e2a53-8c1d-4b7a-9a51-2d3c4e5f6c01', deviceId: 'spec', revision: 1, deletedAt: null, hasPendingChange: false,
    ...overrides,
  } as LocalSample;
}

function pile(code: string, deletedAt: string | null = null): LocalPile {
  return { id: crypto.randomUUID(), siteId: 'site', code, deletedAt, revision: 1, hasPendingChange: false } as unknown as LocalPile;
}

function photo(ownerId: string, takenAt: string, deletedAt: string | null = null): LocalPhoto {
  return { id: crypto.randomUUID(), ownerEntity: 'sample', ownerId, takenAt, deletedAt, revision: 1, hasPendingChange: false } as unknown as LocalPhoto;
}

describe('device queries', () => {
  let db: HeapsightDb;

  beforeEach(async () => {
    databaseCount += 1;
    db = new HeapsightDb(`device-queries-spec-${databaseCount}`);
    await db.open();
  });

  afterEach(async () => {
    await db.delete();
  });

  it('counts live samples from the indexes, leaving out deleted ones', async () => {
    await db.samples.bulkPut([sample(1), sample(2), sample(3, { deletedAt: '2025-02-01T00:00:00.000Z' }), sample(4)]);
    expect(await countLive(db.samples)).toBe(3);
    await db.samples.update(sample(1).id, { deletedAt: '2025-02-02T00:00:00.000Z' });
    expect(await countLive(db.samples)).toBe(2);
  });

  it('lists the latest live samples newest first and stops at the limit', async () => {
    await db.samples.bulkPut([sample(1), sample(2), sample(3), sample(4, { deletedAt: '2025-02-01T00:00:00.000Z' }), sample(5)]);
    expect((await latestSamples(db, 3)).map((row) => row.code)).toEqual(['JR-90-000005', 'JR-90-000003', 'JR-90-000002']);
  });

  it('pages live piles in code order', async () => {
    await db.piles.bulkPut([pile('JR-1-P0003'), pile('JR-1-P0001'), pile('JR-1-P0002', '2025-02-01T00:00:00.000Z'), pile('JR-1-P0004')]);
    expect((await pilesByCode(db, { limit: 2 })).map((row) => row.code)).toEqual(['JR-1-P0001', 'JR-1-P0003']);
    expect((await pilesByCode(db, { offset: 2, limit: 2 })).map((row) => row.code)).toEqual(['JR-1-P0004']);
  });

  it('gives the first live photo of each asked-for owner only', async () => {
    const [first, second, other] = [sample(1).id, sample(2).id, sample(3).id];
    await db.photos.bulkPut([
      photo(first, '2025-01-02T00:00:00.000Z'), photo(first, '2025-01-01T00:00:00.000Z'),
      photo(second, '2025-01-01T00:00:00.000Z', '2025-01-03T00:00:00.000Z'), photo(other, '2025-01-01T00:00:00.000Z'),
    ]);
    const photos = await firstPhotoOf(db, [first, second]);
    expect([...photos.keys()]).toEqual([first]);
    expect(photos.get(first)?.takenAt).toBe('2025-01-01T00:00:00.000Z');
    expect((await firstPhotoOf(db, [])).size).toBe(0);
  });

  it('counts records a phone wrote before the deletedAt index existed (schema version 1)', async () => {
    databaseCount += 1;
    const name = `device-queries-spec-v1-${databaseCount}`;
    const old = new Dexie(name);
    old.version(1).stores({ piles: 'id, siteId, code', samples: 'id, pileId, code, collectedAt', panTests: 'id, sampleId', photos: 'id, ownerId', outbox: 'mutationId, queuedAt, [entity+id]', syncState: 'key', conflicts: 'id', drafts: 'key' });
    await old.table('samples').bulkPut([sample(1), sample(2, { deletedAt: '2025-02-01T00:00:00.000Z' }), sample(3)]);
    old.close();
    const upgraded = new HeapsightDb(name);
    try {
      expect(await countLive(upgraded.samples)).toBe(2);
    } finally {
      await upgraded.delete();
    }
  });
});
