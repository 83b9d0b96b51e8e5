/**
 * Pan-test grade. Gold seen in the pan is either weighed (mg) or counted as colours per size class.
 * A colour is modelled as a flat disc: mass = ρ_Au · (π/4)·d² · (d / r), with d the nominal diameter
 * of its size class (geometric mean of the class's sieve bounds), r the diameter-to-thickness ratio
 * of the flake (5–10 is common practice, no source; a parameter, with the grade at both ends shown)
 * and ρ_Au = 19.3 g/cm³. Grade = gold mass / (dry mass panned × pan efficiency); 1 mg/kg = 1 g/t.
 */
import { EngineError, EngineWarning, Result, checkNumber, checkNumbers, engineError, fail, ok } from './result';
import { GOLD_DENSITY_G_PER_CM3 } from './units';

/** Size classes of colours, bounded by ASTM E11 sieves (aperture in µm). */
export type ColourSizeClass = 'very-coarse' | 'coarse' | 'medium' | 'fine' | 'very-fine';

/** Sieve bounds of each size class, µm, from ASTM E11 (No. 4/10/20/40/100/200). */
export const COLOUR_SIZE_CLASSES: Readonly<Record<ColourSizeClass, { readonly minUm: number; readonly maxUm: number; readonly sieves: string }>> = {
  'very-coarse': { minUm: 2000, maxUm: 4750, sieves: '−4 +10 mesh' },
  coarse: { minUm: 850, maxUm: 2000, sieves: '−10 +20 mesh' },
  medium: { minUm: 425, maxUm: 850, sieves: '−20 +40 mesh' },
  fine: { minUm: 150, maxUm: 425, sieves: '−40 +100 mesh' },
  'very-fine': { minUm: 75, maxUm: 150, sieves: '−100 +200 mesh' },
};

/** Default flake diameter-to-thickness ratio (common practice, no source). */
export const DEFAULT_FLAKE_RATIO = 7;
/** Default fraction of the gold in the sample that panning catches (common practice, no source). */
export const DEFAULT_PAN_EFFICIENCY = 0.8;

/** A count of colours in one size class (DESIGN §6 `colours`). */
export interface ColourCount {
  readonly sizeClass: ColourSizeClass;
  readonly count: number;
}

/** A pan test as recorded (DESIGN §6 names). */
export interface PanTestInput {
  readonly massPannedKg: number;
  /** Moisture of the panned material, % of wet mass; 0 when it was weighed dry. */
  readonly moisturePct?: number;
  readonly colours?: readonly ColourCount[];
  readonly goldMassMg?: number;
  readonly panEfficiency?: number;
  readonly flakeRatio?: number;
}

/** One size class of the breakdown. */
export interface ColourClassBreakdown {
  readonly sizeClass: ColourSizeClass;
  readonly count: number;
  readonly nominalDiameterUm: number;
  readonly thicknessUm: number;
  readonly colourMassMg: number;
  readonly goldMassMg: number;
}

/** A pan-test grade with every step that led to it. */
export interface PanTestGrade {
  readonly gradeGpt: number;
  readonly method: 'weighed' | 'colours';
  readonly goldMassMg: number;
  readonly dryMassPannedKg: number;
  readonly panEfficiency: number;
  readonly flakeRatio?: number;
  readonly classes: readonly ColourClassBreakdown[];
  /** Grade at the ends of the usual flake-ratio range, for colour counts. */
  readonly flakeRatioSensitivity: readonly { readonly flakeRatio: number; readonly gradeGpt: number }[];
  readonly assumptions: readonly string[];
  readonly warnings: readonly EngineWarning[];
}

/** Nominal diameter of a size class, µm: geometric mean of its bounds, as sieve classes are log-spaced. */
export function nominalDiameterUm(sizeClass: ColourSizeClass): number {
  const { minUm, maxUm } = COLOUR_SIZE_CLASSES[sizeClass];
  return Math.sqrt(minUm * maxUm);
}

/** Mass of one colour in mg: a gold disc of the given diameter (µm) and diameter-to-thickness ratio. */
export function colourMassMg(diameterUm: number, flakeRatio: number): number {
  const diameterCm = diameterUm / 1e4;
  const volumeCm3 = (Math.PI / 4) * diameterCm * diameterCm * (diameterCm / flakeRatio);
  return volumeCm3 * GOLD_DENSITY_G_PER_CM3 * 1000;
}

function goldFromColours(colours: readonly ColourCount[], flakeRatio: number): ColourClassBreakdown[] {
  return colours.map(({ sizeClass, count }) => {
    const diameter = nominalDiameterUm(sizeClass);
    const mass = colourMassMg(diameter, flakeRatio);
    return { sizeClass, count, nominalDiameterUm: diameter, thicknessUm: diameter / flakeRatio, colourMassMg: mass, goldMassMg: mass * count };
  });
}

