import 'fake-indexeddb/auto';
import { deserialize, serialize } from 'node:v8';
import type { Mutation, MutationResult, PullResponse, PushRequest, PushResponse, SampleData } from '../../../../shared/sync/protocol';
import { HeapsightDb } from '../db/heapsight-db';
import { DeviceOutbox, saveRecord } from './device-outbox';
import { PUSH_BATCH_SIZE, SyncEngine, TransportError, type SyncTransport } from './sync-engine';

// jsdom has no structuredClone, which fake-indexeddb uses to store values; Node's serializer is the same algorithm.
globalThis.structuredClone ??= <T>(value: T): T => deserialize(serialize(value)) as T;

const PILE_ID = '0b9c4a1e-3f2d-4c5b-8a7e-1f2e3d4c5b6a';
let databaseCount = 0;

function sample(sequence: number, overrides: Partial<SampleData> = {}): SampleData {
  return {
    id: crypto.randomUUID(), pileId: PILE_ID, code: `JR-07-${String(sequence).padStart(4, '0')}`, sampleType: 'routine', duplicateOfId: null,
    standardId: null, location: null, gpsAccuracyM: null, wetMassKg: 10, moisturePct: 8, increments: 8, position: 'toe',
    collectedAt: '2026-01-05T08:00:00.000Z', collectorId: crypto.randomUUID(), deviceId: 'phone-7', ...overrides,
  };
}

/**
 * A server in memory with the push rules that matter here: a mutation id is applied once (a resend
 * is a duplicate with the same revision), and a sample with no wet mass is rejected.
 */
class FakeServer {
  revision = 100;
  readonly applied = new Map<string, number>();
  readonly stored = new Map<string, number>();
  readonly batches: number[] = [];
  /** Fails the nth push (1-based) after applying it, as a connection that drops before the answer. */
  failAfterApplying: number | null = null;
  /** Answers every call with 401, as when the refresh token has expired. */
  isSignedOut = false;

  transport(): SyncTransport {
    return {
      push: async (request) => this.push(request),
      uploadPhoto: async () => undefined,
      pull: async (since): Promise<PullResponse> => {
        this.refuseWhenSignedOut();
        return { changes: [], cursor: since, hasMore: false };
      },
    };
  }

  private async push(request: PushRequest): Promise<PushResponse> {
    this.refuseWhenSignedOut();
    this.batches.push(request.mutations.length);
    const results = request.mutations.map((mutation) => this.applyOne(mutation));
    if (this.batches.length === this.failAfterApplying) {
      throw new TransportError('connection reset', false);
    }
    return { results };
  }

  private applyOne(mutation: Mutation): MutationResult {
    const earlier = this.applied.get(mutation.mutationId);
    if (earlier !== undefined) {
      return { mutationId: mutation.mutationId, status: 'duplicate', revision: earlier, errors: [] };
    }
    if ((mutation.data as SampleData).wetMassKg === null) {
      return { mutationId: mutation.mutationId, status: 'rejected', revision: null, errors: [{ path: 'wetMassKg', message: 'Weigh the sample' }] };
    }
    this.revision += 1;
    this.applied.set(mutation.mutationId, this.revision);
    this.stored.set(mutation.id, (this.stored.get(mutation.id) ?? 0) + 1);
    return { mutationId: mutation.mutationId, status: 'applied', revision: this.revision, errors: [] };
  }

  private refuseWhenSignedOut(): void {
    if (this.isSignedOut) {
      throw new TransportError('Sign in again', true);
    }
  }
}

describe('SyncEngine over the Dexie outbox', () => {
  let db: HeapsightDb;
  let server: FakeServer;

  beforeEach(async () => {
    databaseCount += 1;
    db = new HeapsightDb(`engine-spec-${databaseCount}`);
    await db.open();
    server = new FakeServer();
  });

  afterEach(async () => {
    db.close();
    await db.delete();
  });

  const queueSamples = async (count: number, overrides: (index: number) => Partial<SampleData> = () => ({})): Promise<SampleData[]> => {
    const samples = Array.from({ length: count }, (_, index) => sample(index + 1, overrides(index)));
    for (const [index, record] of samples.entries()) {
      await saveRecord(db, 'sample', record, { mutationId: crypto.randomUUID(), now: new Date(Date.UTC(2026, 0, 5, 8, 0, index)).toISOString() });
    }
    return samples;
  };
  const run = () => new SyncEngine(new DeviceOutbox(db, 'phone-7'), server.transport(), 'phone-7').run();

  it('pushes the queue in batches and marks every record with its revision', async () => {
    const samples = await queueSamples(PUSH_BATCH_SIZE * 2 + 30);

    const progress = await run();

    expect(progress).toMatchObject({ status: 'idle', mutationsSent: samples.length, mutationsTotal: samples.length });
    expect(server.batches).toEqual([PUSH_BATCH_SIZE, PUSH_BATCH_SIZE, 30]);
    expect(await db.outbox.count()).toBe(0);
    const stored = await db.samples.toArray();
    expect(stored.every((record) => record.revision !== null && record.revision > 100 && !record.hasPendingChange)).toBe(true);
  });

  it('keeps a rejected change on the device with its reasons and applies the rest of the batch', async () => {
    const samples = await queueSamples(3, (index) => (index === 1 ? { wetMassKg: null } : {}));

    await run();

    const left = await db.outbox.toArray();
    expect(left).toHaveLength(1);
    expect(left[0]).toMatchObject({ id: samples[1].id, rejectedErrors: [{ path: 'wetMassKg', message: 'Weigh the sample' }] });
    expect((await db.samples.get(samples[1].id))?.revision).toBeNull();
    expect([...server.stored.keys()].sort()).toEqual([samples[0].id, samples[2].id].sort());
  });

  it('keeps the whole queue and asks to sign in when the server answers 401', async () => {
    await queueSamples(5);
    server.isSignedOut = true;

    const progress = await run();

    expect(progress.status).toBe('needs-sign-in');
    expect(await db.outbox.count()).toBe(5);
    expect(await db.samples.filter((record) => record.hasPendingChange).count()).toBe(5);
  });

  it('after a transport failure mid-way, the retry resends the same mutations and stores each record once', async () => {
    // Arrange: the second batch reaches the server and is applied, but its answer is lost.
    const samples = await queueSamples(PUSH_BATCH_SIZE * 2 + 10);
    server.failAfterApplying = 2;

    // Act
    const failed = await run();
    const inFlight = await db.outbox.filter((entry) => entry.isInFlight).count();
    const retried = await run();

    // Assert
    expect(failed.status).toBe('failed');
    expect(inFlight).toBe(PUSH_BATCH_SIZE);
    expect(retried.status).toBe('idle');
    expect(server.batches).toEqual([PUSH_BATCH_SIZE, PUSH_BATCH_SIZE, PUSH_BATCH_SIZE, 10]);
    expect(server.stored.size).toBe(samples.length);
    expect([...server.stored.values()].every((writes) => writes === 1)).toBe(true);
    expect(await db.outbox.count()).toBe(0);
    expect((await db.samples.toArray()).every((record) => record.revision !== null)).toBe(true);
  });
});
