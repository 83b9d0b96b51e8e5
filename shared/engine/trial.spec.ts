import fc from 'fast-check';
import { unwrap } from './result';
import { evaluateTrial } from './trial';

describe('evaluateTrial', () => {
  it("reproduces Wills' two-product tin example", () => {
    // Wills' Mineral Processing Technology, two-product formula, tin example (from memory):
    // feed 1 % Sn, concentrate 63 %, tailings 0.20 % → recovery ≈ 80.3 %, mass yield ≈ 1.27 %
    const result = unwrap(evaluateTrial({ feedGradeGpt: 10000, concentrateGradeGpt: 630000, tailingsGradeGpt: 2000 }));
    expect(result.recoveryTwoProduct).toBeCloseTo(0.803, 3);
    expect(result.massYield).toBeCloseTo(0.0127, 4);
    expect(result.enrichmentRatio).toBeCloseTo(63, 10);
    expect(result.recoveryWeighed).toBeNull();
    expect(result.discrepancy).toBeNull();
  });

  it('gives recovery from weighed masses and the discrepancy with the formula', () => {
    // mass balance: C·c/(F·f) = 2 kg × 400 g/t / (1000 kg × 1 g/t) = 0.8
    const result = unwrap(evaluateTrial({ feedGradeGpt: 1, concentrateGradeGpt: 400, tailingsGradeGpt: 0.25, feedMassKg: 1000, concentrateMassKg: 2 }));
    expect(result.recoveryWeighed).toBeCloseTo(0.8, 12);
    expect(result.massYieldWeighed).toBeCloseTo(0.002, 12);
    expect(result.discrepancy).toBeCloseTo(0.8 - result.recoveryTwoProduct, 12);
  });

  it('warns when tailings assay close to feed and recovery is poorly known', () => {
    const result = unwrap(evaluateTrial({ feedGradeGpt: 1, concentrateGradeGpt: 50, tailingsGradeGpt: 0.8 }));
    expect(result.recoverySd).toBeGreaterThan(0.05);
    expect(result.warnings.map((warning) => warning.code)).toEqual(['recovery-uncertain']);
  });

  it('warns when masses and assays show more gold out than in', () => {
    const result = unwrap(evaluateTrial({ feedGradeGpt: 1, concentrateGradeGpt: 400, tailingsGradeGpt: 0.1, feedMassKg: 100, concentrateMassKg: 1 }));
    expect(result.warnings.map((warning) => warning.code)).toContain('recovery-above-one');
  });

  it('keeps recovery and yield in [0, 1] for physical grades', () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 10, noNaN: true }), fc.double({ min: 1e-3, max: 50, noNaN: true }), fc.double({ min: 1e-3, max: 5000, noNaN: true }), (tailings, feedExtra, concentrateExtra) => {
        const result = unwrap(evaluateTrial({ tailingsGradeGpt: tailings, feedGradeGpt: tailings + feedExtra, concentrateGradeGpt: tailings + feedExtra + concentrateExtra }));
        expect(result.recoveryTwoProduct).toBeGreaterThanOrEqual(0);
        expect(result.recoveryTwoProduct).toBeLessThanOrEqual(1);
        expect(result.massYield).toBeGreaterThanOrEqual(0);
        expect(result.massYield).toBeLessThanOrEqual(1);
      }),
    );
  });

  it.each([
    ['tailings above feed', { feedGradeGpt: 1, concentrateGradeGpt: 40, tailingsGradeGpt: 2 }, 'grade-order'],
    ['concentrate below feed', { feedGradeGpt: 1, concentrateGradeGpt: 0.5, tailingsGradeGpt: 0.1 }, 'grade-order'],
    ['a negative tailings grade', { feedGradeGpt: 1, concentrateGradeGpt: 40, tailingsGradeGpt: -0.1 }, 'negative'],
    ['a NaN feed', { feedGradeGpt: Number.NaN, concentrateGradeGpt: 40, tailingsGradeGpt: 0.1 }, 'not-a-number'],
    ['a negative feed mass', { feedGradeGpt: 1, concentrateGradeGpt: 40, tailingsGradeGpt: 0.1, feedMassKg: -5, concentrateMassKg: 1 }, 'not-positive'],
    ['a concentrate heavier than the feed', { feedGradeGpt: 1, concentrateGradeGpt: 40, tailingsGradeGpt: 0.1, feedMassKg: 5, concentrateMassKg: 6 }, 'out-of-range'],
  ])('refuses %s', (_label, input, code) => {
    const result = evaluateTrial(input);
    expect(!result.ok && result.errors[0].code).toBe(code);
  });
});
