/**
 * Dry tonnes of a pile. The pile's `bulkDensityTPerM3` is its bulk density as found (wet), and its
 * `moisturePct` is water as a percentage of wet mass, so dry t = V × ρ × (1 − moisture) (DESIGN §7).
 * A density measured on dried material is entered with `densityBasis: 'dry'`, and moisture then
 * takes no further part. Sacks are weighed as bagged: dry t = count × mass × (1 − moisture).
 */
import { EngineWarning, Result, checkNumbers, engineError, fail, ok } from './result';

/** The pile materials the product knows (DESIGN §2). */
export type Material = 'mill-discharge' | 'sluice-tailings' | 'waste-rock' | 'pit-spoil';

/** The materials in the order the UI offers them. */
export const MATERIALS: readonly Material[] = ['mill-discharge', 'sluice-tailings', 'waste-rock', 'pit-spoil'];

/** Starting values for a material when nothing was measured, with where each comes from. */
export interface MaterialDefaults {
  readonly dryBulkDensityTPerM3: number;
  readonly moisturePct: number;
  /** As-found density = dry / (1 − moisture), which is what a pile record holds. */
  readonly bulkDensityTPerM3: number;
  readonly angleOfReposeDeg: number;
  /** Plausible range of dry bulk density, for warnings, t/m³. */
  readonly plausibleDryDensityTPerM3: readonly [number, number];
  readonly source: string;
}

function defaults(
  dryBulkDensityTPerM3: number,
  moisturePct: number,
  angleOfReposeDeg: number,
  plausibleDryDensityTPerM3: readonly [number, number],
  source: string,
): MaterialDefaults {
  return {
    dryBulkDensityTPerM3,
    moisturePct,
    bulkDensityTPerM3: Math.round((dryBulkDensityTPerM3 / (1 - moisturePct / 100)) * 1000) / 1000,
    angleOfReposeDeg,
    plausibleDryDensityTPerM3,
    source,
  };
}

/** Default density, moisture and angle of repose per material, each with its source. */
export const MATERIAL_DEFAULTS: Readonly<Record<Material, MaterialDefaults>> = {
  'mill-discharge': defaults(
    1.5,
    12,
    34,
    [1.0, 1.7],
    'Dry density: drained sandy tailings 1.4–1.7 t/m³, slimes 1.0–1.4 (Vick 1990, from memory); moisture and angle: common practice, no source.',
  ),
  'sluice-tailings': defaults(
    1.6,
    10,
    34,
    [1.3, 1.9],
    'Dry density: upper part of the sandy-tailings range 1.4–1.7 t/m³ for coarser sluice sand (Vick 1990, from memory); moisture and angle: common practice, no source.',
  ),
  'waste-rock': defaults(
    1.8,
    4,
    38,
    [1.5, 2.2],
    'Dry density: broken waste rock about 1.6–2.0 t/m³ loose (REFERENCES.md, common practice, no source); moisture and angle: common practice, no source.',
  ),
  'pit-spoil': defaults(
    1.6,
    12,
    33,
    [1.2, 2.0],
    'Loose mixed soil and weathered rock: common practice, no source. Measure it: pit spoil varies most of all.',
  ),
};

/** Dry tonnes and how they were reached. */
export interface TonnageEstimate {
  readonly dryTonnes: number;
  readonly wetTonnes: number;
  readonly warnings: readonly EngineWarning[];
}

/** Dry tonnes from volume (m³), bulk density (t/m³, as found unless `densityBasis` is 'dry') and moisture (% of wet mass). */
export function dryTonnes(input: {
  readonly volumeM3: number;
  readonly bulkDensityTPerM3: number;
  readonly moisturePct: number;
  readonly densityBasis?: 'wet' | 'dry';
  readonly material?: Material;
}): Result<TonnageEstimate> {
  const errors = checkNumbers([
    ['volumeM3', input.volumeM3, 'non-negative'],
    ['bulkDensityTPerM3', input.bulkDensityTPerM3, 'positive'],
    ['moisturePct', input.moisturePct, 'percent-below-100'],
  ]);
  if (input.material !== undefined && !(input.material in MATERIAL_DEFAULTS)) {
    errors.push(engineError('unknown-value', 'material', `${String(input.material)} is not a material`, { known: MATERIALS }));
  }
  if (errors.length > 0) {
    return fail(...errors);
  }
  const isDryBasis = input.densityBasis === 'dry';
  const moistureFraction = input.moisturePct / 100;
  const dryDensity = isDryBasis ? input.bulkDensityTPerM3 : input.bulkDensityTPerM3 * (1 - moistureFraction);
  const dry = input.volumeM3 * dryDensity;
  const warnings: EngineWarning[] = [];
  if (input.material) {
    const [low, high] = MATERIAL_DEFAULTS[input.material].plausibleDryDensityTPerM3;
    if (dryDensity < low || dryDensity > high) {
      warnings.push({
        code: 'density-implausible',
        message: `A dry density of ${dryDensity.toFixed(2)} t/m³ is outside the usual ${low}–${high} t/m³ for ${input.material}; check the measurement.`,
      });
    }
  }
  return ok({ dryTonnes: dry, wetTonnes: isDryBasis ? dry / (1 - moistureFraction) : input.volumeM3 * input.bulkDensityTPerM3, warnings });
}

/** Dry tonnes of material in sacks: count × mass per sack (kg, as bagged) × (1 − moisture). */
export function sackDryTonnes(input: { readonly sackCount: number; readonly sackMassKg: number; readonly moisturePct: number }): Result<TonnageEstimate> {
  const errors = checkNumbers([
    ['sackCount', input.sackCount, 'positive'],
    ['sackMassKg', input.sackMassKg, 'positive'],
    ['moisturePct', input.moisturePct, 'percent-below-100'],
  ]);
  if (errors.length > 0) {
    return fail(...errors);
  }
  const wetTonnes = (input.sackCount * input.sackMassKg) / 1000;
  return ok({ dryTonnes: wetTonnes * (1 - input.moisturePct / 100), wetTonnes, warnings: [] });
}
