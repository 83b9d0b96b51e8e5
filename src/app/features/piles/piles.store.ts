import { HttpClient, HttpErrorResponse } from '@angular/common/http';
import { Injectable, inject, signal } from '@angular/core';
import { firstValueFrom } from 'rxjs';
import type { EngineError, PileEstimate } from '../../../../shared/engine';
import type { PhotoData, PileData, SampleData } from '../../../../shared/sync/protocol';
import { heapsightDb } from '../../core/db/heapsight-db';
import { saveRecord } from '../../core/sync/device-outbox';
import { SyncService } from '../../core/sync/sync.service';
import { estimateOnDevice } from './device-estimate';

/** True when a request failed for want of a connection (no answer, or the service worker's 504), not because the server refused. */
export function isUnreachable(error: unknown, isOnline = typeof navigator === 'undefined' || navigator.onLine): boolean {
  return !isOnline || (error instanceof HttpErrorResponse && (error.status === 0 || error.status === 504));
}

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
  /** The translation key of what went wrong loading the site, or null. */
  readonly problem = signal<string | null>(null);

  async loadSite(siteId: string): Promise<void> {
    this.isLoading.set(true);
    this.problem.set(null);
    try {
      const review = await firstValueFrom(this.http.get<{ piles: PileRow[] }>(`/api/review/sites/${siteId}`));
      this.rows.set(review.piles);
    } catch {
      this.problem.set('piles.list.loadProblem');
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

  /** The pile as this device holds it (synced or captured here), or null; read only. */
  async heldPile(id: string): Promise<PileView | null> {
    const held = await heapsightDb().piles.get(id);
    return held && !held.deletedAt ? { ...held, revision: held.revision ?? 0, updatedAt: '' } : null;
  }

  /** The live samples of a pile this device holds; read only. */
  async heldSamples(pileId: string): Promise<(SampleData & { revision: number })[]> {
    const held = await heapsightDb().samples.where('pileId').equals(pileId).toArray();
    return held.filter((sample) => !sample.deletedAt).map((sample) => ({ ...sample, revision: sample.revision ?? 0 })).sort((a, b) => a.code.localeCompare(b.code));
  }

  /**
   * The estimate worked out on this device by the engine from the pile, samples and pan tests it
   * holds (read only), for when the server cannot be reached; null when the device lacks the pile.
   */
  async estimateOnThisDevice(pileId: string): Promise<ReturnType<typeof estimateOnDevice> | null> {
    const db = heapsightDb();
    const pile = await db.piles.get(pileId);
    if (!pile || pile.deletedAt) {
      return null;
    }
    const samples = await db.samples.where('pileId').equals(pileId).toArray();
    const panTests = samples.length > 0 ? await db.panTests.where('sampleId').anyOf(samples.map((sample) => sample.id)).toArray() : [];
    return estimateOnDevice(pile, samples, panTests);
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
