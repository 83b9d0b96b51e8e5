import { bestSampleGrades, type CalibrationFit, type EngineWarning, type GradeSource } from '../../shared/engine';
import type { SampleData } from '../../shared/sync/protocol';
import { calibrationForSite, currentAssaysBySample, panEstimatesBySample } from '../lab/assay-grades';

/** What the review desk knows of one sample's grade, all from the engine through the lab loop's reads. */
export interface SampleGradeView {
  readonly assayGpt: number | null;
  readonly isBelowDetection: boolean;
  readonly panGpt: number | null;
  /** The grade the estimate uses and its source; null when the sample has neither assay nor usable pan test. */
  readonly gradeGpt: number | null;
  readonly gradeSource: GradeSource | null;
  readonly warnings: readonly EngineWarning[];
}

/** The grades of some samples of one site, and the calibration applied to their pan estimates (if any). */
export interface SiteSampleGrades {
  readonly grades: Map<string, SampleGradeView>;
  readonly calibration: CalibrationFit | undefined;
}

/**
 * Assay where present, else calibrated pan (when the site's calibration is switched on and fitted),
 * else pan: the lab loop's `currentAssaysBySample`, `panEstimatesBySample` and `calibrationForSite`,
 * then the engine's `bestSampleGrades` per sample. One read of each for the whole set, so a site of
 * ten thousand samples costs three queries, not one per pile.
 */
export async function gradesOfSamples(siteId: string, samples: readonly Pick<SampleData, 'id' | 'moisturePct'>[]): Promise<SiteSampleGrades> {
  const [calibration, assays, pans] = await Promise.all([
    calibrationForSite(siteId),
    currentAssaysBySample(samples.map((sample) => sample.id)),
    panEstimatesBySample(samples),
  ]);
  const fit = calibration.isApplied && calibration.fit ? calibration.fit : undefined;
  const grades = new Map<string, SampleGradeView>();
  for (const sample of samples) {
    const assay = assays.get(sample.id);
    const pan = pans.get(sample.id);
    const base = { assayGpt: assay?.valueGpt ?? null, isBelowDetection: assay?.isBelowDetection ?? false, panGpt: pan?.panGpt ?? null };
    const graded = bestSampleGrades([{ sampleId: sample.id, assayGpt: base.assayGpt, panGpt: base.panGpt }], fit);
    const grade = graded.ok ? graded.value[0] : undefined;
    grades.set(sample.id, grade
      ? { ...base, gradeGpt: grade.gradeGpt, gradeSource: grade.source, warnings: [...grade.warnings, ...(grade.source === 'assay' ? [] : pan?.warnings ?? [])] }
      : { ...base, gradeGpt: null, gradeSource: null, warnings: pan?.warnings ?? [] });
  }
  return { grades, calibration: fit };
}
