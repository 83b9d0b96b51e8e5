import type { CalibrationFit, EstimateSample } from '../../shared/engine';
import { digestOfSamples } from '../review/estimate-cache';
import { samplesByPile, siteGrades, type SiteGrades } from '../review/site-grades';

/** The samples of one pile ready for `estimatePile`, and how many still wait for a grade. */
export interface PileSampleGrades {
  readonly samples: readonly EstimateSample[];
  readonly withoutGrade: number;
  /** The samples' digest for `estimatePileKept`. */
  readonly samplesDigest: string;
}

/** The sample grades of a site's piles, and the calibration to apply to pan-only samples (if any). */
export interface SiteSampleGrades {
  readonly calibration: CalibrationFit | undefined;
  readonly byPile: ReadonlyMap<string, PileSampleGrades>;
}

/**
 * The grades the shortlist ranks on: the lab loop's one answer per sample (`sampleGradesForPile`),
 * the current assay where there is one, else the pan estimate, which `estimatePile` then calibrates
 * when the site's calibration is switched on and fitted. Samples with neither are counted, never
 * guessed. All piles come from one read of the site (`siteGrades`, the review desk's too, so a
 * pile shows one grade everywhere), each pile's samples by code as `sampleGradesForPile` orders them.
 */
export async function sampleGradesForSitePiles(siteId: string, pileIds: readonly string[]): Promise<SiteSampleGrades> {
  const site = await siteGrades(siteId);
  const all = site.derive('shortlist grades by pile', gradesByPile);
  const byPile = new Map<string, PileSampleGrades>();
  for (const pileId of pileIds) {
    byPile.set(pileId, all.get(pileId) ?? NO_SAMPLES);
  }
  return { calibration: site.calibration, byPile };
}

const NO_SAMPLES: PileSampleGrades = { samples: [], withoutGrade: 0, samplesDigest: digestOfSamples([]) };

/** Every pile's graded samples by code, worked out once per set of site grades. */
function gradesByPile({ table, grades }: SiteGrades): Map<string, PileSampleGrades> {
  const byPile = new Map<string, PileSampleGrades>();
  for (const [pileId, entries] of samplesByPile(table.byCode)) {
    const graded = entries.filter((sample) => grades.get(sample.id)?.gradeGpt != null);
    const samples = graded.map((sample): EstimateSample => {
      const grade = grades.get(sample.id);
      return { sampleId: sample.id, sampleType: sample.sampleType, assayGpt: grade?.assayGpt ?? null, panGpt: grade?.panGpt ?? null };
    });
    byPile.set(pileId, { samples, withoutGrade: entries.length - graded.length, samplesDigest: digestOfSamples(samples) });
  }
  return byPile;
}
