import { HttpClient, HttpParams } from '@angular/common/http';
import { Injectable, inject, signal } from '@angular/core';
import { firstValueFrom } from 'rxjs';
import type { PileEstimate } from '../../../../shared/engine';
import type { PileData, SampleData } from '../../../../shared/sync/protocol';
import { toApiProblem } from '../../core/http/api-error';

/** A pile on the map: where it lies and the engine's figures its card and shading show (null when it cannot be estimated yet). */
export interface MapPile {
  readonly pile: Pick<PileData, 'id' | 'code' | 'material' | 'footprint'>;
  readonly estimate: Pick<PileEstimate, 'dryTonnes' | 'containedAuG' | 'grade'> | null;
}

/** A sample on the map with its grade from the engine (null: no assay or pan test yet). */
export type MapSample = Pick<SampleData, 'code' | 'sampleType' | 'location'> & { readonly gradeGpt: number | null };

/** The site image record: where the picture lies and its versioned URL. */
export interface MapImage {
  readonly west: number;
  readonly south: number;
  readonly east: number;
  readonly north: number;
  readonly url: string;
}

/** A site as the map holds it: piles and samples decoded from `GET /api/review/sites/:siteId?view=map`. */
export interface SiteReview {
  readonly site: { readonly id: string; readonly code: string; readonly name: string };
  readonly image: MapImage | null;
  readonly piles: readonly MapPile[];
  readonly samples: readonly MapSample[];
}

/** One sample as the map view sends it: code, type, longitude, latitude (null: no location) and grade. */
export type SiteMapSampleRow = readonly [code: string, sampleType: SampleData['sampleType'], lon: number | null, lat: number | null, gradeGpt: number | null];

/** What `GET /api/review/sites/:siteId?view=map` answers: the site review cut to what the map draws, a row per sample. */
export interface SiteMapAnswer {
  readonly site: SiteReview['site'];
  readonly image: MapImage | null;
  readonly piles: readonly MapPile[];
  readonly sampleFields: readonly string[];
  readonly samples: readonly SiteMapSampleRow[];
}

/** The columns the decoding below expects, in this order. */
const SAMPLE_FIELDS = ['code', 'sampleType', 'lon', 'lat', 'gradeGpt'];

/** Turns the map view's sample rows back into objects; refuses an answer whose columns are not the ones expected. */
export function decodeSiteMap(answer: SiteMapAnswer): SiteReview {
  if (answer.sampleFields.join() !== SAMPLE_FIELDS.join()) {
    throw new Error(`unexpected sample columns: ${answer.sampleFields.join(', ')}`);
  }
  return {
    site: answer.site,
    image: answer.image,
    piles: answer.piles,
    samples: answer.samples.map(([code, sampleType, lon, lat, gradeGpt]) => ({
      code, sampleType, gradeGpt, location: lon === null || lat === null ? null : { type: 'Point', coordinates: [lon, lat] },
    })),
  };
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
  async fetchReview(siteId: string): Promise<SiteReview> {
    return decodeSiteMap(await firstValueFrom(this.http.get<SiteMapAnswer>(`/api/review/sites/${siteId}`, { params: new HttpParams().set('view', 'map') })));
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
