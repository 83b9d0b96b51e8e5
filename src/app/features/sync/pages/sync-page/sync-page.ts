import { JsonPipe } from '@angular/common';
import { Component, inject, signal, type OnInit } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { TranslocoPipe, TranslocoService } from '@jsverse/transloco';
import { liveQuery } from 'dexie';
import { heapsightDb } from '../../../../core/db/heapsight-db';
import type { OutboxEntry, SyncStatus } from '../../../../core/sync/sync-engine';
import { LOCALE_FORMAT_PIPES } from '../../../../i18n/locale-format.pipes';
import type { ConflictView, SyncEntity } from '../../../../../../shared/sync/protocol';
import { SyncService } from '../../../../core/sync/sync.service';
import { SyncConflictsStore, differingFields, type ConflictField } from '../../sync.store';

/** What each sync stage is called on screen (translation keys). */
const STATUS_KEYS: Readonly<Record<SyncStatus, string>> = {
  idle: 'sync.status.idle', pushing: 'sync.status.pushing', uploading: 'sync.status.uploading', pulling: 'sync.status.pulling',
  failed: 'sync.status.failed', 'needs-sign-in': 'sync.status.needsSignIn',
};

/** What each kind of record is called on screen (translation keys). */
const ENTITY_KEYS: Readonly<Record<SyncEntity, string>> = {
  pile: 'sync.entity.pile', sample: 'sync.entity.sample', panTest: 'sync.entity.panTest', photo: 'sync.entity.photo',
};

