import type { Mutation, PullResponse, PulledChange, PushResponse } from '../../../shared/sync/protocol';
import { createSyncTestApp, newPile, newSample, upsert, type SyncTestApp } from './support/sync-test-app';

// Several devices pushing at the same moment. On PostgreSQL (the suite's second run) the batches
// truly overlap in the database; on SQLite they queue. Either way the server-wide revision must
// stay strictly increasing and every change must reach a pulling device exactly once.
const DEVICES = 8;
const BATCHES_PER_DEVICE = 3;
const PILES_PER_BATCH = 5;
const SAMPLES_PER_PILE = 3;

describe('POST /api/sync/push from many devices at once', () => {
  let app: SyncTestApp;

  beforeAll(async () => {
    app = await createSyncTestApp();
  });

  afterAll(() => app.close());

  const batchOf = (): Mutation[] =>
    Array.from({ length: PILES_PER_BATCH }, () => newPile()).flatMap((pile) => [
      upsert('pile', pile),
      ...Array.from({ length: SAMPLES_PER_PILE }, () => upsert('sample', newSample(pile.id))),
    ]);

  it('gives every change its own revision and a pulling device sees each record exactly once', async () => {
    const devices = Array.from({ length: DEVICES }, (_, index) => ({
      deviceId: `concurrent-device-${index}`,
      batches: Array.from({ length: BATCHES_PER_DEVICE }, batchOf),
    }));
    const sent = devices.flatMap((device) => device.batches.flat());

    const answers = await Promise.all(devices.map(async (device) => {
      const results: PushResponse[] = [];
      for (const mutations of device.batches) {
        const response = await app.as('sampler').post('/api/sync/push').send({ deviceId: device.deviceId, mutations }).expect(200);
        results.push(response.body as PushResponse);
      }
      return results;
    }));

    const results = answers.flat().flatMap((answer) => answer.results);
    expect(results.map((result) => result.status)).toEqual(sent.map(() => 'applied'));
    const revisions = results.map((result) => result.revision as number);
    expect(new Set(revisions).size).toBe(sent.length);

    const pulled: PulledChange[] = [];
    let since = 0;
    for (let page = 0; page < 1000; page += 1) {
      const body = (await app.as('geologist').get(`/api/sync/pull?since=${since}&limit=37`).expect(200)).body as PullResponse;
      pulled.push(...body.changes);
      since = body.cursor;
      if (!body.hasMore) {
        break;
      }
    }
    const pulledRevisions = pulled.map((change) => change.revision);
    expect(pulledRevisions).toEqual([...pulledRevisions].sort((a, b) => a - b));
    expect(new Set(pulledRevisions).size).toBe(pulledRevisions.length);
    const sentIds = sent.map((mutation) => mutation.id).sort();
    const pulledIds = pulled.map((change) => change.id).filter((id) => sentIds.includes(id)).sort();
    expect(pulledIds).toEqual(sentIds);
  });
});

describe('POST /api/sync/device from many devices at once', () => {
  let app: SyncTestApp;

  beforeAll(async () => {
    app = await createSyncTestApp();
  });

  afterAll(() => app.close());

  it('gives each device its own number, and the same number again to a device that asks twice at once', async () => {
    const deviceIds = Array.from({ length: 6 }, (_, index) => `first-sync-${index}`);
    const asks = [...deviceIds, ...deviceIds];

    const answers = await Promise.all(asks.map((deviceId) =>
      app.as('sampler').post('/api/sync/device').send({ deviceId }).expect(200)));

    const numberOf = new Map<string, number>();
    for (const { body } of answers) {
      const known = numberOf.get(body.deviceId);
      expect(known === undefined || known === body.deviceNumber).toBe(true);
      numberOf.set(body.deviceId, body.deviceNumber);
    }
    expect(new Set(numberOf.values()).size).toBe(deviceIds.length);
  });
});
