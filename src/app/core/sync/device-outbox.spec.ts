import 'fake-indexeddb/auto';
import { deserialize, serialize } from 'node:v8';
import type { PileData } from '../../../../shared/sync/protocol';
import { HeapsightDb } from '../db/heapsight-db';
import { DeviceOutbox, saveRecord } from './device-outbox';
import type { OutboxEntry } from './sync-engine';

// jsdom has no structuredClone, which fake-indexeddb uses to store values; Node's serializer is the same algorithm.
globalThis.structuredClone ??= <T>(value: T): T => deserialize(serialize(value)) as T;

const SITE_ID = '6f0e2a53-8c1d-4b7a-9a51-2d3c4e5f6b01';
let databaseCount = 0;

function pile(overrides: Partial<PileData> = {}): PileData {
  return {
    id: crypto.randomUUID(), siteId: SITE_ID, code: 'JR-07-P0001', material: 'sluice-tailings', footprint: null, heightM: 2, shapeModel: 'cone',
    angleOfReposeDeg: null, bulkDensityTPerM3: null, moisturePct: 8, spotHeights: null, sackCount: null, sackMassKg: null, hazards: [], notes: '', ...overrides,
  };
}

describe('the device outbox', () => {
  let db: HeapsightDb;

  beforeEach(async () => {
    databaseCount += 1;
    db = new HeapsightDb(`outbox-spec-${databaseCount}`);
    await db.open();
  });

  afterEach(async () => {
    db.close();
    await db.delete();
  });

  describe('saveRecord', () => {
    it('writes the record and its outbox entry together', async () => {
      const record = pile();
      const mutationId = crypto.randomUUID();

      await saveRecord(db, 'pile', record, { mutationId, now: '2026-01-05T08:00:00.000Z' });

      expect(await db.piles.get(record.id)).toMatchObject({ ...record, revision: null, hasPendingChange: true });
      expect(await db.outbox.get(mutationId)).toMatchObject({ entity: 'pile', id: record.id, op: 'upsert', baseRevision: null, data: record, isInFlight: false });
    });

    it('writes neither when the outbox entry cannot be added', async () => {
      const first = pile();
      const mutationId = crypto.randomUUID();
      await saveRecord(db, 'pile', first, { mutationId, now: '2026-01-05T08:00:00.000Z' });
      const second = pile({ code: 'JR-07-P0002' });

      // The same mutation id again: the outbox refuses it, so the record must not stay either.
      await expect(saveRecord(db, 'pile', second, { mutationId, now: '2026-01-05T08:01:00.000Z' })).rejects.toThrow();

      expect(await db.piles.get(second.id)).toBeUndefined();
      expect(await db.outbox.count()).toBe(1);
    });

    it('queues an edit on top of the revision the device last saw', async () => {
      const record = pile();
      await saveRecord(db, 'pile', record, { mutationId: crypto.randomUUID(), now: '2026-01-05T08:00:00.000Z' });
      await db.piles.update(record.id, { revision: 41, hasPendingChange: false });
      const editId = crypto.randomUUID();

      await saveRecord(db, 'pile', { ...record, heightM: 3 }, { mutationId: editId, now: '2026-01-05T09:00:00.000Z' });

      expect((await db.outbox.get(editId))?.baseRevision).toBe(41);
    });
  });

  describe('applyResults', () => {
    const queued = async (record: PileData): Promise<OutboxEntry> => {
      const mutationId = crypto.randomUUID();
      await saveRecord(db, 'pile', record, { mutationId, now: '2026-01-05T08:00:00.000Z' });
      return (await db.outbox.get(mutationId)) as OutboxEntry;
    };

    it('keeps a conflict on the device, so the Sync screen lists it offline', async () => {
      const record = pile();
      const entry = await queued(record);
      const conflictId = crypto.randomUUID();

      await new DeviceOutbox(db, 'phone-7').applyResults([entry], [{ mutationId: entry.mutationId, status: 'conflict', revision: 12, errors: [], conflictId }]);

      expect(await db.conflicts.get(conflictId)).toMatchObject({
        entity: 'pile', recordId: record.id, siteId: SITE_ID, deviceId: 'phone-7', serverRevision: 12, deviceData: record, status: 'open',
      });
      expect(await db.outbox.count()).toBe(0);
      expect((await db.piles.get(record.id))?.hasPendingChange).toBe(false);
    });

    it('stamps the revision on an applied record and keeps a rejected one with its reasons', async () => {
      const applied = await queued(pile());
      const refused = await queued(pile({ code: 'JR-07-P0002' }));
      const reasons = [{ path: 'code', message: 'The code JR-07-P0002 is already used at this site' }];

      await new DeviceOutbox(db, 'phone-7').applyResults([applied, refused], [
        { mutationId: applied.mutationId, status: 'applied', revision: 7, errors: [] },
        { mutationId: refused.mutationId, status: 'rejected', revision: null, errors: reasons },
      ]);

      expect(await db.piles.get(applied.id)).toMatchObject({ revision: 7, hasPendingChange: false });
      expect(await db.outbox.get(applied.mutationId)).toBeUndefined();
      expect((await db.outbox.get(refused.mutationId))?.rejectedErrors).toEqual(reasons);
      expect(await db.conflicts.count()).toBe(0);
    });
  });
});
