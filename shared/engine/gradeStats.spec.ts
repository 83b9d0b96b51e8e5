import fc from 'fast-check';
import { finneyPsi, gradeStats, lognormalMeanGpt, samplesNeeded } from './gradeStats';
import { normalQuantile, seededRandom } from './random';
import { unwrap } from './result';

function normalDraws(seed: number, count: number): number[] {
  const random = seededRandom(seed);
  const draws: number[] = [];
  while (draws.length < count) {
    // Box–Muller transform (Box & Muller 1958)
    const radius = Math.sqrt(-2 * Math.log(1 - random()));
    const angle = 2 * Math.PI * random();
    draws.push(radius * Math.cos(angle), radius * Math.sin(angle));
  }
  return draws.slice(0, count);
}

describe('gradeStats', () => {
  it('gives n, mean, median, sample SD and CV', () => {
    // textbook definitions: mean 3, median 2.5, SD with n − 1 = √(10/3)
    const stats = unwrap(gradeStats([1, 2, 3, 6]));
    expect(stats.n).toBe(4);
    expect(stats.meanGpt).toBe(3);
    expect(stats.medianGpt).toBe(2.5);
    expect(stats.sdGpt).toBeCloseTo(Math.sqrt(14 / 3), 12);
    expect(stats.cv).toBeCloseTo(Math.sqrt(14 / 3) / 3, 12);
    expect(unwrap(gradeStats([5, 1, 3])).medianGpt).toBe(3);
  });

  it('gives the same interval for the same grades and seed, and another for another seed', () => {
    const grades = [0.4, 1.2, 0.8, 3.1, 0.2, 0.9, 1.6, 0.5, 2.2, 0.7, 1.1];
    const first = unwrap(gradeStats(grades, { seed: 7 }));
    const again = unwrap(gradeStats(grades, { seed: 7 }));
    const other = unwrap(gradeStats(grades, { seed: 12345 }));
    expect([again.ciLowGpt, again.ciHighGpt]).toEqual([first.ciLowGpt, first.ciHighGpt]);
    expect([other.ciLowGpt, other.ciHighGpt]).not.toEqual([first.ciLowGpt, first.ciHighGpt]);
    expect(first.ciLowGpt as number).toBeLessThan(first.meanGpt);
    expect(first.ciHighGpt as number).toBeGreaterThan(first.meanGpt);
  });

  it('gives a bootstrap interval close to the normal-theory interval for a large sample', () => {
    // Efron & Tibshirani 1993: the percentile interval approaches mean ± z·SD/√n as n grows
    const grades = normalDraws(11, 400).map((draw) => 5 + draw);
    const stats = unwrap(gradeStats(grades, { confidenceLevel: 0.9, bootstrapResamples: 4000 }));
    const halfWidth = (normalQuantile(0.95) * (stats.sdGpt as number)) / Math.sqrt(400);
    expect(((stats.ciHighGpt as number) - (stats.ciLowGpt as number)) / 2).toBeCloseTo(halfWidth, 1);
  });

  it('does not reorder the grades it was given', () => {
    const grades = [3, 1, 2];
    unwrap(gradeStats(grades));
    expect(grades).toEqual([3, 1, 2]);
  });

  it('gives samples needed as ⌈(z·CV/E)²⌉', () => {
    // Gilbert 1987 ch. 4: n = (z·CV/d)²; CV 1, ±20 %, 95 % → (1.96/0.2)² = 96.04 → 97
    expect(samplesNeeded(1, 0.2, 0.95)).toBe(97);
    // CV 0.5, ±10 %, 90 % → (1.6449 × 5)² = 67.6 → 68
    expect(samplesNeeded(0.5, 0.1, 0.9)).toBe(68);
  });

  it('warns on one grade and on a zero grade instead of inventing numbers', () => {
    const single = unwrap(gradeStats([1.2]));
    expect(single.sdGpt).toBeNull();
    expect(single.warnings.map((warning) => warning.code)).toEqual(['single-sample']);
    const withZero = unwrap(gradeStats([0, 1, 2]));
    expect(withZero.lognormalMeanGpt).toBeNull();
    expect(withZero.warnings.map((warning) => warning.code)).toContain('zero-grade');
    expect(unwrap(gradeStats([0, 0])).cv).toBeNull();
  });

  it.each([
    ['no grades', [], {}, 'empty'],
    ['a NaN grade', [1, Number.NaN], {}, 'not-a-number'],
    ['a negative grade', [1, -0.2], {}, 'negative'],
    ['a confidence of 1', [1, 2], { confidenceLevel: 1 }, 'out-of-range'],
    ['too few resamples', [1, 2], { bootstrapResamples: 10 }, 'out-of-range'],
  ])('refuses %s', (_label, grades, options, code) => {
    const result = gradeStats(grades as number[], options);
    expect(!result.ok && result.errors[0].code).toBe(code);
  });
});

