/**
 * The one place the capture forms call the shared numbers engine (pan-test grade, footprint area),
 * so the forms never carry formulas of their own.
 */
import { measureFootprint, panTestGrade } from '../../../../shared/engine';
import type { PanTestData, PileData } from '../../../../shared/sync/protocol';

/** The estimated grade of a pan test (g/t), or the reason there is none yet. */
export function estimatePanGrade(panTest: Pick<PanTestData, 'massPannedKg' | 'colours' | 'goldMassMg' | 'panEfficiency'>, moisturePct: number | null): { gradeGpt: number } | { reason: string } {
  const result = panTestGrade({
    massPannedKg: panTest.massPannedKg, moisturePct: moisturePct ?? 0, colours: panTest.colours,
    goldMassMg: panTest.goldMassMg ?? undefined, panEfficiency: panTest.panEfficiency ?? undefined,
  });
  return result.ok ? { gradeGpt: result.value.gradeGpt } : { reason: result.errors[0]?.message ?? 'not enough to estimate' };
}

/** Area and perimeter of a footprint (m²), or the reason it is refused (e.g. it crosses itself). */
export function measurePileFootprint(footprint: NonNullable<PileData['footprint']>): { areaM2: number; perimeterM: number } | { reason: string } {
  const result = measureFootprint(footprint);
  return result.ok ? { areaM2: result.value.areaM2, perimeterM: result.value.perimeterM } : { reason: result.errors[0]?.message ?? 'not a valid footprint' };
}
