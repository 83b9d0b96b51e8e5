/**
 * A simulated device for the reliability tests: the real client sync engine over an outbox and
 * record store kept in memory (the same rules as the Dexie one), talking HTTP to a real server.
 */
import { randomUUID } from 'node:crypto';
import { SyncEngine, TransportError, type OutboxEntry, type OutboxPort, type PendingPhotoUpload, type SyncProgress, type SyncTransport } from '../../../src/app/core/sync/sync-engine';
import type { Mutation, MutationResult, PulledChange, SyncEntity } from '../../../shared/sync/protocol';

/** The device's outbox, pulled records and photo bytes in memory. */
export class MemoryOutbox implements OutboxPort {
  entries: OutboxEntry[] = [];
  readonly pulled = new Map<string, PulledChange>();
  /** Every answer the device has read, by mutation id (a lost answer is simply absent). */
  readonly answers = new Map<string, MutationResult>();
  readonly photos = new Map<string, { bytes: Uint8Array; isUploaded: boolean }>();
  cursor = 0;

  async pendingEntries() { return this.entries.filter((entry) => entry.rejectedErrors === null); }
  async replacePending(keep: readonly OutboxEntry[], dropped: readonly string[]) {
    this.entries = [...keep, ...this.entries.filter((entry) => !keep.includes(entry) && !dropped.includes(entry.mutationId) && entry.rejectedErrors !== null)];
  }
  async markInFlight(ids: readonly string[]) { this.entries = this.entries.map((entry) => (ids.includes(entry.mutationId) ? { ...entry, isInFlight: true } : entry)); }
  async applyResults(_sent: readonly OutboxEntry[], results: readonly MutationResult[]) {
    for (const result of results) {
      this.answers.set(result.mutationId, result);
      this.entries = result.status === 'rejected'
        ? this.entries.map((entry) => (entry.mutationId === result.mutationId ? { ...entry, isInFlight: false, rejectedErrors: result.errors } : entry))
        : this.entries.filter((entry) => entry.mutationId !== result.mutationId);
    }
  }
  async pendingPhotoUploads(): Promise<PendingPhotoUpload[]> {
    const synced = new Set(this.entries.map((entry) => entry.id));
    return [...this.photos].filter(([id, photo]) => !photo.isUploaded && !synced.has(id)).map(([id, photo]) => ({ id, byteSize: photo.bytes.length }));
  }
  async photoBytes(photoId: string) { return this.photos.get(photoId)?.bytes ?? null; }
  async markPhotoUploaded(photoId: string) {
    const photo = this.photos.get(photoId);
    if (photo) {
      this.photos.set(photoId, { ...photo, isUploaded: true });
    }
  }
  async pullCursor() { return this.cursor; }
  async applyPulled(changes: readonly PulledChange[], cursor: number) {
    changes.forEach((change) => this.pulled.set(change.id, change));
    this.cursor = cursor;
  }

  /** Queues one change the way the capture screens do: a new mutation id, not yet in flight. */
  queue(entity: SyncEntity, data: { id: string }, baseRevision: number | null = null, op: Mutation['op'] = 'upsert'): OutboxEntry {
    const entry: OutboxEntry = {
      mutationId: randomUUID(), entity, id: data.id, op, baseRevision, data, isInFlight: false, rejectedErrors: null, queuedAt: new Date().toISOString(),
    };
    this.entries.push(entry);
    return entry;
  }
}

/** Longest a single request may take before the device gives up on it (bounded tests). */
const REQUEST_TIMEOUT_MS = 15_000;

/** The device's HTTP calls to `url` with its bearer token, failing on anything but a 2xx JSON answer. */
export function httpTransport(url: string, accessToken: string): SyncTransport {
  const call = async <T>(path: string, init: RequestInit = {}): Promise<T> => {
    const response = await fetch(`${url}${path}`, {
      ...init,
      headers: { authorization: `Bearer ${accessToken}`, ...(typeof init.body === 'string' ? { 'content-type': 'application/json' } : {}) },
      signal: AbortSignal.timeout(REQUEST_TIMEOUT_MS),
    });
    if (!response.ok) {
      await response.arrayBuffer().catch(() => undefined);
      throw new TransportError(`HTTP ${response.status}`, response.status === 401);
    }
    return (await response.json()) as T;
  };
  return {
    push: (request) => call('/api/sync/push', { method: 'POST', body: JSON.stringify(request) }),
    uploadPhoto: async (photoId, bytes) => {
      const form = new FormData();
      form.append('photo', new Blob([bytes as Uint8Array<ArrayBuffer>], { type: 'image/jpeg' }), `${photoId}.jpg`);
      await call(`/api/photos/${photoId}`, { method: 'PUT', body: form });
    },
    pull: (since, limit) => call(`/api/sync/pull?since=${since}&limit=${limit}`),
  };
}

/** Signs a demo person in (straight to the server, not through a fault) and answers the access token. */
export async function signIn(url: string, email: string, deviceId: string): Promise<string> {
  const response = await fetch(`${url}/api/auth/login`, {
    method: 'POST', headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ email, password: 'heapsight-demo', deviceId }), signal: AbortSignal.timeout(REQUEST_TIMEOUT_MS),
  });
  if (!response.ok) {
    throw new Error(`sign-in of ${email} failed: HTTP ${response.status}`);
  }
  return ((await response.json()) as { accessToken: string }).accessToken;
}

/**
 * Runs the engine again and again, as the app does on its retry timer, until a run ends idle
 * with nothing left to send. Bounded: gives up (and says so) after `maxRuns`.
 */
export async function syncUntilIdle(engine: SyncEngine, outbox: MemoryOutbox, maxRuns = 400): Promise<{ runs: number; failedRuns: number; last: SyncProgress }> {
  let failedRuns = 0;
  for (let runs = 1; runs <= maxRuns; runs += 1) {
    const last = await engine.run();
    const isDone = last.status === 'idle' && (await outbox.pendingEntries()).length === 0 && (await outbox.pendingPhotoUploads()).length === 0;
    if (isDone) {
      return { runs, failedRuns, last };
    }
    if (last.status === 'needs-sign-in') {
      throw new Error(`the device was signed out: ${last.error}`);
    }
    failedRuns += 1;
  }
  throw new Error(`the device did not converge in ${maxRuns} runs`);
}