/** Sync status: queue, last sync, progress, storage, and rejected changes with their reasons. */
@Component({
  selector: 'hs-sync-page',
  imports: [JsonPipe, LOCALE_FORMAT_PIPES, MatButtonModule, MatIconModule, MatProgressBarModule, TranslocoPipe],
  template: `
    <section class="hs-page">
      <h1>{{ 'sync.page.title' | transloco }}</h1>
      <p role="status">{{ 'sync.page.queue' | transloco: { count: sync.queueSize(), when: sync.lastSyncAt() ? (sync.lastSyncAt() | hsDate: 'short') : ('sync.page.never' | transloco) } }}</p>
      <button mat-flat-button type="button" (click)="sync.syncNow()"><mat-icon>sync</mat-icon> {{ 'sync.page.syncNow' | transloco }}</button>
      @if (sync.progress(); as progress) {
        <p>{{ 'sync.page.progress' | transloco: {
          status: (statusKeys[progress.status] | transloco),
          mutationsSent: progress.mutationsSent, mutationsTotal: progress.mutationsTotal,
          photosSent: progress.photosSent, photosTotal: progress.photosTotal,
          kbSent: (progress.bytesSent / 1024 | hsNumber: '1.0-0'), kbTotal: (progress.bytesTotal / 1024 | hsNumber: '1.0-0'),
          pulled: progress.changesPulled } }}</p>
        <mat-progress-bar mode="determinate" [attr.aria-label]="'sync.page.progressLabel' | transloco"
          [value]="progress.mutationsTotal + progress.photosTotal === 0 ? 100 : (100 * (progress.mutationsSent + progress.photosSent)) / (progress.mutationsTotal + progress.photosTotal)" />
        @if (progress.status === 'needs-sign-in') { <p role="alert"><mat-icon>login</mat-icon> {{ 'sync.page.needsSignIn' | transloco }}</p> }
        @if (progress.error && progress.status === 'failed') { <p role="alert">{{ 'sync.page.failed' | transloco: { error: progress.error } }}</p> }
      }
      @if (storage(); as storage) {
        <p>{{ 'sync.page.storage' | transloco: {
          used: (storage.usedBytes / 1048576 | hsNumber: '1.0-1'), quota: (storage.quotaBytes / 1048576 | hsNumber: '1.0-0'),
          persistence: ((storage.isPersisted ? 'sync.page.persisted' : 'sync.page.notPersisted') | transloco) } }}</p>
      }
      <h2>{{ 'sync.rejected.title' | transloco: { count: rejected().length } }}</h2>
      <ul>
        @for (entry of rejected(); track entry.mutationId) {
          <li>{{ entityKeys[entry.entity] | transloco }} {{ code(entry) }}:
            @for (error of entry.rejectedErrors; track error.path) { <span>{{ error.path || ('sync.rejected.permission' | transloco) }} — {{ error.message }}</span> }
            <button mat-stroked-button type="button" (click)="retry(entry)"><mat-icon>replay</mat-icon> {{ 'sync.rejected.sendAgain' | transloco }}</button>
            <button mat-stroked-button type="button" (click)="discard(entry)"><mat-icon>delete</mat-icon> {{ 'sync.rejected.discard' | transloco }}</button></li>
        }
      </ul>

      <h2>{{ 'sync.conflicts.title' | transloco: { count: conflicts.conflicts().length } }}</h2>
      @if (conflicts.conflicts().length > 0) {
        @if (conflicts.canResolve()) {
          <p>{{ 'sync.conflicts.resolveHelp' | transloco }}</p>
        } @else {
          <p class="note" role="note"><mat-icon aria-hidden="true">info</mat-icon> {{ 'sync.conflicts.geologistWill' | transloco }}</p>
        }
        @if (conflicts.source() === 'device') { <p class="hs-muted">{{ 'sync.conflicts.fromDevice' | transloco }}</p> }
      }
      @if (conflicts.problem(); as problem) { <p role="alert" class="error">{{ problem }}</p> }
      @for (conflict of conflicts.conflicts(); track conflict.id) {
        <article class="conflict" [attr.aria-label]="'sync.conflicts.label' | transloco: { record: recordLabel(conflict) }">
          <h3><mat-icon aria-hidden="true">call_split</mat-icon> {{ recordLabel(conflict) }}</h3>
          <p class="hs-muted">{{ 'sync.conflicts.meta' | transloco: {
            change: ((conflict.deviceOp === 'delete' ? 'sync.conflicts.deleted' : 'sync.conflicts.changed') | transloco),
            deviceId: conflict.deviceId, base: conflict.baseRevision ?? ('sync.conflicts.noRevision' | transloco),
            server: conflict.serverRevision, when: (conflict.createdAt | hsDate: 'short') } }}</p>
          @if (conflict.serverData === null) {
            <p>{{ 'sync.conflicts.waitingBeside' | transloco }}</p>
          } @else {
            <table>
              <thead><tr><th scope="col">{{ 'sync.conflicts.field' | transloco }}</th><th scope="col">{{ 'sync.conflicts.device' | transloco }}</th><th scope="col">{{ 'sync.conflicts.server' | transloco }}</th>@if (conflicts.canResolve()) { <th scope="col">{{ 'sync.conflicts.keep' | transloco }}</th> }</tr></thead>
              <tbody>
                @for (field of fieldsOf(conflict); track field.field) {
                  <tr>
                    <th scope="row">{{ field.field }}</th><td>{{ field.deviceValue | json }}</td><td>{{ field.serverValue | json }}</td>
                    @if (conflicts.canResolve()) {
                      <td><button mat-stroked-button type="button" [attr.aria-pressed]="takesDevice(conflict, field.field)" (click)="toggleField(conflict, field.field)"
                        [attr.aria-label]="(takesDevice(conflict, field.field) ? 'sync.conflicts.keepDeviceValue' : 'sync.conflicts.keepServerValue') | transloco: { field: field.field }">{{ (takesDevice(conflict, field.field) ? 'sync.conflicts.device' : 'sync.conflicts.server') | transloco }}</button></td>
                    }
                  </tr>
                }
              </tbody>
            </table>
          }
          @if (conflicts.canResolve()) {
            <div class="choices">
              <button mat-flat-button type="button" [disabled]="conflicts.busyId() === conflict.id" (click)="resolve(conflict, 'device')"><mat-icon>smartphone</mat-icon> {{ 'sync.conflicts.keepDevice' | transloco }}</button>
              <button mat-stroked-button type="button" [disabled]="conflicts.busyId() === conflict.id" (click)="resolve(conflict, 'server')"><mat-icon>dns</mat-icon> {{ 'sync.conflicts.keepServer' | transloco }}</button>
              @if (conflict.serverData !== null && conflict.deviceOp === 'upsert') {
                <button mat-stroked-button type="button" [disabled]="conflicts.busyId() === conflict.id || !hasDeviceFields(conflict)" (click)="resolveMerged(conflict)"><mat-icon>merge</mat-icon> {{ 'sync.conflicts.saveMerged' | transloco }}</button>
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
  private readonly transloco = inject(TranslocoService);
  protected readonly statusKeys = STATUS_KEYS;
  protected readonly entityKeys = ENTITY_KEYS;
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
    const code = (conflict.deviceData as { code?: string } | null)?.code ?? (conflict.serverData as { code?: string } | null)?.code;
    return `${this.transloco.translate(ENTITY_KEYS[conflict.entity])} ${code ?? conflict.recordId.slice(0, 8)}`;
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
