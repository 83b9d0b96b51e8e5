import { HttpClient, HttpParams } from '@angular/common/http';
import { Injectable, inject, signal } from '@angular/core';
import { firstValueFrom } from 'rxjs';
import type { PileEstimate } from '../../../../shared/engine';
import type { PileData, SampleData } from '../../../../shared/sync/protocol';
import { toApiProblem } from '../../core/http/api-error';

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

/** A pile's line of `GET /api/shortlist?site=…` as the map uses it: the engine's net value and rank, or why it has none. */
export interface MapShortlistRow {
  readonly pileId: string;
  readonly code: string;
  readonly isRankable: boolean;
  readonly thinDataReasons: readonly string[];
  readonly netValue: number | null;
  readonly conservativeNetValue: number | null;
  readonly rank: number | null;
}

/** The part of the shortlist the map shades by. */
export interface MapShortlist {
  readonly site: { readonly id: string };
  readonly parameters: { readonly currency: string };
  readonly rows: readonly MapShortlistRow[];
}

/** The site image's corners as the upload sends them. */
export interface UploadCorners {
  readonly west: number;
  readonly south: number;
  readonly east: number;
  readonly north: number;
}

/** The site map's data: the site's review, the deployment's map settings and the site image. */
@Injectable({ providedIn: 'root' })
export class SiteMapStore {
  private readonly http = inject(HttpClient);
  readonly review = signal<SiteReview | null>(null);
  readonly isLoading = signal(false);
  /** The translation key of what went wrong loading the site, or null. */
  readonly problem = signal<string | null>(null);

  readonly shortlist = signal<MapShortlist | null>(null);
  private loadTicket = 0;

  /** One site's review, without keeping it (to find the first site with data). */
  fetchReview(siteId: string): Promise<SiteReview> {
    return firstValueFrom(this.http.get<SiteReview>(`/api/review/sites/${siteId}`));
  }

  /** Shows a review already fetched. */
  show(review: SiteReview): void {
    this.problem.set(null);
    this.shortlist.set(null);
    this.review.set(review);
  }

  /** Loads a site's review; when the user picks another site meanwhile, only the latest answer is kept. */
  async load(siteId: string): Promise<void> {
    const ticket = ++this.loadTicket;
    this.isLoading.set(true);
    this.problem.set(null);
    this.shortlist.set(null);
    try {
      const review = await this.fetchReview(siteId);
      if (ticket === this.loadTicket) this.review.set(review);
    } catch {
      if (ticket === this.loadTicket) this.problem.set('siteMap.loadProblem');
    } finally {
      if (ticket === this.loadTicket) this.isLoading.set(false);
    }
  }

  /** The site's shortlist (net value per pile from the engine on the server); the server's reason when it cannot be had. */
  async loadShortlist(siteId: string): Promise<string | null> {
    try {
      this.shortlist.set(await firstValueFrom(this.http.get<MapShortlist>('/api/shortlist', { params: new HttpParams().set('site', siteId) })));
      return null;
    } catch (error) {
      this.shortlist.set(null);
      return toApiProblem(error).message;
    }
  }

  /** Admins: sends the site image and its corners (no file: moves the stored one); answers the stored image record. */
  uploadImage(siteId: string, file: File | null, corners: UploadCorners): Promise<MapImage> {
    const form = new FormData();
    for (const [field, value] of Object.entries(corners)) {
      form.append(field, String(value));
    }
    if (file) {
      form.append('image', file, file.name);
    }
    return firstValueFrom(this.http.put<MapImage>(`/api/sites/${siteId}/image`, form));
  }

  /** Puts a new image record into the review shown, so the map draws it at once. */
  replaceImage(image: MapImage): void {
    const review = this.review();
    if (review) {
      this.review.set({ ...review, image });
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
