import type { PileData } from '../../shared/sync/protocol';
import { findPile, findPiles, type RecordView } from '../capture/capture.repository';
import { Site } from '../sites/site.model';
import { SiteImage } from './site-image.model';

// Piles are not paged here: a site holds tens of them, which the review desk shows and maps all at
// once. Its samples come from the site's table (site-samples.ts).
const EVERYTHING = Number.MAX_SAFE_INTEGER;

/** One live pile, or null (the capture component's own read). */
export function pileById(id: string): Promise<RecordView<PileData> | null> {
  return findPile(id);
}

/** Every live pile of a site, by code. */
export async function pilesOfSite(siteId: string): Promise<readonly RecordView<PileData>[]> {
  return (await findPiles([siteId], { siteId, limit: EVERYTHING, offset: 0 })).items;
}

/** A site's id, code and name within an organisation, or null. */
export async function siteSummary(siteId: string, organizationId: string): Promise<{ id: string; code: string; name: string } | null> {
  const site = await Site.findOne({ where: { id: siteId, organizationId } });
  return site ? { id: site.id, code: site.code, name: site.name } : null;
}

/** The georeferenced image record of a site, or null. */
export function siteImageOf(siteId: string): Promise<SiteImage | null> {
  return SiteImage.findByPk(siteId);
}
