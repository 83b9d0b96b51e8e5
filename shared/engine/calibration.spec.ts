import { applyCalibration, bestSampleGrades, fitCalibration } from './calibration';
import { unwrap } from './result';

// Anscombe 1973 (The American Statistician 27:17–21), data set I: fit y = 3.00 + 0.500x, R² = 0.67,
// residual standard error 1.24 (from memory of the usual reprint of the regression table).
const ANSCOMBE_X = [10, 8, 13, 9, 11, 14, 6, 4, 12, 7, 5];
const ANSCOMBE_Y = [8.04, 6.95, 7.58, 8.81, 8.33, 9.96, 7.24, 4.26, 10.84, 4.82, 5.68];
const ANSCOMBE = ANSCOMBE_X.map((panGpt, index) => ({ panGpt, assayGpt: ANSCOMBE_Y[index] }));

describe('fitCalibration', () => {
  it("reproduces Anscombe's published fit", () => {
    const fit = unwrap(fitCalibration(ANSCOMBE));
    expect(fit.slope).toBeCloseTo(0.5, 2);
    expect(fit.interceptGpt).toBeCloseTo(3.0, 2);
    expect(fit.r2).toBeCloseTo(0.667, 2);
    expect(fit.residualSdGpt).toBeCloseTo(1.24, 2);
    expect(fit.n).toBe(11);
    expect(fit.panRangeGpt).toEqual([4, 14]);
  });

  it('recovers an exact line with R² = 1', () => {
    const pairs = Array.from({ length: 10 }, (_, index) => ({ panGpt: index, assayGpt: 0.2 + 1.5 * index }));
    const fit = unwrap(fitCalibration(pairs));
    expect(fit.slope).toBeCloseTo(1.5, 12);
    expect(fit.interceptGpt).toBeCloseTo(0.2, 12);
    expect(fit.r2).toBeCloseTo(1, 12);
    expect(fit.warnings).toEqual([]);
  });

  it('refuses fewer pairs than the stated minimum, naming it', () => {
    const result = fitCalibration(ANSCOMBE.slice(0, 9));
    expect(!result.ok && result.errors[0]).toMatchObject({ code: 'too-few', details: { minPairs: 10 } });
    expect(fitCalibration(ANSCOMBE.slice(0, 5), 5).ok).toBe(true);
    expect(fitCalibration(ANSCOMBE.slice(0, 2), 1).ok).toBe(false);
  });

  it('refuses pan estimates that are all the same, and negative or NaN grades', () => {
    const flat = fitCalibration(ANSCOMBE.map((pair) => ({ ...pair, panGpt: 2 })));
    expect(!flat.ok && flat.errors[0].code).toBe('no-variation');
    const bad = fitCalibration([...ANSCOMBE.slice(0, 9), { panGpt: -1, assayGpt: 1 }, { panGpt: 1, assayGpt: Number.NaN }]);
    expect(!bad.ok && bad.errors.map((error) => error.code)).toEqual(['negative', 'not-a-number']);
  });

  it('warns on a weak or falling fit', () => {
    const falling = Array.from({ length: 10 }, (_, index) => ({ panGpt: index, assayGpt: 5 - 0.2 * index + (index % 2) * 6 }));
    const fit = unwrap(fitCalibration(falling));
    expect(fit.warnings.map((warning) => warning.code)).toEqual(['slope-not-positive', 'weak-fit']);
  });
});

describe('applyCalibration', () => {
  const fit = unwrap(fitCalibration(ANSCOMBE));

  it('applies the line, and warns outside the fitted range', () => {
    const inside = unwrap(applyCalibration(fit, 10));
    expect(inside.gradeGpt).toBeCloseTo(fit.interceptGpt + fit.slope * 10, 12);
    expect(inside.warnings).toEqual([]);
    expect(unwrap(applyCalibration(fit, 20)).warnings.map((warning) => warning.code)).toEqual(['outside-calibration']);
  });

  it('clips a negative prediction to zero with a warning', () => {
    const steep = { ...fit, interceptGpt: -2, slope: 1, panRangeGpt: [0, 10] as const };
    const result = unwrap(applyCalibration(steep, 1));
    expect(result.gradeGpt).toBe(0);
    expect(result.warnings.map((warning) => warning.code)).toEqual(['clipped-to-zero']);
  });

  it('refuses a NaN pan estimate', () => {
    expect(applyCalibration(fit, Number.NaN).ok).toBe(false);
  });
});

describe('bestSampleGrades', () => {
  const fit = unwrap(fitCalibration(ANSCOMBE));

  it('takes the assay where present, else the calibrated pan, else the raw pan flagged', () => {
    const samples = [
      { sampleId: 'a', assayGpt: 1.1, panGpt: 4 },
      { sampleId: 'b', panGpt: 6 },
    ];
    const calibrated = unwrap(bestSampleGrades(samples, fit));
    expect(calibrated.map((grade) => grade.source)).toEqual(['assay', 'calibrated-pan']);
    expect(calibrated[1].gradeGpt).toBeCloseTo(fit.interceptGpt + fit.slope * 6, 12);
    const raw = unwrap(bestSampleGrades(samples));
    expect(raw[1]).toMatchObject({ source: 'pan', gradeGpt: 6 });
    expect(raw[1].warnings[0].code).toBe('uncalibrated-pan');
  });

  it('refuses a sample with no grade at all, or a negative assay', () => {
    const result = bestSampleGrades([{ sampleId: 'x' }, { sampleId: 'y', assayGpt: -1 }]);
    expect(!result.ok && result.errors.map((error) => error.code)).toEqual(['missing', 'negative']);
  });
});
