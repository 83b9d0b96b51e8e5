/**
 * Statistics of the grades of one pile (g/t).
 * - SD is the sample SD (n − 1); CV = SD / mean.
 * - Lognormal mean: Finney's (1941) minimum-variance unbiased estimator exp(ȳ)·ψₙ(s²/2), s² the
 *   (n − 1) variance of ln grade, which equals Sichel's (1966) t-estimator (Gilbert 1987, eqs 13.3–13.6).
 *   It needs every grade above zero; otherwise it is left out with a warning.
 * - Confidence interval of the mean: percentile bootstrap with a seeded generator, so the same
 *   grades and seed always give the same interval.
 * - Samples needed for a relative precision E at confidence z: n = ⌈(z·CV/E)²⌉ (Gilbert 1987, ch. 4).
 */
import { normalQuantile, seededRandom } from './random';
import { EngineError, EngineWarning, Result, checkNumber, engineError, fail, ok } from './result';

/** Options of the grade statistics, each with its default. */
export interface GradeStatsOptions {
  /** Two-sided confidence level of the interval and of samples needed; default 0.9. */
  readonly confidenceLevel?: number;
  /** Bootstrap resamples; default 2000 (common practice, no source: enough for stable 5 % tails). */
  readonly bootstrapResamples?: number;
  /** Seed of the bootstrap; default 20240601, fixed so that results reproduce. */
  readonly seed?: number;
  /** Target relative precision of the mean, as a fraction; default 0.2 (±20 %). */
  readonly targetRelativePrecision?: number;
}

/** Summary of a set of grades (DESIGN §6 `grade` without `source`). */
export interface GradeStats {
  readonly n: number;
  readonly meanGpt: number;
  readonly medianGpt: number;
  readonly sdGpt: number | null;
  readonly cv: number | null;
  readonly lognormalMeanGpt: number | null;
  readonly ciLowGpt: number | null;
  readonly ciHighGpt: number | null;
  readonly confidenceLevel: number;
  readonly samplesNeeded: number | null;
  readonly targetRelativePrecision: number;
  readonly warnings: readonly EngineWarning[];
}

/** Default bootstrap seed: any fixed number would do; this one is recorded with each result. */
export const DEFAULT_BOOTSTRAP_SEED = 20240601;

function median(sorted: readonly number[]): number {
  const middle = Math.floor(sorted.length / 2);
  return sorted.length % 2 === 1 ? sorted[middle] : (sorted[middle - 1] + sorted[middle]) / 2;
}

function quantileOfSorted(sorted: Float64Array, probability: number): number {
  // Linear interpolation between order statistics (Hyndman & Fan 1996, type 7).
  const position = probability * (sorted.length - 1);
  const below = Math.floor(position);
  const above = Math.min(sorted.length - 1, below + 1);
  return sorted[below] + (position - below) * (sorted[above] - sorted[below]);
}

/** Finney's ψₙ(t) series (Gilbert 1987 eq. 13.4); terms fall fast, 1e-15 relative is reached in a few dozen. */
export function finneyPsi(n: number, t: number): number {
  let term = ((n - 1) * t) / n;
  let sum = 1 + term;
  for (let k = 2; k < 200 && Math.abs(term) > 1e-16 * Math.abs(sum); k += 1) {
    // Ratio of term k to term k − 1: (n−1)²·t / (n·(n + 2k − 3)·k).
    term *= ((n - 1) * (n - 1) * t) / (n * (n + 2 * k - 3) * k);
    sum += term;
  }
  return sum;
}

/** Sichel's / Finney's unbiased estimate of a lognormal mean from grades (all > 0), g/t. */
export function lognormalMeanGpt(gradesGpt: readonly number[]): number {
  const logs = gradesGpt.map(Math.log);
  const n = logs.length;
  const meanLog = logs.reduce((sum, value) => sum + value, 0) / n;
  const varianceLog = logs.reduce((sum, value) => sum + (value - meanLog) ** 2, 0) / (n - 1);
  return Math.exp(meanLog) * finneyPsi(n, varianceLog / 2);
}