describe('lognormal mean (Sichel / Finney)', () => {
  it('has ψₙ(t) = 1 + (n−1)t/n + (n−1)³t²/(n²(n+1)2!) + …', () => {
    // Gilbert 1987 eq. 13.4, first three terms for n = 5, t = 0.1 (fourth term below 1e-6)
    const n = 5;
    const t = 0.1;
    const threeTerms = 1 + ((n - 1) * t) / n + ((n - 1) ** 3 * t * t) / (n * n * (n + 1) * 2) + ((n - 1) ** 5 * t ** 3) / (n ** 3 * (n + 1) * (n + 3) * 6);
    expect(finneyPsi(n, t)).toBeCloseTo(threeTerms, 6);
  });

  it('tends to exp(ȳ + s²/2) as n grows', () => {
    // Gilbert 1987 §13.1: the estimator tends to exp(ȳ + V/2) for large n
    expect(finneyPsi(1e7, 0.3)).toBeCloseTo(Math.exp(0.3), 5);
  });

  it('is unbiased on small lognormal samples where exp(ȳ + s²/2) is not', () => {
    // Finney 1941: the MVU estimator's mean equals the lognormal mean exp(μ + σ²/2); μ = 0, σ = 1.2, n = 6
    const sigma = 1.2;
    const trueMean = Math.exp((sigma * sigma) / 2);
    const draws = normalDraws(3, 6 * 20000);
    let sumEstimator = 0;
    let sumNaive = 0;
    for (let set = 0; set < 20000; set += 1) {
      const grades = draws.slice(set * 6, set * 6 + 6).map((draw) => Math.exp(sigma * draw));
      sumEstimator += lognormalMeanGpt(grades);
      const logs = grades.map(Math.log);
      const mean = logs.reduce((a, b) => a + b, 0) / 6;
      const variance = logs.reduce((a, b) => a + (b - mean) ** 2, 0) / 5;
      sumNaive += Math.exp(mean + variance / 2);
    }
    expect(Math.abs(sumEstimator / 20000 - trueMean) / trueMean).toBeLessThan(0.03);
    expect(sumNaive / 20000 / trueMean).toBeGreaterThan(1.05);
  });
});

describe('normalQuantile', () => {
  it('matches the standard normal table', () => {
    // standard normal table (Abramowitz & Stegun 26.2): z(0.975) = 1.959964, z(0.95) = 1.644854, z(0.005) = −2.575829
    expect(normalQuantile(0.975)).toBeCloseTo(1.959964, 6);
    expect(normalQuantile(0.95)).toBeCloseTo(1.644854, 6);
    expect(normalQuantile(0.005)).toBeCloseTo(-2.575829, 6);
    expect(normalQuantile(0.5)).toBeCloseTo(0, 12);
  });
});

describe('seededRandom', () => {
  it('repeats for a seed and stays in [0, 1)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 2 ** 32 - 1 }), (seed) => {
        const a = seededRandom(seed);
        const b = seededRandom(seed);
        for (let index = 0; index < 20; index += 1) {
          const value = a();
          expect(value).toBe(b());
          expect(value).toBeGreaterThanOrEqual(0);
          expect(value).toBeLessThan(1);
        }
      }),
    );
  });
});
