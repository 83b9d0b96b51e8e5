import type { CalibrationFit, EstimateSample } from '../../shared/engine';
import { calibrationForSite, sampleGradesForPile } from '../lab/assay-grades';

/** The samples of one pile ready for `estimatePile`, and how many still wait for a grade. */
export interface PileSampleGrades {
  readonly samples: readonly EstimateSample[];
  readonly withoutGrade: number;
}

/** The sample grades of a site's piles, and the calibration to apply to pan-only samples (if any). */
export interface SiteSampleGrades {
  readonly calibration: CalibrationFit | undefined;
  readonly byPile: ReadonlyMap<string, PileSampleGrades>;
}

/**
 * The grades the shortlist ranks on, from the lab loop's one answer per sample (`sampleGradesForPile`):
 * the current assay where there is one, else the pan estimate, which `estimatePile` then calibrates
 * when the site's calibration is switched on and fitted. Samples with neither are counted, never
 * guessed. The review desk reads the same function, so a pile shows one grade everywhere.
 */
export async function sampleGradesForSitePiles(siteId: string, pileIds: readonly string[]): Promise<SiteSampleGrades> {
  const calibration = await calibrationForSite(siteId);
  const byPile = new Map<string, PileSampleGrades>();
  for (const pileId of pileIds) {
    const entries = await sampleGradesForPile(pileId, calibration);
    const graded = entries.filter((entry) => entry.gradeGpt !== null);
    byPile.set(pileId, {
      samples: graded.map((entry) => ({ sampleId: entry.sampleId, sampleType: entry.sampleType, assayGpt: entry.assayGpt, panGpt: entry.panGpt })),
      withoutGrade: entries.length - graded.length,
    });
  }
  return { calibration: calibration.isApplied && calibration.fit ? calibration.fit : undefined, byPile };
}
