/**
 * Calibration of pan-test estimates against assays of the same samples: an ordinary least-squares
 * line assay = intercept + slope × pan (both g/t), reported with n, R² and the residual standard
 * error (n − 2 degrees of freedom). It is refused below a minimum number of pairs, because a line
 * through a handful of skewed gold grades says little. Applied to a sample with no assay, a
 * negative prediction is clipped to zero with a warning.
 */
import { EngineError, EngineWarning, Result, checkNumber, engineError, fail, ok } from './result';

/** Fewest pairs a calibration is fitted on (common practice, no source: about ten). */
export const MIN_CALIBRATION_PAIRS = 10;

/** A sample with both a pan estimate and an assay, g/t. */
export interface CalibrationPair {
  readonly panGpt: number;
  readonly assayGpt: number;
}

/** A fitted calibration line. */
export interface CalibrationFit {
  readonly slope: number;
  readonly interceptGpt: number;
  readonly n: number;
  readonly r2: number;
  readonly residualSdGpt: number;
  readonly panRangeGpt: readonly [number, number];
  readonly warnings: readonly EngineWarning[];
}

/** Fits assay = intercept + slope × pan by least squares; refuses fewer than `minPairs` pairs. */
export function fitCalibration(pairs: readonly CalibrationPair[], minPairs: number = MIN_CALIBRATION_PAIRS): Result<CalibrationFit> {
  if (!Array.isArray(pairs) || pairs.length < Math.max(3, minPairs)) {
    return fail(
      engineError('too-few', 'pairs', `calibration needs at least ${Math.max(3, minPairs)} samples with both a pan test and an assay (got ${Array.isArray(pairs) ? pairs.length : 0})`, {
        minPairs: Math.max(3, minPairs),
      }),
    );
  }
  const errors: EngineError[] = [];
  pairs.forEach((pair, index) => {
    for (const field of ['panGpt', 'assayGpt'] as const) {
      const invalid = checkNumber(`pairs[${index}].${field}`, pair?.[field], 'non-negative');
      if (invalid) errors.push(invalid);
    }
  });
  if (errors.length > 0) {
    return fail(...errors);
  }
  const n = pairs.length;
  const meanPan = pairs.reduce((sum, pair) => sum + pair.panGpt, 0) / n;
  const meanAssay = pairs.reduce((sum, pair) => sum + pair.assayGpt, 0) / n;
  let sxx = 0;
  let sxy = 0;
  let syy = 0;
  for (const { panGpt, assayGpt } of pairs) {
    sxx += (panGpt - meanPan) ** 2;
    sxy += (panGpt - meanPan) * (assayGpt - meanAssay);
    syy += (assayGpt - meanAssay) ** 2;
  }
  if (sxx === 0) {
    return fail(engineError('no-variation', 'pairs', 'every pan estimate is the same; a line cannot be fitted', { panGpt: meanPan }));
  }
  const slope = sxy / sxx;
  const interceptGpt = meanAssay - slope * meanPan;
  const residualSquares = pairs.reduce((sum, pair) => sum + (pair.assayGpt - interceptGpt - slope * pair.panGpt) ** 2, 0);
  const r2 = syy === 0 ? 1 : 1 - residualSquares / syy;
  const warnings: EngineWarning[] = [];
  if (slope <= 0) {
    warnings.push({ code: 'slope-not-positive', message: 'Assays do not rise with pan estimates: do not use this calibration.' });
  }
  // R² 0.5: below it the pan explains less than half of the assay variation (common practice, no source).
  if (r2 < 0.5) {
    warnings.push({ code: 'weak-fit', message: `R² = ${r2.toFixed(2)}: pan estimates explain little of the assays.` });
  }
  const pans = pairs.map((pair) => pair.panGpt);
  return ok({
    slope,
    interceptGpt,
    n,
    r2,
    residualSdGpt: Math.sqrt(residualSquares / (n - 2)),
    panRangeGpt: [Math.min(...pans), Math.max(...pans)],
    warnings,
  });
}

/** A calibrated pan estimate. */
export interface CalibratedGrade {
  readonly gradeGpt: number;
  readonly warnings: readonly EngineWarning[];
}

/** Applies a calibration to a pan estimate (g/t) of a sample with no assay. */
export function applyCalibration(fit: CalibrationFit, panGpt: number): Result<CalibratedGrade> {
  const invalid = checkNumber('panGpt', panGpt, 'non-negative');
  if (invalid) {
    return fail(invalid);
  }
  const predicted = fit.interceptGpt + fit.slope * panGpt;
  const warnings: EngineWarning[] = [];
  const [low, high] = fit.panRangeGpt;
  if (panGpt < low || panGpt > high) {
    warnings.push({ code: 'outside-calibration', message: `${panGpt} g/t is outside the ${low}–${high} g/t the calibration was fitted on.` });
  }
  if (predicted < 0) {
    warnings.push({ code: 'clipped-to-zero', message: 'The calibration predicts below zero here; zero was used.' });
  }
  return ok({ gradeGpt: Math.max(0, predicted), warnings });
}

/** A sample's grade sources: an assay when there is one, else its pan estimate. */
export interface SampleGradeInput {
  readonly sampleId: string;
  readonly assayGpt?: number | null;
  readonly panGpt?: number | null;
}

/** Where a sample's grade came from. */
export type GradeSource = 'assay' | 'calibrated-pan' | 'pan';

/** The grade a sample contributes, and its source. */
export interface SampleGrade {
  readonly sampleId: string;
  readonly gradeGpt: number;
  readonly source: GradeSource;
  readonly warnings: readonly EngineWarning[];
}

/** The best grade of each sample: assay where present, else calibrated pan, else raw pan (flagged). */
export function bestSampleGrades(samples: readonly SampleGradeInput[], fit?: CalibrationFit): Result<SampleGrade[]> {
  const grades: SampleGrade[] = [];
  const errors: EngineError[] = [];
  samples.forEach((sample, index) => {
    const hasAssay = sample.assayGpt !== undefined && sample.assayGpt !== null;
    const hasPan = sample.panGpt !== undefined && sample.panGpt !== null;
    const field = hasAssay ? 'assayGpt' : 'panGpt';
    const value = hasAssay ? sample.assayGpt : sample.panGpt;
    if (!hasAssay && !hasPan) {
      errors.push(engineError('missing', `samples[${index}]`, `sample ${sample.sampleId} has neither an assay nor a pan test`));
      return;
    }
    const invalid = checkNumber(`samples[${index}].${field}`, value, 'non-negative');
    if (invalid) {
      errors.push(invalid);
    } else if (hasAssay) {
      grades.push({ sampleId: sample.sampleId, gradeGpt: value as number, source: 'assay', warnings: [] });
    } else if (fit) {
      const calibrated = applyCalibration(fit, value as number);
      if (calibrated.ok) {
        grades.push({ sampleId: sample.sampleId, ...calibrated.value, source: 'calibrated-pan' });
      }
    } else {
      grades.push({
        sampleId: sample.sampleId,
        gradeGpt: value as number,
        source: 'pan',
        warnings: [{ code: 'uncalibrated-pan', message: 'Pan estimate used as it stands: no calibration against assays yet.' }],
      });
    }
  });
  return errors.length > 0 ? fail(...errors) : ok(grades);
}
