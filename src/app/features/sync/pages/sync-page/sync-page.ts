import { DatePipe, DecimalPipe, JsonPipe } from '@angular/common';
import { Component, inject, signal, type OnInit } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { liveQuery } from 'dexie';
import { heapsightDb } from '../../../../core/db/heapsight-db';
import type { OutboxEntry, SyncStatus } from '../../../../core/sync/sync-engine';
import type { ConflictView } from '../../../../../../shared/sync/protocol';
import { SyncService } from '../../../../core/sync/sync.service';
import { SyncConflictsStore, differingFields, type ConflictField } from '../../sync.store';

/** Sync status: queue, last sync, progress, storage, and rejected changes with their reasons. */
@Component({
  selector: 'hs-sync-page',
  imports: [DatePipe, DecimalPipe, JsonPipe, MatButtonModule, MatIconModule, MatProgressBarModule],
  template: `
    <section class="hs-page">
      <h1>Sync</h1>
      <p role="status">{{ sync.queueSize() }} changes waiting · last sync {{ sync.lastSyncAt() ? (sync.lastSyncAt() | date: 'short') : 'never' }}</p>
      <button mat-flat-button type="button" (click)="sync.syncNow()"><mat-icon>sync</mat-icon> Sync now</button>
      @if (sync.progress(); as progress) {
        <p>{{ statusWords[progress.status] }} · {{ progress.mutationsSent }}/{{ progress.mutationsTotal }} changes · {{ progress.photosSent }}/{{ progress.photosTotal }} photos
          ({{ progress.bytesSent / 1024 | number: '1.0-0' }} of {{ progress.bytesTotal / 1024 | number: '1.0-0' }} kB) · {{ progress.changesPulled }} pulled</p>
        <mat-progress-bar mode="determinate" aria-label="Sync progress"
          [value]="progress.mutationsTotal + progress.photosTotal === 0 ? 100 : (100 * (progress.mutationsSent + progress.photosSent)) / (progress.mutationsTotal + progress.photosTotal)" />
        @if (progress.status === 'needs-sign-in') { <p role="alert"><mat-icon>login</mat-icon> Sign in again to sync; everything stays on this phone.</p> }
        @if (progress.error && progress.status === 'failed') { <p role="alert">Sync failed ({{ progress.error }}); it will try again.</p> }
      }
      @if (storage(); as storage) {
        <p>Storage used {{ storage.usedBytes / 1048576 | number: '1.0-1' }} MB of {{ storage.quotaBytes / 1048576 | number: '1.0-0' }} MB
          · {{ storage.isPersisted ? 'kept by the browser' : 'may be cleared when the phone is full' }}</p>
      }
      <h2>Rejected changes ({{ rejected().length }})</h2>
      <ul>
        @for (entry of rejected(); track entry.mutationId) {
          <li>{{ entry.entity }} {{ code(entry) }}:
            @for (error of entry.rejectedErrors; track error.path) { <span>{{ error.path || 'permission' }} — {{ error.message }}</span> }
            <button mat-stroked-button type="button" (click)="retry(entry)"><mat-icon>replay</mat-icon> Send again</button>
            <button mat-stroked-button type="button" (click)="discard(entry)"><mat-icon>delete</mat-icon> Discard</button></li>
        }
      </ul>

      <h2>Conflicts ({{ conflicts.conflicts().length }})</h2>
      @if (conflicts.conflicts().length > 0) {
        @if (conflicts.canResolve()) {
          <p>Two people changed the same record. Both versions are kept; choose which one stands, or take fields from each.</p>
        } @else {
          <p class="note" role="note"><mat-icon aria-hidden="true">info</mat-icon> A geologist will resolve these. Both versions are kept on the server; nothing you captured is lost.</p>
        }
        @if (conflicts.source() === 'device') { <p class="hs-muted">Shown from this phone; connect to see the server's list.</p> }
      }
      @if (conflicts.problem(); as problem) { <p role="alert" class="error">{{ problem }}</p> }
      @for (conflict of conflicts.conflicts(); track conflict.id) {
        <article class="conflict" [attr.aria-label]="'Conflict on ' + recordLabel(conflict)">
          <h3><mat-icon aria-hidden="true">call_split</mat-icon> {{ recordLabel(conflict) }}</h3>
          <p class="hs-muted">{{ conflict.deviceOp === 'delete' ? 'Deleted' : 'Changed' }} on device {{ conflict.deviceId }} on top of revision {{ conflict.baseRevision ?? 'none' }}; the server was at {{ conflict.serverRevision }} · {{ conflict.createdAt | date: 'short' }}</p>
          @if (conflict.serverData === null) {
            <p>This phone's version is waiting on the server beside the newer one.</p>
          } @else {
            <table>
              <thead><tr><th scope="col">Field</th><th scope="col">Device</th><th scope="col">Server</th>@if (conflicts.canResolve()) { <th scope="col">Keep</th> }</tr></thead>
              <tbody>
                @for (field of fieldsOf(conflict); track field.field) {
                  <tr>
                    <th scope="row">{{ field.field }}</th><td>{{ field.deviceValue | json }}</td><td>{{ field.serverValue | json }}</td>
                    @if (conflicts.canResolve()) {
                      <td><button mat-stroked-button type="button" [attr.aria-pressed]="takesDevice(conflict, field.field)" (click)="toggleField(conflict, field.field)"
                        [attr.aria-label]="'Keep ' + (takesDevice(conflict, field.field) ? 'device' : 'server') + ' value of ' + field.field">{{ takesDevice(conflict, field.field) ? 'Device' : 'Server' }}</button></td>
                    }
                  </tr>
                }
              </tbody>
            </table>
          }
          @if (conflicts.canResolve()) {
            <div class="choices">
              <button mat-flat-button type="button" [disabled]="conflicts.busyId() === conflict.id" (click)="resolve(conflict, 'device')"><mat-icon>smartphone</mat-icon> Keep device</button>
              <button mat-stroked-button type="button" [disabled]="conflicts.busyId() === conflict.id" (click)="resolve(conflict, 'server')"><mat-icon>dns</mat-icon> Keep server</button>
              @if (conflict.serverData !== null && conflict.deviceOp === 'upsert') {
                <button mat-stroked-button type="button" [disabled]="conflicts.busyId() === conflict.id || !hasDeviceFields(conflict)" (click)="resolveMerged(conflict)"><mat-icon>merge</mat-icon> Save merged</button>
              }
            </div>
          }
        </article>
      }
    </section>
  `,
  styles: `
    button { min-height: 48px; } li { margin: 8px 0; } .error { color: var(--mat-sys-error); }
    .note { display: flex; gap: 8px; align-items: flex-start; padding: 12px; border-radius: 12px; background: var(--mat-sys-secondary-container); color: var(--mat-sys-on-secondary-container); }
    .conflict { border: 1px solid var(--mat-sys-outline-variant); border-radius: 12px; padding: 12px; margin: 12px 0; }
    .conflict h3 { display: flex; align-items: center; gap: 8px; margin: 0; }
    table { width: 100%; border-collapse: collapse; table-layout: fixed; } th, td { text-align: left; padding: 6px 4px; border-bottom: 1px solid var(--mat-sys-outline-variant); overflow-wrap: anywhere; vertical-align: top; }
    .choices { display: flex; flex-wrap: wrap; gap: 8px; margin-top: 12px; }
  `,
})
export default class SyncPage implements OnInit {
  protected readonly sync = inject(SyncService);
  protected readonly conflicts = inject(SyncConflictsStore);
  protected readonly statusWords: Readonly<Record<SyncStatus, string>> = {
    idle: 'Up to date', pushing: 'Sending changes', uploading: 'Sending photos', pulling: 'Receiving', failed: 'Stopped', 'needs-sign-in': 'Sign in needed',
  };
  private readonly db = heapsightDb();
  /** Per conflict, the fields a geologist takes from the device for a merged record. */
  private readonly deviceFields = signal<Record<string, readonly string[]>>({});
  protected readonly rejected = signal<OutboxEntry[]>([]);
  protected readonly storage = signal<{ usedBytes: number; quotaBytes: number; isPersisted: boolean } | null>(null);

