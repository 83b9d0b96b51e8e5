/**
 * The device side of sync as a small state machine (DESIGN §5): push the outbox in batches, then
 * upload photos, then pull. It knows nothing of Angular or Dexie: storage is an `OutboxPort`, the
 * network is a `SyncTransport`, both passed in, so it runs the same against the real server in a
 * test. Each step is safe to repeat after a crash: an entry is marked in flight before it is sent
 * and keeps its mutation id until an answer removes it, so a resend is a duplicate, never a copy.
 */
import { coalesceOutbox } from '../../../../shared/sync/coalesce-outbox';
import type { FieldError, MutationResult, PulledChange, PullResponse, PushRequest, PushResponse, SyncEntity } from '../../../../shared/sync/protocol';

/** Where the engine is. `needs-sign-in` keeps the queue and waits for a fresh sign-in. */
export type SyncStatus = 'idle' | 'pushing' | 'uploading' | 'pulling' | 'failed' | 'needs-sign-in';

/** One queued change on the device. */
export interface OutboxEntry {
  readonly mutationId: string;
  readonly entity: SyncEntity;
  readonly id: string;
  readonly op: 'upsert' | 'delete';
  readonly baseRevision: number | null;
  readonly data: unknown;
  /** Sent, no answer yet: must be resent exactly as it is. */
  readonly isInFlight: boolean;
  /** Refused by the server: stays here, shown with its reasons, until the user fixes it. */
  readonly rejectedErrors: readonly FieldError[] | null;
  readonly queuedAt: string;
}

/** A photo whose bytes still have to go up. */
export interface PendingPhotoUpload {
  readonly id: string;
  readonly byteSize: number;
}

/** What the engine needs from the device database. */
export interface OutboxPort {
  /** Entries not rejected, oldest first. */
  pendingEntries(): Promise<OutboxEntry[]>;
  /** Replaces the pending entries with their coalesced form (one transaction). */
  replacePending(keep: readonly OutboxEntry[], droppedMutationIds: readonly string[]): Promise<void>;
  markInFlight(mutationIds: readonly string[]): Promise<void>;
  /** Applies the server's answers (one transaction): removes the done, keeps the rejected with reasons, stamps revisions. */
  applyResults(sent: readonly OutboxEntry[], results: readonly MutationResult[]): Promise<void>;
  /** Photos whose record has synced and whose bytes have not. */
  pendingPhotoUploads(): Promise<PendingPhotoUpload[]>;
  photoBytes(photoId: string): Promise<Blob | Uint8Array | null>;
  markPhotoUploaded(photoId: string): Promise<void>;
  pullCursor(): Promise<number>;
  /** Stores pulled changes and the new cursor together; local records with queued changes are left alone. */
  applyPulled(changes: readonly PulledChange[], cursor: number): Promise<void>;
}

/** A failed call, with whether the sign-in is the reason. */
export class TransportError extends Error {
  constructor(message: string, readonly isAuthError: boolean) {
    super(message);
  }
}

/** The network, one request object in and a Promise out. */
export interface SyncTransport {
  push(request: PushRequest): Promise<PushResponse>;
  uploadPhoto(photoId: string, bytes: Blob | Uint8Array): Promise<void>;
  pull(since: number, limit: number): Promise<PullResponse>;
}

/** Progress of one run, for the progress bar. */
export interface SyncProgress {
  readonly status: SyncStatus;
  readonly mutationsSent: number;
  readonly mutationsTotal: number;
  readonly photosSent: number;
  readonly photosTotal: number;
  readonly bytesSent: number;
  readonly bytesTotal: number;
  readonly changesPulled: number;
  readonly error: string | null;
}

/** Mutations per push. 100 keeps one request well under a minute on a weak camp link. */
export const PUSH_BATCH_SIZE = 100;
/** Changes per pull page. */
export const PULL_PAGE_SIZE = 200;

/** Pushes, uploads and pulls until there is nothing left, reporting progress. One run at a time. */
export class SyncEngine {
  private running: Promise<SyncProgress> | null = null;

  constructor(
    private readonly outbox: OutboxPort,
    private readonly transport: SyncTransport,
    private readonly deviceId: string,
    private readonly onProgress: (progress: SyncProgress) => void = () => undefined,
  ) {}

  /** Runs one sync, or joins the one already running. Resolves with the final progress (never rejects). */
  run(): Promise<SyncProgress> {
    this.running ??= this.runOnce().finally(() => {
      this.running = null;
    });
    return this.running;
  }

  private async runOnce(): Promise<SyncProgress> {
    let progress: SyncProgress = {
      status: 'pushing', mutationsSent: 0, mutationsTotal: 0, photosSent: 0, photosTotal: 0, bytesSent: 0, bytesTotal: 0, changesPulled: 0, error: null,
    };
    const report = (change: Partial<SyncProgress>) => {
      progress = { ...progress, ...change };
      this.onProgress(progress);
    };
    try {
      const pending = await this.outbox.pendingEntries();
      const { keep, droppedMutationIds } = coalesceOutbox(pending);
      if (droppedMutationIds.length > 0) {
        await this.outbox.replacePending(keep, droppedMutationIds);
      }
      report({ status: 'pushing', mutationsTotal: keep.length });
      for (let start = 0; start < keep.length; start += PUSH_BATCH_SIZE) {
        const batch = keep.slice(start, start + PUSH_BATCH_SIZE);
        await this.outbox.markInFlight(batch.map((entry) => entry.mutationId));
        const response = await this.transport.push({
          deviceId: this.deviceId,
          mutations: batch.map(({ mutationId, entity, id, op, baseRevision, data }) => ({ mutationId, entity, id, op, baseRevision, data })),
        });
        await this.outbox.applyResults(batch, response.results);
        report({ mutationsSent: progress.mutationsSent + batch.length });
      }

      const photos = await this.outbox.pendingPhotoUploads();
      report({ status: 'uploading', photosTotal: photos.length, bytesTotal: photos.reduce((sum, photo) => sum + photo.byteSize, 0) });
      for (const photo of photos) {
        const bytes = await this.outbox.photoBytes(photo.id);
        if (bytes) {
          await this.transport.uploadPhoto(photo.id, bytes);
        }
        await this.outbox.markPhotoUploaded(photo.id);
        report({ photosSent: progress.photosSent + 1, bytesSent: progress.bytesSent + photo.byteSize });
      }

      report({ status: 'pulling' });
      let since = await this.outbox.pullCursor();
      for (;;) {
        const page = await this.transport.pull(since, PULL_PAGE_SIZE);
        await this.outbox.applyPulled(page.changes, page.cursor);
        report({ changesPulled: progress.changesPulled + page.changes.length });
        since = page.cursor;
        if (!page.hasMore) {
          break;
        }
      }
      report({ status: 'idle' });
    } catch (error) {
      const isAuthError = error instanceof TransportError && error.isAuthError;
      report({ status: isAuthError ? 'needs-sign-in' : 'failed', error: error instanceof Error ? error.message : String(error) });
    }
    return progress;
  }
}
