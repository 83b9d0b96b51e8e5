import express from 'express';
import { randomUUID } from 'node:crypto';
import { rmSync } from 'node:fs';
import type { Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { SyncEngine, type OutboxEntry, type OutboxPort, type SyncTransport } from '../../../src/app/core/sync/sync-engine';
import { Pile } from '../../../server/capture/pile.model';
import { Sample } from '../../../server/capture/sample.model';
import { openDatabase, type Database } from '../../../server/db/database';
import { initModels } from '../../../server/db/models';
import { errorMiddleware } from '../../../server/lib/errors';
import { createLogger } from '../../../server/lib/logger';
import { captureSyncRoutes, createCaptureSyncServices } from '../../../server/sync/capture-sync.component';
import { ChangeLogEntry, SyncRevision } from '../../../server/sync/sync.models';
import type { MutationResult, PulledChange } from '../../../shared/sync/protocol';
import { createTestApp, type TestApp } from '../support/test-app';
import { loadUser, newPile, newSample, person } from './support/sync-test-app';

/** The device's outbox and records in memory, with the same rules as the Dexie one. */
class MemoryOutbox implements OutboxPort {
  entries: OutboxEntry[] = [];
  pulled = new Map<string, PulledChange>();
  cursor = 0;
  async pendingEntries() { return this.entries.filter((entry) => entry.rejectedErrors === null); }
  async replacePending(keep: readonly OutboxEntry[], dropped: readonly string[]) {
    this.entries = [...keep, ...this.entries.filter((entry) => !keep.includes(entry) && !dropped.includes(entry.mutationId) && entry.rejectedErrors !== null)];
  }
  async markInFlight(ids: readonly string[]) { this.entries = this.entries.map((entry) => (ids.includes(entry.mutationId) ? { ...entry, isInFlight: true } : entry)); }
  async applyResults(_sent: readonly OutboxEntry[], results: readonly MutationResult[]) {
    for (const result of results) {
      this.entries = result.status === 'rejected'
        ? this.entries.map((entry) => (entry.mutationId === result.mutationId ? { ...entry, isInFlight: false, rejectedErrors: result.errors } : entry))
        : this.entries.filter((entry) => entry.mutationId !== result.mutationId);
    }
  }
  async pendingPhotoUploads() { return []; }
  async photoBytes() { return null; }
  async markPhotoUploaded() { return undefined; }
  async pullCursor() { return this.cursor; }
  async applyPulled(changes: readonly PulledChange[], cursor: number) {
    changes.forEach((change) => this.pulled.set(change.id, change));
    this.cursor = cursor;
  }
}

/** The capture and sync routes on a real port over the test database file, signed in as the sampler. */
async function listen(database: Database, base: TestApp): Promise<{ url: string; server: Server }> {
  const logger = createLogger('silent');
  const services = createCaptureSyncServices({ config: base.config, database, logger });
  const sampler = await loadUser(person('sampler').email);
  const app = express();
  app.use(express.json({ limit: '2mb' }));
  app.use('/api', captureSyncRoutes(services, (request, _response, next) => {
    request.user = sampler;
    next();
  }));
  app.use(errorMiddleware(logger));
  const server = app.listen(0, '127.0.0.1');
  await new Promise((resolve) => server.once('listening', resolve));
  return { url: `http://127.0.0.1:${(server.address() as AddressInfo).port}`, server };
}

function httpTransport(url: string): SyncTransport {
  const call = async <T>(path: string, init?: RequestInit): Promise<T> => {
    const response = await fetch(`${url}${path}`, { ...init, headers: { 'content-type': 'application/json' } });
    if (!response.ok) {
      throw new Error(`HTTP ${response.status}`);
    }
    return (await response.json()) as T;
  };
  return {
    push: (request) => call('/api/sync/push', { method: 'POST', body: JSON.stringify(request) }),
    uploadPhoto: async () => undefined,
    pull: (since, limit) => call(`/api/sync/pull?since=${since}&limit=${limit}`),
  };
}

function queue(outbox: MemoryOutbox, count: number): string[] {
  const pile = newPile();
  const samples = Array.from({ length: count }, () => newSample(pile.id));
  const now = new Date().toISOString();
  outbox.entries = [pile, ...samples].map((data, index) => ({
    mutationId: randomUUID(), entity: index === 0 ? 'pile' : 'sample', id: data.id, op: 'upsert', baseRevision: null, data,
    isInFlight: false, rejectedErrors: null, queuedAt: now,
  }));
  return [pile.id, ...samples.map((sample) => sample.id)];
}

describe('sync through a fault', () => {
  let base: TestApp;
  /** The database the restarted server opened, closed after the test instead of the first one. */
  let reopened: Database | null;

  beforeEach(async () => {
    base = await createTestApp();
    reopened = null;
  });

  afterEach(async () => {
    if (reopened) {
      await reopened.close();
      rmSync(base.dataDir, { recursive: true, force: true });
    } else {
      await base.close();
    }
  });

  it('when the server stops after applying a batch but before answering, the retry after restart converges with no duplicate and no loss', async () => {
    // Arrange: 250 samples go up in three batches; the server dies after taking the second.
    const outbox = new MemoryOutbox();
    // The device has already pulled the demo field work; it pulls only what comes after.
    outbox.cursor = (await SyncRevision.findByPk(1))?.value ?? 0;
    const ids = queue(outbox, 250);
    let database = base.database;
    const first = await listen(database, base);
    let pushes = 0;
    const real = httpTransport(first.url);
    const cutting: SyncTransport = {
      ...real,
      push: async (request) => {
        pushes += 1;
        const answer = await real.push(request);
        if (pushes === 2) {
          first.server.closeAllConnections();
          await new Promise((resolve) => first.server.close(resolve));
          throw new Error('connection reset');
        }
        return answer;
      },
    };

    // Act: the first run fails half-way; restart the server on the same database file; run again.
    const failed = await new SyncEngine(outbox, cutting, 'device-a').run();
    await database.close();
    database = await openDatabase(base.config);
    reopened = database;
    initModels(database.sequelize);
    const second = await listen(database, base);
    const done = await new SyncEngine(outbox, httpTransport(second.url), 'device-a').run();

    // Assert
    expect(failed.status).toBe('failed');
    expect(done.status).toBe('idle');
    expect(outbox.entries).toEqual([]);
    expect(await Pile.count({ where: { id: ids[0] } })).toBe(1);
    expect(await Sample.count({ where: { id: ids.slice(1) } })).toBe(250);
    expect(await ChangeLogEntry.count({ where: { recordId: ids } })).toBe(251);
    expect([...outbox.pulled.keys()].sort()).toEqual([...ids].sort());
    await new Promise((resolve) => second.server.close(resolve));
  });

  it('when the connection fails before the server hears the batch, the retry applies it once', async () => {
    const outbox = new MemoryOutbox();
    const ids = queue(outbox, 30);
    const { url, server } = await listen(base.database, base);
    const real = httpTransport(url);
    let isDown = true;
    const flaky: SyncTransport = { ...real, push: async (request) => { if (isDown) { throw new Error('network down'); } return real.push(request); } };
    const engine = new SyncEngine(outbox, flaky, 'device-a');

    const failed = await engine.run();
    isDown = false;
    const done = await engine.run();

    expect([failed.status, done.status]).toEqual(['failed', 'idle']);
    expect(await Sample.count({ where: { id: ids.slice(1) } })).toBe(30);
    expect(outbox.entries).toEqual([]);
    await new Promise((resolve) => server.close(resolve));
  });
});
