import { randomUUID } from 'node:crypto';
import type { Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { Op } from 'sequelize';
import { SyncEngine } from '../../src/app/core/sync/sync-engine';
import { Sample } from '../../server/capture/sample.model';
import { SyncConflict, SyncMutation, SyncRevision } from '../../server/sync/sync.models';
import type { PileData, PulledChange } from '../../shared/sync/protocol';
import { createTestApp, type TestApp } from '../server/support/test-app';
import { newPile, newSample, person } from '../server/sync/support/sync-test-app';
import { MemoryOutbox, httpTransport, signIn, syncUntilIdle } from './support/device';
import { seededRandom, startFaultProxy, type FaultProxy } from './support/fault-proxy';
import { reportReliabilityFigures } from './support/figures';

/** The seed of this run's faults; set RELIABILITY_SEED to replay a failure. */
const SEED = Number(process.env['RELIABILITY_SEED'] ?? 20250304);
/** Mutations each device sends: 100 rounds' worth in the long run, 10 in CI. */
const ROUNDS = process.env['RELIABILITY_LONG'] ? 100 : 10;
const SHARED_PILES = 10;
const SAMPLES_PER_ROUND = 90;

/** Everything a pull from cursor `since` answers, straight from the server, by record id. */
async function serverView(url: string, accessToken: string, since: number): Promise<Map<string, PulledChange>> {
  const view = new Map<string, PulledChange>();
  const transport = httpTransport(url, accessToken);
  let cursor = since;
  for (let page = 0; page < 1000; page += 1) {
    const answer = await transport.pull(cursor, 1000);
    answer.changes.forEach((change) => view.set(change.id, change));
    cursor = answer.cursor;
    if (!answer.hasMore) {
      return view;
    }
  }
  throw new Error('the pull never ended');
}

describe('two devices syncing through a flaky network', () => {
  let testApp: TestApp;
  let server: Server;
  let proxy: FaultProxy;
  let url: string;

  beforeAll(async () => {
    testApp = await createTestApp();
    server = testApp.app.listen(0, '127.0.0.1');
    await new Promise((resolve) => server.once('listening', resolve));
    url = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
    proxy = await startFaultProxy({
      target: url, seed: SEED, maxDelayMs: 150,
      rates: { 'drop-before': 0.1, 'drop-after': 0.12, delay: 0.1, truncate: 0.1, 'bad-gateway': 0.1 },
    });
  });

  afterAll(async () => {
    await proxy.close();
    server.closeAllConnections();
    await new Promise((resolve) => server.close(resolve));
    await testApp.close();
  });

  it(`when both devices send ${ROUNDS * 100} mutations each, editing the same piles, every device and the server end with the same data, each conflict kept, nothing doubled`, async () => {
    // Arrange: a sampler's phone and a geologist's tablet, both on site JR, both seeing the same ten piles.
    const sampler = person('sampler');
    const geologist = person('geologist');
    const devices = [
      { name: 'sampler-phone', person: sampler, outbox: new MemoryOutbox(), token: await signIn(url, sampler.email, randomUUID()) },
      { name: 'geologist-tablet', person: geologist, outbox: new MemoryOutbox(), token: await signIn(url, geologist.email, randomUUID()) },
    ].map((device) => ({ ...device, engine: new SyncEngine(device.outbox, httpTransport(proxy.url, device.token), device.name) }));
    const startCursor = (await SyncRevision.findByPk(1))?.value ?? 0;
    devices.forEach((device) => { device.outbox.cursor = startCursor; });
    const piles = Array.from({ length: SHARED_PILES }, () => newPile());
    piles.forEach((pile) => devices[0].outbox.queue('pile', pile));
    proxy.setFaultsEnabled(false);
    await syncUntilIdle(devices[0].engine, devices[0].outbox);
    await syncUntilIdle(devices[1].engine, devices[1].outbox);
    proxy.setFaultsEnabled(true);
    const sent = new Map<string, { deviceIndex: number; entity: string; data: unknown }>();
    const random = seededRandom(SEED + 1);

    // Act: each round, both devices queue 100 changes (10 pile edits on what they last saw, 90 new
    // samples), then sync one after the other in a seeded order, retrying until each is done.
    let failedRuns = 0;
    for (let round = 0; round < ROUNDS; round += 1) {
      devices.forEach((device, deviceIndex) => {
        for (const pile of piles) {
          const seen = device.outbox.pulled.get(pile.id) as PulledChange;
          const edited: PileData = { ...(seen.data as PileData), notes: `${device.name} round ${round}`, heightM: 1 + random() * 5 };
          const entry = device.outbox.queue('pile', edited, seen.revision);
          sent.set(entry.mutationId, { deviceIndex, entity: 'pile', data: edited });
        }
        for (let index = 0; index < SAMPLES_PER_ROUND; index += 1) {
          const pile = piles[Math.floor(random() * piles.length)];
          const sample = newSample(pile.id, { collectorId: device.person.id, deviceId: device.name });
          const entry = device.outbox.queue('sample', sample);
          sent.set(entry.mutationId, { deviceIndex, entity: 'sample', data: sample });
        }
      });
      const order = random() < 0.5 ? [0, 1] : [1, 0];
      for (const deviceIndex of order) {
        failedRuns += (await syncUntilIdle(devices[deviceIndex].engine, devices[deviceIndex].outbox)).failedRuns;
      }
    }
    // Both pull once more, so each has seen the other's last round.
    for (const device of devices) {
      failedRuns += (await syncUntilIdle(device.engine, device.outbox)).failedRuns;
    }

    // Assert: the server took every mutation exactly once, as applied or as a kept conflict.
    const sentIds = [...sent.keys()];
    const taken = await SyncMutation.findAll({ where: { mutationId: { [Op.in]: sentIds } } });
    expect(taken).toHaveLength(sentIds.length);
    expect(new Set(taken.map((row) => row.mutationId)).size).toBe(sentIds.length);
    const conflictsTaken = taken.filter((row) => row.status === 'conflict');
    const kept = await SyncConflict.findAll({ where: { mutationId: { [Op.in]: conflictsTaken.map((row) => row.mutationId) } } });
    expect(kept).toHaveLength(conflictsTaken.length);
    for (const conflict of kept) {
      expect(conflict.deviceData).toEqual(sent.get(conflict.mutationId)?.data);
    }
    expect(conflictsTaken.length).toBeGreaterThan(0);
    const sampleIds = [...sent.values()].filter((entry) => entry.entity === 'sample').map((entry) => (entry.data as { id: string }).id);
    expect(await Sample.count({ where: { id: { [Op.in]: sampleIds } } })).toBe(sampleIds.length);
    // Both outboxes are empty and no mutation was refused.
    devices.forEach((device) => expect(device.outbox.entries).toEqual([]));
    // Every device holds exactly what the server holds, revision for revision.
    const truth = await serverView(url, devices[0].token, startCursor);
    expect(truth.size).toBe(SHARED_PILES + sampleIds.length);
    for (const device of devices) {
      expect(Object.fromEntries(device.outbox.pulled)).toEqual(Object.fromEntries(truth));
    }
    // Every kind of fault happened, and runs failed and were retried.
    for (const kind of ['drop-before', 'drop-after', 'delay', 'truncate', 'bad-gateway'] as const) {
      expect(proxy.counts[kind]).toBeGreaterThan(0);
    }
    expect(failedRuns).toBeGreaterThan(0);
    reportReliabilityFigures('flaky network', {
      seed: SEED, faultsInjected: proxy.faultsInjected(), faultsByKind: proxy.counts, failedRunsRetried: failedRuns,
      mutationsSent: sentIds.length, mutationsFound: taken.length, conflictsKept: kept.length,
    });
  }, 120_000);
});
