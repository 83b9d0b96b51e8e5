/**
 * Gy's formula for the fundamental sampling error (Gy, "Sampling of Particulate Materials";
 * Pitard, "Pierre Gy's Sampling Theory and Sampling Practice"):
 *   σ² = (1/M_s − 1/M_L) · f · g · c · ℓ · d³    (d in cm, masses in g)
 * f shape factor (0.5 for most ores, 0.2 for flaky gold), g size-range factor (0.25 for a wide
 * range), c mineralogical factor ((1 − a)/a)·((1 − a)·ρ_mineral + a·ρ_gangue) with a the mass
 * fraction of the valuable mineral, ℓ liberation factor (d_ℓ/d)^0.5 while d > d_ℓ, else 1.
 * For gold, a = grade (g/t) × 10⁻⁶ and the mineral density is that of gold.
 */
import { EngineError, Result, checkNumber, checkNumbers, engineError, fail, ok } from './result';
import { GOLD_DENSITY_G_PER_CM3 } from './units';

/** The material being sampled. */
export interface GyMaterial {
  /** Top size (95 % passing), mm. */
  readonly topSizeMm: number;
  /** Size at which the valuable mineral is liberated, mm. */
  readonly liberationSizeMm: number;
  /** Gold grade, g/t; used when `mineralFraction` is absent. */
  readonly gradeGpt?: number;
  /** Mass fraction of the valuable mineral (e.g. galena in a lead ore), instead of a gold grade. */
  readonly mineralFraction?: number;
  /** Density of the valuable mineral, g/cm³; default gold 19.3. */
  readonly mineralDensityGPerCm3?: number;
  /** Density of the gangue, g/cm³; default 2.65 (quartz, common practice, no source). */
  readonly gangueDensityGPerCm3?: number;
  /** Shape factor f; default 0.5 (Gy; 0.2 for flaky gold). */
  readonly shapeFactor?: number;
  /** Size-range factor g; default 0.25 (Gy, wide size range). */
  readonly granulometricFactor?: number;
  /** Mass of the lot sampled, kg; omitted means a lot far larger than the sample. */
  readonly lotMassKg?: number;
}

/** The factors of Gy's formula as used, so that the UI can show its working. */
export interface GyFactors {
  readonly shapeFactor: number;
  readonly granulometricFactor: number;
  readonly mineralogicalFactorGPerCm3: number;
  readonly liberationFactor: number;
  readonly topSizeCm: number;
  readonly mineralFraction: number;
  /** f·g·c·ℓ·d³, grams: the sampling constant times d³. */
  readonly constantG: number;
}

/** Minimum sample mass for a target relative SD of the fundamental error. */
export interface SampleMassAdvice {
  readonly minimumMassKg: number;
  readonly targetRelativeSd: number;
  readonly factors: GyFactors;
  readonly formula: string;
}

/** Relative SD of the fundamental error for a given sample mass. */
export interface SamplingErrorAdvice {
  readonly relativeSd: number;
  readonly sampleMassKg: number;
  readonly factors: GyFactors;
  readonly formula: string;
}

const FORMULA = 'σ² = (1/Ms − 1/ML)·f·g·c·ℓ·d³ (Gy)';