  async ngOnInit(): Promise<void> {
    void this.conflicts.refresh();
    liveQuery(() => this.db.outbox.toArray()).subscribe((entries) => this.rejected.set(entries.filter((entry) => entry.rejectedErrors !== null)));
    const manager = navigator.storage;
    if (manager?.estimate) {
      const isPersisted = (await manager.persisted?.()) || (await manager.persist?.()) || false;
      const estimate = await manager.estimate();
      this.storage.set({ usedBytes: estimate.usage ?? 0, quotaBytes: estimate.quota ?? 0, isPersisted });
    }
  }

  protected code(entry: OutboxEntry): string {
    return (entry.data as { code?: string } | null)?.code ?? entry.id.slice(0, 8);
  }

  /** After the user fixed the cause (e.g. synced the pile first), queue it again. */
  protected async retry(entry: OutboxEntry): Promise<void> {
    await this.db.outbox.update(entry.mutationId, { rejectedErrors: null, isInFlight: false });
    this.sync.syncNow();
  }

  protected recordLabel(conflict: ConflictView): string {
    const words = { pile: 'Pile', sample: 'Sample', panTest: 'Pan test', photo: 'Photo' } as const;
    const code = (conflict.deviceData as { code?: string } | null)?.code ?? (conflict.serverData as { code?: string } | null)?.code;
    return `${words[conflict.entity]} ${code ?? conflict.recordId.slice(0, 8)}`;
  }

  protected fieldsOf(conflict: ConflictView): ConflictField[] {
    return differingFields(conflict.deviceData, conflict.serverData);
  }

  protected takesDevice(conflict: ConflictView, field: string): boolean {
    return (this.deviceFields()[conflict.id] ?? []).includes(field);
  }

  protected hasDeviceFields(conflict: ConflictView): boolean {
    return (this.deviceFields()[conflict.id] ?? []).length > 0;
  }

  protected toggleField(conflict: ConflictView, field: string): void {
    this.deviceFields.update((chosen) => {
      const current = chosen[conflict.id] ?? [];
      return { ...chosen, [conflict.id]: current.includes(field) ? current.filter((name) => name !== field) : [...current, field] };
    });
  }

  protected async resolve(conflict: ConflictView, choice: 'device' | 'server'): Promise<void> {
    await this.conflicts.resolve(conflict.id, { choice });
  }

  /** The server's version with the fields the geologist marked "Device" taken from the device's. */
  protected async resolveMerged(conflict: ConflictView): Promise<void> {
    const device = (conflict.deviceData ?? {}) as Record<string, unknown>;
    const merged: Record<string, unknown> = { ...(conflict.serverData as Record<string, unknown>) };
    for (const field of this.deviceFields()[conflict.id] ?? []) {
      merged[field] = device[field];
    }
    await this.conflicts.resolve(conflict.id, { choice: 'merged', data: merged });
  }

  protected async discard(entry: OutboxEntry): Promise<void> {
    await this.db.outbox.delete(entry.mutationId);
  }
}
