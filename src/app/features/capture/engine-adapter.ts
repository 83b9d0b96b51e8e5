/**
 * The one place the capture forms call the shared numbers engine (pan-test grade, footprint area),
 * so the forms never carry formulas of their own.
 */
import { measureFootprint, panTestGrade } from '../../../../shared/engine';
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
