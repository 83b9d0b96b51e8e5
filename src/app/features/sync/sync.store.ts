import { HttpClient } from '@angular/common/http';
import { Injectable, computed, effect, inject, signal, untracked } from '@angular/core';
import { TranslocoService } from '@jsverse/transloco';
import { liveQuery } from 'dexie';
import { firstValueFrom } from 'rxjs';
import type { ConflictView, ResolveConflictRequest } from '../../../../shared/sync/protocol';
import { AuthSession } from '../../core/auth/auth-session';
import { heapsightDb } from '../../core/db/heapsight-db';
import { toApiProblem } from '../../core/http/api-error';
import { SyncService } from '../../core/sync/sync.service';
import { problemText, type ProblemKeys } from '../sign-in/problem-text';

/** Why settling a conflict was refused, in words for this screen (the server's words otherwise). */
const RESOLVE_PROBLEMS: ProblemKeys = {
  offline: 'sync.problems.offline',
  forbidden: 'sync.problems.forbidden',
  not_found: 'sync.problems.notFound',
  conflict: 'sync.problems.alreadyResolved',
  validation_failed: 'sync.problems.invalidVersion',
  unauthenticated: 'sync.problems.signIn',
  token_expired: 'sync.problems.signIn',
  internal: 'sync.problems.internal',
};

/** Where the conflict list came from: the server just now, or only this device's copy. */
export type ConflictListSource = 'server' | 'device';

/** One field that differs between the device's and the server's version of a record. */
export interface ConflictField {
  readonly field: string;
  readonly deviceValue: unknown;
  readonly serverValue: unknown;
}

/** The fields of two versions that differ, in the order the device's record names them. */
export function differingFields(deviceData: unknown, serverData: unknown): ConflictField[] {
  const device = (deviceData ?? {}) as Record<string, unknown>;
  const server = (serverData ?? {}) as Record<string, unknown>;
  const fields = [...new Set([...Object.keys(device), ...Object.keys(server)])];
  return fields
    .filter((field) => JSON.stringify(device[field]) !== JSON.stringify(server[field]))
    .map((field) => ({ field, deviceValue: device[field], serverValue: server[field] }));
}

/**
 * Conflicts for the Sync screen: the server's open conflicts of this person's sites when online,
 * kept in Dexie so the list (and this device's own conflicts, written by the outbox) shows offline.
 * Geologists resolve; everyone else reads.
 */
@Injectable({ providedIn: 'root' })
export class SyncConflictsStore {
  private readonly http = inject(HttpClient);
  private readonly session = inject(AuthSession);
  private readonly sync = inject(SyncService);
  private readonly transloco = inject(TranslocoService);
  private readonly db = heapsightDb();

  readonly conflicts = signal<ConflictView[]>([]);
  readonly source = signal<ConflictListSource>('device');
  readonly problem = signal<string | null>(null);
  readonly busyId = signal<string | null>(null);
  readonly canResolve = computed(() => this.session.role() === 'geologist');

  constructor() {
    liveQuery(() => this.db.conflicts.filter((conflict) => conflict.status === 'open').toArray()).subscribe((rows) =>
      this.conflicts.set([...rows].sort((a, b) => a.createdAt.localeCompare(b.createdAt))),
    );
    // A finished sync may have made or settled conflicts on the server.
    effect(() => {
      if (this.sync.progress()?.status === 'idle') {
        untracked(() => void this.refresh());
      }
    });
  }

  /** Fetches the server's open conflicts and makes them the device's list; offline, keeps the device's. */
  async refresh(): Promise<void> {
    try {
      const { items } = await firstValueFrom(this.http.get<{ items: ConflictView[] }>('/api/sync/conflicts', { params: { status: 'open' } }));
      await this.db.transaction('rw', this.db.conflicts, async () => {
        await this.db.conflicts.clear();
        await this.db.conflicts.bulkPut(items);
      });
      this.source.set('server');
      this.problem.set(null);
    } catch {
      this.source.set('device');
    }
  }

  /** Settles a conflict on the server (geologists), then pulls the chosen version. */
  async resolve(conflictId: string, resolution: ResolveConflictRequest): Promise<boolean> {
    this.busyId.set(conflictId);
    try {
      await firstValueFrom(this.http.post(`/api/sync/conflicts/${conflictId}/resolve`, resolution));
      await this.db.conflicts.delete(conflictId);
      this.problem.set(null);
      this.sync.syncNow();
      return true;
    } catch (error) {
      this.problem.set(problemText(this.transloco, toApiProblem(error), RESOLVE_PROBLEMS));
      return false;
    } finally {
      this.busyId.set(null);
    }
  }
}
