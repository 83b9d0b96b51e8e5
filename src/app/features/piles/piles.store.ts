import { HttpClient } from '@angular/common/http';
import { Injectable, inject, signal } from '@angular/core';
import { firstValueFrom } from 'rxjs';
import type { EngineError, PileEstimate } from '../../../../shared/engine';
import type { PhotoData, PileData, SampleData } from '../../../../shared/sync/protocol';
import { heapsightDb } from '../../core/db/heapsight-db';
import { saveRecord } from '../../core/sync/device-outbox';
import { SyncService } from '../../core/sync/sync.service';

/** A pile as the server shows it, with where it stands in sync. */
export type PileView = PileData & { readonly revision: number; readonly updatedAt: string };

/** One row of the Piles table: the pile and the engine's estimate (or why there is none). */
export interface PileRow {
  readonly pile: PileView;
  readonly estimate: PileEstimate | null;
  readonly estimateErrors: readonly EngineError[];
}

/** `GET /api/piles/:id/estimate`. */
export type PileEstimateView = PileEstimate & {
  readonly sampleGrades: readonly { sampleId: string; code: string; sampleType: SampleData['sampleType']; gradeGpt: number | null; gradeSource: string | null }[];
};

/** Piles of a site with their estimates, one pile's detail, and edits through the device outbox. */
@Injectable({ providedIn: 'root' })
export class PilesStore {
  private readonly http = inject(HttpClient);
  private readonly sync = inject(SyncService);
  readonly rows = signal<readonly PileRow[]>([]);
  readonly isLoading = signal(false);
  readonly problem = signal<string | null>(null);

  async loadSite(siteId: string): Promise<void> {
    this.isLoading.set(true);
    this.problem.set(null);
    try {
      const review = await firstValueFrom(this.http.get<{ piles: PileRow[] }>(`/api/review/sites/${siteId}`));
      this.rows.set(review.piles);
    } catch {
      this.problem.set('The piles could not be loaded. Check the connection and try again.');
    } finally {
      this.isLoading.set(false);
    }
  }

  pile(id: string): Promise<PileView> {
    return firstValueFrom(this.http.get<PileView>(`/api/piles/${id}`));
  }

  estimate(id: string): Promise<PileEstimateView> {
    return firstValueFrom(this.http.get<PileEstimateView>(`/api/piles/${id}/estimate`));
  }

  samples(pileId: string): Promise<{ items: (SampleData & { revision: number })[] }> {
    return firstValueFrom(this.http.get<{ items: (SampleData & { revision: number })[] }>(`/api/samples?pileId=${pileId}&limit=500`));
  }

  photos(pileId: string): Promise<{ items: (PhotoData & { storedSizes: string[] })[] }> {
    return firstValueFrom(this.http.get<{ items: (PhotoData & { storedSizes: string[] })[] }>(`/api/photos?ownerEntity=pile&ownerId=${pileId}`));
  }

  /** A photo's thumbnail as an object URL (fetched with the sign-in). */
  async photoUrl(photoId: string): Promise<string> {
    return URL.createObjectURL(await firstValueFrom(this.http.get(`/api/photos/${photoId}?size=thumb`, { responseType: 'blob' })));
  }

  /**
   * A geologist's edit goes the field app's way: the record into the device database at the
   * revision the server showed, then the change into the outbox, and a sync is started.
   */
  async savePileEdit(current: PileView, changes: Partial<PileData>): Promise<void> {
    const db = heapsightDb();
    const { revision, updatedAt: _updatedAt, createdById: _createdById, ...data } = current as PileView & { createdById?: string };
    const known = await db.piles.get(current.id);
    if (!known) {
      await db.piles.put({ ...data, revision, deletedAt: null, hasPendingChange: false });
    }
    const record: PileData = { ...(data as PileData), ...changes, id: current.id };
    await saveRecord(db, 'pile', record, { mutationId: crypto.randomUUID(), now: new Date().toISOString() });
    this.sync.syncNow();
  }
}
