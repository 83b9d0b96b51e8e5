/**
 * Units of the trade: sieve mesh numbers, lengths and gold grades.
 * Sieve apertures follow ASTM E11 Table 1 (the same apertures as ISO 565 / ISO 3310-1); the mass
 * units follow NIST SP 811 Appendix B. A mesh number that is not in the table is refused, never
 * interpolated, because a sieve either exists or does not.
 */
import { EngineError, Result, checkNumber, engineError, fail, ok } from './result';

/** Grams in one troy ounce, exact by definition (NIST SP 811, Appendix B). */
export const TROY_OUNCE_G = 31.1034768;

/** Kilograms in one short ton (2000 lb), exact by definition (NIST SP 811, Appendix B). */
export const SHORT_TON_KG = 907.18474;

/** Density of gold at 20 °C in g/cm³ (CRC Handbook gives 19.32; 19.3 is the value used in the trade). */
export const GOLD_DENSITY_G_PER_CM3 = 19.3;

/** Which sieve table a mesh number refers to. */
export type SieveSeries = 'astm-e11' | 'pre-1970';

/** ASTM E11 Table 1 standard sieve designations No. 4 to No. 400, as [mesh, aperture µm]. */
export const ASTM_E11_SIEVES: ReadonlyArray<readonly [number, number]> = [
  [4, 4750], [5, 4000], [6, 3350], [7, 2800], [8, 2360], [10, 2000], [12, 1700], [14, 1400],
  [16, 1180], [18, 1000], [20, 850], [25, 710], [30, 600], [35, 500], [40, 425], [45, 355],
  [50, 300], [60, 250], [70, 212], [80, 180], [100, 150], [120, 125], [140, 106], [170, 90],
  [200, 75], [230, 63], [270, 53], [325, 45], [400, 38],
];

/**
 * The older (pre-1970) apertures that old reports still quote. Only the sizes listed in
 * REFERENCES.md (20, 80, 100, 200) plus four recalled ones (from memory) are kept; others are refused.
 */
export const PRE_1970_SIEVES: ReadonlyArray<readonly [number, number]> = [
  [20, 840], [40, 420], [80, 177], [100, 149], [140, 105], [200, 74], [325, 44], [400, 37],
];

/** A sieve: its mesh number, aperture and which table it came from. */
export interface Sieve {
  readonly mesh: number;
  readonly apertureUm: number;
  readonly series: SieveSeries;
}

function sieveTable(series: SieveSeries): ReadonlyArray<readonly [number, number]> {
  return series === 'astm-e11' ? ASTM_E11_SIEVES : PRE_1970_SIEVES;
}

/** Aperture in µm of a sieve by mesh number; refuses a mesh that is not in the table. */
export function meshToApertureUm(mesh: number, series: SieveSeries = 'astm-e11'): Result<Sieve> {
  const invalid = checkNumber('mesh', mesh, 'positive');
  if (invalid) {
    return fail(invalid);
  }
  const row = sieveTable(series).find(([tableMesh]) => tableMesh === mesh);
  if (!row) {
    return fail(
      engineError('unknown-value', 'mesh', `No. ${mesh} is not a sieve of the ${series} series`, {
        known: sieveTable(series).map(([tableMesh]) => tableMesh),
      }),
    );
  }
  return ok({ mesh, apertureUm: row[1], series });
}

/**
 * Mesh number of the sieve with this aperture (within 1 %, to absorb rounding in old reports);
 * refuses an aperture that is no sieve of the series, naming the nearest.
 */
export function apertureUmToMesh(apertureUm: number, series: SieveSeries = 'astm-e11'): Result<Sieve> {
  const invalid = checkNumber('apertureUm', apertureUm, 'positive');
  if (invalid) {
    return fail(invalid);
  }
  const table = sieveTable(series);
  let nearest = table[0];
  for (const row of table) {
    if (Math.abs(Math.log(row[1] / apertureUm)) < Math.abs(Math.log(nearest[1] / apertureUm))) {
      nearest = row;
    }
  }
  // 1 %: the finest steps of the series are about 19 % apart, so 1 % never picks the wrong sieve.
  if (Math.abs(nearest[1] - apertureUm) / nearest[1] > 0.01) {
    return fail(
      engineError('unknown-value', 'apertureUm', `${apertureUm} µm is not a sieve of the ${series} series`, {
        nearestMesh: nearest[0],
        nearestApertureUm: nearest[1],
      }),
    );
  }
  return ok({ mesh: nearest[0], apertureUm: nearest[1], series });
}

/** A length unit. */
export type LengthUnit = 'mm' | 'um';

/** Converts a length between millimetres and micrometres. */
export function convertLength(value: number, from: LengthUnit, to: LengthUnit): Result<number> {
  const invalid = checkNumber('value', value, 'finite');
  if (invalid) {
    return fail(invalid);
  }
  const inUm = from === 'mm' ? value * 1000 : value;
  return ok(to === 'mm' ? inUm / 1000 : inUm);
}

/** A grade unit: g/t, ppm, mg/kg (all equal), troy oz per short ton, troy oz per tonne. */
export type GradeUnit = 'gpt' | 'ppm' | 'mgPerKg' | 'ozPerShortTon' | 'ozPerTonne';

/** Grams per tonne in one unit of each grade unit. */
export const GRADE_UNIT_IN_GPT: Readonly<Record<GradeUnit, number>> = {
  gpt: 1,
  ppm: 1,
  mgPerKg: 1,
  // One troy ounce in one short ton: 31.1034768 g / 0.90718474 t = 240/7 g/t exactly.
  ozPerShortTon: TROY_OUNCE_G / (SHORT_TON_KG / 1000),
  ozPerTonne: TROY_OUNCE_G,
};

/** Converts a grade between g/t, ppm, mg/kg, troy oz per short ton and troy oz per tonne. */
export function convertGrade(value: number, from: GradeUnit, to: GradeUnit): Result<number> {
  const errors: EngineError[] = [];
  const invalid = checkNumber('value', value, 'non-negative');
  if (invalid) {
    errors.push(invalid);
  }
  for (const [field, unit] of [['from', from], ['to', to]] as const) {
    if (!(unit in GRADE_UNIT_IN_GPT)) {
      errors.push(engineError('unknown-value', field, `${String(unit)} is not a grade unit`));
    }
  }
  if (errors.length > 0) {
    return fail(...errors);
  }
  return ok((value * GRADE_UNIT_IN_GPT[from]) / GRADE_UNIT_IN_GPT[to]);
}

/** Converts grams of gold to troy ounces. */
export function gramsToTroyOunces(massG: number): Result<number> {
  const invalid = checkNumber('massG', massG, 'non-negative');
  return invalid ? fail(invalid) : ok(massG / TROY_OUNCE_G);
}

/** Converts troy ounces of gold to grams. */
export function troyOuncesToGrams(troyOunces: number): Result<number> {
  const invalid = checkNumber('troyOunces', troyOunces, 'non-negative');
  return invalid ? fail(invalid) : ok(troyOunces * TROY_OUNCE_G);
}
