import type { EstimateGrade } from '../../shared/engine';
import type { PileData, SampleData } from '../../shared/sync/protocol';
import type { SiteImageView } from './site-image.service';

/** The columns of a site-map sample row, in order. */
export const SITE_MAP_SAMPLE_FIELDS = ['code', 'sampleType', 'lon', 'lat', 'gradeGpt'] as const;

/**
 * One sample on the site map: code, type, longitude and latitude (null when it has no location)
 * and its grade from the engine (null: no assay or usable pan test yet).
 */
export type SiteMapSample = readonly [code: string, sampleType: SampleData['sampleType'], lon: number | null, lat: number | null, gradeGpt: number | null];

/** A pile on the site map: where it lies and the figures its card and shading show. */
export interface SiteMapPile {
  readonly pile: Pick<PileData, 'id' | 'code' | 'material' | 'footprint'>;
  /** Null when the pile cannot be estimated yet. */
  readonly estimate: { readonly dryTonnes: number; readonly containedAuG: number | null; readonly grade: EstimateGrade | null } | null;
}

/** `GET /api/review/sites/:siteId?view=map`: the site review cut to what the site map draws. */
export interface SiteMap {
  readonly site: { readonly id: string; readonly code: string; readonly name: string };
  readonly image: SiteImageView | null;
  readonly piles: readonly SiteMapPile[];
  readonly sampleFields: typeof SITE_MAP_SAMPLE_FIELDS;
  readonly samples: readonly SiteMapSample[];
}