function gyFactors(material: GyMaterial): Result<GyFactors> {
  const mineralDensity = material.mineralDensityGPerCm3 ?? GOLD_DENSITY_G_PER_CM3;
  const gangueDensity = material.gangueDensityGPerCm3 ?? 2.65;
  const shapeFactor = material.shapeFactor ?? 0.5;
  const granulometricFactor = material.granulometricFactor ?? 0.25;
  const errors: EngineError[] = checkNumbers([
    ['topSizeMm', material.topSizeMm, 'positive'],
    ['liberationSizeMm', material.liberationSizeMm, 'positive'],
    ['mineralDensityGPerCm3', mineralDensity, 'positive'],
    ['gangueDensityGPerCm3', gangueDensity, 'positive'],
    ['shapeFactor', shapeFactor, 'open-fraction'],
    ['granulometricFactor', granulometricFactor, 'open-fraction'],
  ]);
  let mineralFraction: number;
  if (material.mineralFraction !== undefined) {
    const invalid = checkNumber('mineralFraction', material.mineralFraction, 'open-fraction');
    if (invalid) errors.push(invalid);
    mineralFraction = material.mineralFraction;
  } else {
    const invalid = checkNumber('gradeGpt', material.gradeGpt, 'positive');
    if (invalid) errors.push(invalid);
    mineralFraction = (material.gradeGpt ?? 0) / 1e6;
  }
  if (errors.length === 0 && mineralFraction >= 1) {
    errors.push(engineError('out-of-range', 'mineralFraction', 'the valuable mineral cannot be the whole sample'));
  }
  if (errors.length > 0) {
    return fail(...errors);
  }
  const a = mineralFraction;
  const mineralogical = ((1 - a) / a) * ((1 - a) * mineralDensity + a * gangueDensity);
  const liberationFactor = material.topSizeMm > material.liberationSizeMm ? Math.sqrt(material.liberationSizeMm / material.topSizeMm) : 1;
  const topSizeCm = material.topSizeMm / 10;
  return ok({
    shapeFactor,
    granulometricFactor,
    mineralogicalFactorGPerCm3: mineralogical,
    liberationFactor,
    topSizeCm,
    mineralFraction: a,
    constantG: shapeFactor * granulometricFactor * mineralogical * liberationFactor * topSizeCm ** 3,
  });
}

/** Minimum sample mass (kg) for a target relative SD of the fundamental sampling error (Gy). */
export function minimumSampleMass(material: GyMaterial & { readonly targetRelativeSd: number }): Result<SampleMassAdvice> {
  const factors = gyFactors(material);
  const errors: EngineError[] = factors.ok ? [] : [...factors.errors];
  const invalid = checkNumber('targetRelativeSd', material.targetRelativeSd, 'positive');
  if (invalid) errors.push(invalid);
  if (material.lotMassKg !== undefined) {
    const lotInvalid = checkNumber('lotMassKg', material.lotMassKg, 'positive');
    if (lotInvalid) errors.push(lotInvalid);
  }
  if (errors.length > 0 || !factors.ok) {
    return fail(...errors);
  }
  const variance = material.targetRelativeSd ** 2;
  // 1/Ms = σ²/K + 1/ML: a finite lot needs a little less, and never more than the whole lot.
  const inverseLot = material.lotMassKg === undefined ? 0 : 1 / (material.lotMassKg * 1000);
  const minimumMassKg = 1 / (variance / factors.value.constantG + inverseLot) / 1000;
  return ok({ minimumMassKg, targetRelativeSd: material.targetRelativeSd, factors: factors.value, formula: FORMULA });
}

/** Relative SD of the fundamental sampling error for a given sample mass (kg) (Gy). */
export function samplingErrorForMass(material: GyMaterial & { readonly sampleMassKg: number }): Result<SamplingErrorAdvice> {
  const factors = gyFactors(material);
  const errors: EngineError[] = factors.ok ? [] : [...factors.errors];
  const invalid = checkNumber('sampleMassKg', material.sampleMassKg, 'positive');
  if (invalid) errors.push(invalid);
  if (material.lotMassKg !== undefined) {
    const lotInvalid = checkNumber('lotMassKg', material.lotMassKg, 'positive');
    if (lotInvalid) errors.push(lotInvalid);
    else if (!invalid && material.lotMassKg < material.sampleMassKg) {
      errors.push(engineError('out-of-range', 'sampleMassKg', 'the sample cannot be heavier than the lot'));
    }
  }
  if (errors.length > 0 || !factors.ok) {
    return fail(...errors);
  }
  const inverseLot = material.lotMassKg === undefined ? 0 : 1 / (material.lotMassKg * 1000);
  const variance = (1 / (material.sampleMassKg * 1000) - inverseLot) * factors.value.constantG;
  return ok({ relativeSd: Math.sqrt(variance), sampleMassKg: material.sampleMassKg, factors: factors.value, formula: FORMULA });
}
