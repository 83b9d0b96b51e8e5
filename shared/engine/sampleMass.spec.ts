import fc from 'fast-check';
import { minimumSampleMass, samplingErrorForMass } from './sampleMass';
import { unwrap } from './result';

// Gy sample-size model distributed with Wills' Mineral Processing Technology (REFERENCES.md):
// lead ore 5 % Pb as galena (86.6 % Pb), densities 7.5 and 2.65, liberation 0.015 cm, f 0.5, g 0.25,
// ±2 % at 95 % over 4 stages, safety factor 2 → 1,369,632 g at 2.5 cm, 24,501 g at 0.5 cm, 438 g at 0.1 cm.
const LEAD_ORE = {
  liberationSizeMm: 0.15,
  mineralFraction: 0.05 / 0.866,
  mineralDensityGPerCm3: 7.5,
  gangueDensityGPerCm3: 2.65,
  shapeFactor: 0.5,
  granulometricFactor: 0.25,
};
const STAGE_RELATIVE_SD = Math.sqrt((0.02 / 1.96) ** 2 / 4);
const SAFETY_FACTOR = 2;

describe('minimumSampleMass', () => {
  it.each([
    [25, 1369632],
    [5, 24501],
    [1, 438],
  ])('reproduces the published lead-ore example at a top size of %i mm', (topSizeMm, publishedG) => {
    const advice = unwrap(minimumSampleMass({ ...LEAD_ORE, topSizeMm, targetRelativeSd: STAGE_RELATIVE_SD }));
    expect(Math.abs(advice.minimumMassKg * 1000 * SAFETY_FACTOR - publishedG) / publishedG).toBeLessThan(2e-3);
  });

  it('returns the factors it used', () => {
    const advice = unwrap(minimumSampleMass({ ...LEAD_ORE, topSizeMm: 25, targetRelativeSd: 0.05 }));
    // Gy: c = ((1 − a)/a)·((1 − a)ρm + aρg); ℓ = (dℓ/d)^0.5
    const a = 0.05 / 0.866;
    expect(advice.factors.mineralogicalFactorGPerCm3).toBeCloseTo(((1 - a) / a) * ((1 - a) * 7.5 + a * 2.65), 10);
    expect(advice.factors.liberationFactor).toBeCloseTo(Math.sqrt(0.15 / 25), 12);
    expect(advice.factors.topSizeCm).toBe(2.5);
    expect(advice.formula).toContain('Gy');
  });

  it('reduces, for monosized liberated gold spheres, to the Poisson 1/√n', () => {
    // Gy with f = π/6, g = 1, ℓ = 1 and c ≈ ρ/a gives σ² = particle mass / gold mass = 1/n (Poisson)
    fc.assert(
      fc.property(fc.double({ min: 0.05, max: 2, noNaN: true }), fc.double({ min: 0.05, max: 20, noNaN: true }), fc.double({ min: 0.5, max: 50, noNaN: true }), (diameterMm, gradeGpt, sampleMassKg) => {
        const error = unwrap(
          samplingErrorForMass({ topSizeMm: diameterMm, liberationSizeMm: diameterMm * 2, gradeGpt, shapeFactor: Math.PI / 6, granulometricFactor: 1, sampleMassKg }),
        );
        const particleMassG = (Math.PI / 6) * (diameterMm / 10) ** 3 * 19.3;
        const particles = (sampleMassKg * 1000 * gradeGpt * 1e-6) / particleMassG;
        expect(Math.abs(error.relativeSd - 1 / Math.sqrt(particles)) * Math.sqrt(particles)).toBeLessThan(1e-3);
      }),
    );
  });

  it('needs about 20 particles for roughly ±50 % at 95 %', () => {
    // Clifton et al. 1969 (USGS Professional Paper 625-C): ≥ 20 gold particles for about ±50 % at 95 %
    const diameterMm = 0.5;
    const gradeGpt = 1;
    const particleMassG = (Math.PI / 6) * (diameterMm / 10) ** 3 * 19.3;
    const massFor20Kg = (20 * particleMassG) / (gradeGpt * 1e-6) / 1000;
    const error = unwrap(samplingErrorForMass({ topSizeMm: diameterMm, liberationSizeMm: 1, gradeGpt, shapeFactor: Math.PI / 6, granulometricFactor: 1, sampleMassKg: massFor20Kg }));
    expect(1.96 * error.relativeSd).toBeGreaterThan(0.4);
    expect(1.96 * error.relativeSd).toBeLessThan(0.5);
  });

  it('is the inverse of samplingErrorForMass, for a finite lot too', () => {
    fc.assert(
      fc.property(fc.double({ min: 0.1, max: 10, noNaN: true }), fc.double({ min: 0.02, max: 0.5, noNaN: true }), (gradeGpt, targetRelativeSd) => {
        const material = { topSizeMm: 2, liberationSizeMm: 0.1, gradeGpt, lotMassKg: 1e6 };
        const advice = unwrap(minimumSampleMass({ ...material, targetRelativeSd }));
        const error = unwrap(samplingErrorForMass({ ...material, sampleMassKg: Math.min(advice.minimumMassKg, 1e6) }));
        expect(error.relativeSd).toBeCloseTo(targetRelativeSd, 6);
      }),
    );
  });

  it('uses ℓ = 1 once the material is ground below the liberation size', () => {
    const advice = unwrap(minimumSampleMass({ topSizeMm: 0.05, liberationSizeMm: 0.1, gradeGpt: 1, targetRelativeSd: 0.1 }));
    expect(advice.factors.liberationFactor).toBe(1);
  });

  it.each([
    ['a negative top size', { topSizeMm: -1, liberationSizeMm: 0.1, gradeGpt: 1, targetRelativeSd: 0.1 }, 'not-positive'],
    ['no grade', { topSizeMm: 1, liberationSizeMm: 0.1, targetRelativeSd: 0.1 }, 'not-a-number'],
    ['a mineral that is the whole sample', { topSizeMm: 1, liberationSizeMm: 0.1, mineralFraction: 1, targetRelativeSd: 0.1 }, 'out-of-range'],
    ['a zero target', { topSizeMm: 1, liberationSizeMm: 0.1, gradeGpt: 1, targetRelativeSd: 0 }, 'not-positive'],
    ['a NaN lot', { topSizeMm: 1, liberationSizeMm: 0.1, gradeGpt: 1, targetRelativeSd: 0.1, lotMassKg: Number.NaN }, 'not-a-number'],
    ['a shape factor above 1', { topSizeMm: 1, liberationSizeMm: 0.1, gradeGpt: 1, targetRelativeSd: 0.1, shapeFactor: 2 }, 'out-of-range'],
  ])('refuses %s', (_label, input, code) => {
    const result = minimumSampleMass(input);
    expect(!result.ok && result.errors[0].code).toBe(code);
  });

  it('refuses a sample heavier than its lot, and a negative sample mass', () => {
    const heavier = samplingErrorForMass({ topSizeMm: 1, liberationSizeMm: 0.1, gradeGpt: 1, sampleMassKg: 10, lotMassKg: 5 });
    expect(!heavier.ok && heavier.errors[0].field).toBe('sampleMassKg');
    expect(samplingErrorForMass({ topSizeMm: 1, liberationSizeMm: 0.1, gradeGpt: 1, sampleMassKg: -1 }).ok).toBe(false);
    expect(samplingErrorForMass({ topSizeMm: 1, liberationSizeMm: 0.1, gradeGpt: 1, sampleMassKg: 1, lotMassKg: -5 }).ok).toBe(false);
    expect(samplingErrorForMass({ topSizeMm: Number.NaN, liberationSizeMm: 0.1, gradeGpt: 1, sampleMassKg: 1 }).ok).toBe(false);
  });
});
