import { HttpClient } from '@angular/common/http';
import { Injectable, inject, signal } from '@angular/core';
import { firstValueFrom } from 'rxjs';
import type { PileEstimate } from '../../../../shared/engine';
import type { PileData, SampleData } from '../../../../shared/sync/protocol';

/** A pile on the map: its record and the engine's estimate (null when it cannot be estimated yet). */
export interface MapPile {
  readonly pile: PileData & { readonly revision: number };
  readonly estimate: PileEstimate | null;
}

/** A sample on the map with its grade from the engine (null: no assay or pan test yet). */
export type MapSample = SampleData & { readonly pileCode: string; readonly gradeGpt: number | null; readonly gradeSource: string | null };

/** The site image record: where the picture lies and its versioned URL. */
export interface MapImage {
  readonly west: number;
  readonly south: number;
  readonly east: number;
  readonly north: number;
  readonly url: string;
}

/** What `GET /api/review/sites/:siteId` answers. */
export interface SiteReview {
  readonly site: { readonly id: string; readonly code: string; readonly name: string };
  readonly image: MapImage | null;
  readonly piles: readonly MapPile[];
  readonly samples: readonly MapSample[];
}

/** The site map's data: the site's review, the deployment's map settings and the site image. */
@Injectable({ providedIn: 'root' })
export class SiteMapStore {
  private readonly http = inject(HttpClient);
  readonly review = signal<SiteReview | null>(null);
  readonly isLoading = signal(false);
  readonly problem = signal<string | null>(null);

  async load(siteId: string): Promise<void> {
    this.isLoading.set(true);
    this.problem.set(null);
    try {
      this.review.set(await firstValueFrom(this.http.get<SiteReview>(`/api/review/sites/${siteId}`)));
    } catch {
      this.problem.set('The site could not be loaded. Check the connection and try again.');
    } finally {
      this.isLoading.set(false);
    }
  }

  /** The tile URL of an online deployment, or null for the plain background. */
  async tileUrl(): Promise<string | null> {
    try {
      return (await firstValueFrom(this.http.get<{ mapTileUrl: string | null }>('/api/client-config'))).mapTileUrl;
    } catch {
      return null;
    }
  }

  /** The site image as an object URL (fetched with the sign-in; the service worker keeps it for offline). */
  async imageObjectUrl(image: MapImage): Promise<string | null> {
    try {
      return URL.createObjectURL(await firstValueFrom(this.http.get(image.url, { responseType: 'blob' })));
    } catch {
      return null;
    }
  }
}
