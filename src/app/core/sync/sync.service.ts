import { HttpClient, HttpErrorResponse } from '@angular/common/http';
import { DOCUMENT, Injectable, computed, inject, signal } from '@angular/core';
import { toObservable } from '@angular/core/rxjs-interop';
import { liveQuery } from 'dexie';
import { firstValueFrom, fromEvent, interval, merge, Subject } from 'rxjs';
import { distinctUntilChanged, exhaustMap, filter, startWith } from 'rxjs/operators';
import { nextRetryDelay } from '../../../../shared/sync/next-retry-delay';
import type { DeviceRegistration, PullResponse, PushRequest, PushResponse } from '../../../../shared/sync/protocol';
import { AuthSession } from '../auth/auth-session';
import { heapsightDb } from '../db/heapsight-db';
import { DeviceOutbox } from './device-outbox';
import { SyncEngine, TransportError, type SyncProgress, type SyncTransport } from './sync-engine';

/** How often a device with a connection syncs on its own (ms): every five minutes. */
const SYNC_EVERY_MS = 300_000;

/** Runs sync when the app comes online, on a timer, and on "Sync now"; retries with back-off. */
@Injectable({ providedIn: 'root' })
export class SyncService {
  private readonly http = inject(HttpClient);
  private readonly session = inject(AuthSession);
  private readonly window = inject(DOCUMENT).defaultView;
  private readonly db = heapsightDb();
  private readonly manual = new Subject<void>();
  private failures = 0;
  private retryTimer: ReturnType<typeof setTimeout> | null = null;

  readonly progress = signal<SyncProgress | null>(null);
  readonly lastSyncAt = signal<string | null>(null);
  readonly queueSize = signal(0);
  readonly rejectedCount = signal(0);

  constructor() {
    liveQuery(() => this.db.outbox.toArray()).subscribe((entries) => {
      this.queueSize.set(entries.filter((entry) => entry.rejectedErrors === null).length);
      this.rejectedCount.set(entries.filter((entry) => entry.rejectedErrors !== null).length);
    });
    void this.db.syncState.get('lastSyncAt').then((row) => this.lastSyncAt.set((row?.value as string | undefined) ?? null));
    const online = this.window ? fromEvent(this.window, 'online') : new Subject<Event>();
    // A sync right after each sign-in, which is always online: the device gets its number for its codes
    // (SITE-DEVICE-SEQ) before the crew leaves signal, and pulls what the site holds.
    const signedIn = toObservable(computed(() => this.session.user()?.id ?? null)).pipe(filter((id) => id !== null), distinctUntilChanged());
    merge(online, interval(SYNC_EVERY_MS), this.manual, signedIn)
      .pipe(startWith(null), filter(() => (this.window?.navigator.onLine ?? true) && this.session.user() !== null), exhaustMap(() => this.runOnce()))
      .subscribe();
  }

  /** The "Sync now" button. */
  syncNow(): void {
    this.manual.next();
  }

  /** This device's id: the one it signed in with, else one made once and kept. */
  async deviceId(): Promise<string> {
    const fromSession = (this.session.user() as { deviceId?: string | null } | null)?.deviceId;
    if (fromSession) {
      return fromSession;
    }
    const kept = (await this.db.syncState.get('deviceId'))?.value as string | undefined;
    if (kept) {
      return kept;
    }
    const made = crypto.randomUUID();
    await this.db.syncState.put({ key: 'deviceId', value: made });
    return made;
  }

  /** The short number this device puts in its codes; asked of the server once, then kept. */
  async deviceNumber(): Promise<number | null> {
    const kept = (await this.db.syncState.get('deviceNumber'))?.value as number | undefined;
    if (kept) {
      return kept;
    }
    try {
      const registration = await firstValueFrom(this.http.post<DeviceRegistration>('/api/sync/device', { deviceId: await this.deviceId() }));
      await this.db.syncState.put({ key: 'deviceNumber', value: registration.deviceNumber });
      return registration.deviceNumber;
    } catch {
      return null;
    }
  }

  private async runOnce(): Promise<void> {
    if (this.retryTimer) {
      clearTimeout(this.retryTimer);
      this.retryTimer = null;
    }
    await this.deviceNumber();
    const deviceId = await this.deviceId();
    const engine = new SyncEngine(new DeviceOutbox(this.db, deviceId), this.transport(), deviceId, (progress) => this.progress.set(progress));
    const result = await engine.run();
    if (result.status === 'idle') {
      this.failures = 0;
      const now = new Date().toISOString();
      this.lastSyncAt.set(now);
      await this.db.syncState.put({ key: 'lastSyncAt', value: now });
    } else if (result.status === 'failed') {
      this.failures += 1;
      this.retryTimer = setTimeout(() => this.manual.next(), nextRetryDelay(this.failures, Math.random()));
    }
  }

  private transport(): SyncTransport {
    const call = async <T>(request: () => Promise<T>): Promise<T> => {
      try {
        return await request();
      } catch (error) {
        const isAuthError = error instanceof HttpErrorResponse && error.status === 401;
        throw new TransportError(error instanceof Error ? error.message : 'sync failed', isAuthError);
      }
    };
    return {
      push: (request: PushRequest) => call(() => firstValueFrom(this.http.post<PushResponse>('/api/sync/push', request))),
      uploadPhoto: (photoId, bytes) => call(async () => {
        const form = new FormData();
        form.append('photo', bytes instanceof Blob ? bytes : new Blob([bytes as BlobPart], { type: 'image/jpeg' }), `${photoId}.jpg`);
        await firstValueFrom(this.http.put(`/api/photos/${photoId}`, form));
      }),
      pull: (since, limit) => call(() => firstValueFrom(this.http.get<PullResponse>('/api/sync/pull', { params: { since, limit } }))),
    };
  }
}