/** Samples needed for the mean to lie within ±E (fraction) at confidence z: ⌈(z·CV/E)²⌉. */
export function samplesNeeded(cv: number, targetRelativePrecision: number, confidenceLevel: number): number {
  const z = normalQuantile(0.5 + confidenceLevel / 2);
  return Math.ceil(((z * cv) / targetRelativePrecision) ** 2 - 1e-9);
}

/** n, mean, median, SD, CV, lognormal mean, bootstrap interval of the mean and samples needed of grades (g/t). */
export function gradeStats(gradesGpt: readonly number[], options: GradeStatsOptions = {}): Result<GradeStats> {
  const confidenceLevel = options.confidenceLevel ?? 0.9;
  const resamples = options.bootstrapResamples ?? 2000;
  const seed = options.seed ?? DEFAULT_BOOTSTRAP_SEED;
  const target = options.targetRelativePrecision ?? 0.2;
  const errors: EngineError[] = [];
  if (!Array.isArray(gradesGpt) || gradesGpt.length === 0) {
    return fail(engineError('empty', 'gradesGpt', 'there are no grades to summarise'));
  }
  gradesGpt.forEach((grade, index) => {
    const invalid = checkNumber(`gradesGpt[${index}]`, grade, 'non-negative');
    if (invalid) errors.push(invalid);
  });
  for (const [field, value] of [['confidenceLevel', confidenceLevel], ['targetRelativePrecision', target]] as const) {
    const invalid = checkNumber(field, value, 'positive');
    if (invalid) errors.push(invalid);
    else if (value >= 1) errors.push(engineError('out-of-range', field, `${field} must be below 1 (got ${value})`));
  }
  if (!Number.isInteger(resamples) || resamples < 100) {
    errors.push(engineError('out-of-range', 'bootstrapResamples', 'bootstrapResamples must be a whole number of at least 100'));
  }
  if (errors.length > 0) {
    return fail(...errors);
  }
  const n = gradesGpt.length;
  const sorted = [...gradesGpt].sort((a, b) => a - b);
  const meanGpt = gradesGpt.reduce((sum, value) => sum + value, 0) / n;
  const warnings: EngineWarning[] = [];
  const base = { n, meanGpt, medianGpt: median(sorted), confidenceLevel, targetRelativePrecision: target };
  if (n < 2) {
    warnings.push({ code: 'single-sample', message: 'One grade gives no spread: take more samples before ranking this pile.' });
    return ok({ ...base, sdGpt: null, cv: null, lognormalMeanGpt: null, ciLowGpt: null, ciHighGpt: null, samplesNeeded: null, warnings });
  }
  const sdGpt = Math.sqrt(gradesGpt.reduce((sum, value) => sum + (value - meanGpt) ** 2, 0) / (n - 1));
  const cv = meanGpt > 0 ? sdGpt / meanGpt : null;
  const hasZero = sorted[0] <= 0;
  if (hasZero) {
    warnings.push({ code: 'zero-grade', message: 'A grade of zero rules out the lognormal mean; it is not given.' });
  }
  const random = seededRandom(seed);
  const means = new Float64Array(resamples);
  for (let resample = 0; resample < resamples; resample += 1) {
    let sum = 0;
    for (let draw = 0; draw < n; draw += 1) {
      sum += gradesGpt[Math.floor(random() * n)];
    }
    means[resample] = sum / n;
  }
  means.sort();
  const tail = (1 - confidenceLevel) / 2;
  // Below about 10 grades the bootstrap interval is too narrow (it cannot see values not yet sampled).
  if (n < 10) {
    warnings.push({ code: 'few-samples', message: `Only ${n} grades: the confidence interval is likely too narrow.` });
  }
  return ok({
    ...base,
    sdGpt,
    cv,
    lognormalMeanGpt: hasZero ? null : lognormalMeanGpt(gradesGpt),
    ciLowGpt: quantileOfSorted(means, tail),
    ciHighGpt: quantileOfSorted(means, 1 - tail),
    samplesNeeded: cv === null ? null : samplesNeeded(cv, target, confidenceLevel),
    warnings,
  });
}
