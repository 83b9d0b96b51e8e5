import { DatePipe, DecimalPipe } from '@angular/common';
import { Component, inject, signal, type OnInit } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { liveQuery } from 'dexie';
import { heapsightDb } from '../../../../core/db/heapsight-db';
import type { OutboxEntry } from '../../../../core/sync/sync-engine';
import { SyncService } from '../../../../core/sync/sync.service';

/** Sync status: queue, last sync, progress, storage, and rejected changes with their reasons. */
@Component({
  selector: 'hs-sync-page',
  imports: [DatePipe, DecimalPipe, MatButtonModule, MatIconModule, MatProgressBarModule],
  template: `
    <section class="hs-page">
      <h1>Sync</h1>
      <p role="status">{{ sync.queueSize() }} changes waiting · last sync {{ sync.lastSyncAt() ? (sync.lastSyncAt() | date: 'short') : 'never' }}</p>
      <button mat-flat-button type="button" (click)="sync.syncNow()"><mat-icon>sync</mat-icon> Sync now</button>
      @if (sync.progress(); as progress) {
        <p>{{ progress.status }} · {{ progress.mutationsSent }}/{{ progress.mutationsTotal }} changes · {{ progress.photosSent }}/{{ progress.photosTotal }} photos
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
    </section>
  `,
  styles: `button { min-height: 48px; } li { margin: 8px 0; }`,
})
export default class SyncPage implements OnInit {
  protected readonly sync = inject(SyncService);
  private readonly db = heapsightDb();
  protected readonly rejected = signal<OutboxEntry[]>([]);
  protected readonly storage = signal<{ usedBytes: number; quotaBytes: number; isPersisted: boolean } | null>(null);

  async ngOnInit(): Promise<void> {
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

  protected async discard(entry: OutboxEntry): Promise<void> {
    await this.db.outbox.delete(entry.mutationId);
  }
}