/** Grade in g/t of a pan test, from weighed gold or from colour counts, with the breakdown. */
export function panTestGrade(input: PanTestInput): Result<PanTestGrade> {
  const panEfficiency = input.panEfficiency ?? DEFAULT_PAN_EFFICIENCY;
  const flakeRatio = input.flakeRatio ?? DEFAULT_FLAKE_RATIO;
  const moisturePct = input.moisturePct ?? 0;
  const errors: EngineError[] = checkNumbers([
    ['massPannedKg', input.massPannedKg, 'positive'],
    ['moisturePct', moisturePct, 'percent-below-100'],
    ['panEfficiency', panEfficiency, 'open-fraction'],
    ['flakeRatio', flakeRatio, 'positive'],
  ]);
  const hasWeighed = input.goldMassMg !== undefined && input.goldMassMg !== null;
  const hasColours = Array.isArray(input.colours) && input.colours.length > 0;
  if (hasWeighed) {
    const invalid = checkNumber('goldMassMg', input.goldMassMg, 'non-negative');
    if (invalid) errors.push(invalid);
  }
  (input.colours ?? []).forEach((colour, index) => {
    if (!colour || !(colour.sizeClass in COLOUR_SIZE_CLASSES)) {
      errors.push(engineError('unknown-value', `colours[${index}].sizeClass`, `${String(colour?.sizeClass)} is not a colour size class`, { known: Object.keys(COLOUR_SIZE_CLASSES) }));
    }
    const invalid = checkNumber(`colours[${index}].count`, colour?.count, 'non-negative');
    if (invalid) errors.push(invalid);
    else if (!Number.isInteger(colour.count)) errors.push(engineError('out-of-range', `colours[${index}].count`, 'a colour count must be a whole number'));
  });
  if (!hasWeighed && !hasColours) {
    errors.push(engineError('missing', 'goldMassMg', 'a pan test needs weighed gold (mg) or colour counts'));
  }
  if (errors.length > 0) {
    return fail(...errors);
  }
  const dryMassPannedKg = input.massPannedKg * (1 - moisturePct / 100);
  const warnings: EngineWarning[] = [];
  const assumptions = [
    `pan efficiency ${panEfficiency}${input.panEfficiency === undefined ? ' (default, common practice, no source)' : ''}`,
    moisturePct > 0 ? `dry mass = ${input.massPannedKg} kg × (1 − ${moisturePct} %)` : 'mass panned taken as dry',
  ];
  const gradeOf = (goldMg: number): number => goldMg / (dryMassPannedKg * panEfficiency);
  if (hasWeighed) {
    if (hasColours) {
      warnings.push({ code: 'colours-ignored', message: 'Weighed gold was used; the colour counts are kept for the record only.' });
    }
    const goldMassMg = input.goldMassMg as number;
    return ok({
      gradeGpt: gradeOf(goldMassMg),
      method: 'weighed',
      goldMassMg,
      dryMassPannedKg,
      panEfficiency,
      classes: [],
      flakeRatioSensitivity: [],
      assumptions,
      warnings,
    });
  }
  const classes = goldFromColours(input.colours as readonly ColourCount[], flakeRatio);
  const goldMassMg = classes.reduce((sum, row) => sum + row.goldMassMg, 0);
  const totalColours = classes.reduce((sum, row) => sum + row.count, 0);
  // Fewer than about 20 particles leave the estimate within roughly ±50 % at best (Clifton et al. 1969).
  if (totalColours < 20) {
    warnings.push({ code: 'few-colours', message: `Only ${totalColours} colours: the grade is uncertain by ±50 % or more; pan more material.` });
  }
  const sensitivityRatios = [5, 10];
  return ok({
    gradeGpt: gradeOf(goldMassMg),
    method: 'colours',
    goldMassMg,
    dryMassPannedKg,
    panEfficiency,
    flakeRatio,
    classes,
    flakeRatioSensitivity: sensitivityRatios.map((ratio) => ({
      flakeRatio: ratio,
      gradeGpt: gradeOf(goldFromColours(input.colours as readonly ColourCount[], ratio).reduce((sum, row) => sum + row.goldMassMg, 0)),
    })),
    assumptions: [
      ...assumptions,
      `colours are gold discs, diameter-to-thickness ${flakeRatio}${input.flakeRatio === undefined ? ' (default, common practice, no source)' : ''}`,
      `gold density ${GOLD_DENSITY_G_PER_CM3} g/cm³`,
      'nominal diameter = geometric mean of the size class sieve bounds',
    ],
    warnings,
  });
}
