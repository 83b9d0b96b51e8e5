/**
 * The one place the capture forms call the shared numbers engine (pan-test grade, footprint area,
 * spot-height checks, a surveyed pile's volume and tonnes), so the forms never carry formulas of their own.
 */
import { estimatePile, measureFootprint, panTestGrade, parseFootprint, placeSpotHeights, type SpotHeight } from '../../../../shared/engine';
import type { PanTestData, PileData } from '../../../../shared/sync/protocol';

/** The estimated grade of a pan test (g/t), or the reason there is none yet. */
export function estimatePanGrade(
  panTest: Pick<PanTestData, 'massPannedKg' | 'colours' | 'goldMassMg' | 'panEfficiency'>, moisturePct: number | null,
): { gradeGpt: number } | { reason: string; code: string | null; field: string | null } {
  const result = panTestGrade({
    massPannedKg: panTest.massPannedKg, moisturePct: moisturePct ?? 0, colours: panTest.colours,
    goldMassMg: panTest.goldMassMg ?? undefined, panEfficiency: panTest.panEfficiency ?? undefined,
  });
  // The engine's code and field let a screen say it in the crew's language; the message is the English fallback.
  const first = result.ok ? null : result.errors[0];
  return result.ok ? { gradeGpt: result.value.gradeGpt } : { reason: first?.message ?? 'not enough to estimate', code: first?.code ?? null, field: first?.field ?? null };
}

/** Area and perimeter of a footprint (m²), or the reason it is refused (e.g. it crosses itself). */
export function measurePileFootprint(footprint: NonNullable<PileData['footprint']>): { areaM2: number; perimeterM: number } | { reason: string; code: string | null } {
  const result = measureFootprint(footprint);
  return result.ok ? { areaM2: result.value.areaM2, perimeterM: result.value.perimeterM } : { reason: result.errors[0]?.message ?? 'not a valid footprint', code: result.errors[0]?.code ?? null };
}

/**
 * How the surveyed volume will treat one spot height: counted, left out because it lies outside the
 * footprint, left out because it repeats an earlier point (`ofPoint`, 0-based) or a toe corner
 * (`ofPoint` null), or not checked yet because there is no valid footprint.
 */
export type SpotHeightCheck =
  | { readonly status: 'counted' }
  | { readonly status: 'outside' }
  | { readonly status: 'repeated'; readonly ofPoint: number | null }
  | { readonly status: 'unchecked' };

/**
 * Checks each spot height against the footprint in the order taken, with the engine's own placement,
 * so a point flagged here is exactly a point the surveyed volume leaves out.
 */
export function checkSpotHeights(footprint: PileData['footprint'], spots: readonly Pick<SpotHeight, 'lon' | 'lat'>[]): SpotHeightCheck[] {
  const parsed = footprint ? parseFootprint(footprint) : null;
  if (!parsed?.ok) {
    return spots.map(() => ({ status: 'unchecked' }));
  }
  return placeSpotHeights(parsed.value, spots).map((placement) => (placement.status === 'counted' ? { status: 'counted' } : placement));
}

/**
 * Volume (m³) and dry tonnes of a surveyed pile being captured, with the material's default bulk density
 * and, when none is entered, its default moisture; or the engine's reason there is none yet.
 */
export function estimateSurveyedPile(
  pile: Pick<PileData, 'material' | 'footprint' | 'moisturePct'> & { readonly spotHeights: readonly SpotHeight[] },
): { volumeM3: number; dryTonnes: number } | { reason: string; code: string | null } {
  const result = estimatePile({
    material: pile.material, footprint: pile.footprint ?? undefined, shapeModel: 'surveyed', moisturePct: pile.moisturePct,
    spotHeights: pile.spotHeights.map(({ lon, lat, heightM }) => ({ lon, lat, heightM })),
  }, []);
  return result.ok
    ? { volumeM3: result.value.volumeM3, dryTonnes: result.value.dryTonnes }
    : { reason: result.errors[0]?.message ?? 'not enough to estimate', code: result.errors[0]?.code ?? null };
}
