/**
 * The estimate of one pile (DESIGN §6 `estimate`), composed from the topic modules so that the field
 * app and the server give the same answer: footprint → volume → dry tonnes; sample grades (assay,
 * else calibrated pan, else raw pan) → grade statistics → contained gold. Blanks and reference
 * standards are quality-control samples and never count towards a pile's grade.
 */
import { CalibrationFit, GradeSource, SampleGradeInput, bestSampleGrades } from './calibration';
import { LonLat, measureFootprint } from './footprint';
import { GradeStatsOptions, gradeStats } from './gradeStats';
import { EngineWarning, Result, engineError, fail, ok } from './result';
import { MATERIAL_DEFAULTS, Material, dryTonnes, sackDryTonnes } from './tonnage';
import { ShapeModel, SpotHeight, pileVolume } from './volume';

/** The pile fields the estimate uses (DESIGN §6 names). */
export interface PileInput {
  readonly material: Material;
  readonly footprint?: unknown;
  readonly heightM?: number;
  readonly shapeModel: ShapeModel;
  readonly angleOfReposeDeg?: number | null;
  readonly bulkDensityTPerM3?: number | null;
  readonly moisturePct?: number | null;
  readonly spotHeights?: readonly SpotHeight[];
  readonly sackCount?: number;
  readonly sackMassKg?: number;
}

/** A sample of the pile with its grade sources. */
export interface EstimateSample extends SampleGradeInput {
  readonly sampleType?: 'routine' | 'duplicate' | 'blank' | 'standard';
}

/** The grade block of an estimate. */
export interface EstimateGrade {
  readonly n: number;
  readonly meanGpt: number;
  readonly medianGpt: number;
  readonly sdGpt: number | null;
  readonly cv: number | null;
  readonly lognormalMeanGpt: number | null;
  readonly ciLowGpt: number | null;
  readonly ciHighGpt: number | null;
  readonly confidenceLevel: number;
  readonly source: GradeSource | 'mixed';
}

/** The estimate of a pile (DESIGN §6). */
export interface PileEstimate {
  readonly areaM2: number | null;
  readonly perimeterM: number | null;
  readonly centroid: LonLat | null;
  readonly volumeM3: number;
  readonly volumeMethod: ShapeModel;
  readonly dryTonnes: number;
  readonly grade: EstimateGrade | null;
  readonly containedAuG: number | null;
  readonly samplesNeeded: number | null;
  readonly warnings: readonly EngineWarning[];
  readonly assumptions: readonly string[];
}

/** Options of the estimate: calibration to apply to pan-only samples and grade-statistics settings. */
export interface EstimateOptions extends GradeStatsOptions {
  readonly calibration?: CalibrationFit;
}

/** Area, volume, dry tonnes, grade statistics and contained gold of a pile from its record and samples. */
export function estimatePile(pile: PileInput, samples: readonly EstimateSample[], options: EstimateOptions = {}): Result<PileEstimate> {
  const defaults = MATERIAL_DEFAULTS[pile?.material];
  if (!defaults) {
    return fail(engineError('unknown-value', 'material', `${String(pile?.material)} is not a material`));
  }
  const assumptions: string[] = [];
  const warnings: EngineWarning[] = [];
  const withDefault = (value: number | null | undefined, fallback: number, label: string): number => {
    if (value === undefined || value === null) {
      assumptions.push(`${label} ${fallback} (default for ${pile.material}: ${defaults.source})`);
      return fallback;
    }
    return value;
  };
  const bulkDensityTPerM3 = withDefault(pile.bulkDensityTPerM3, defaults.bulkDensityTPerM3, 'bulk density (as found) t/m³');
  const moisturePct = withDefault(pile.moisturePct, defaults.moisturePct, 'moisture %');
  const angleOfReposeDeg = pile.shapeModel === 'flat-topped' ? withDefault(pile.angleOfReposeDeg, defaults.angleOfReposeDeg, 'angle of repose °') : undefined;

  const hasFootprint = pile.footprint !== undefined && pile.footprint !== null;
  const footprint = hasFootprint || pile.shapeModel !== 'sacks' ? measureFootprint(pile.footprint) : undefined;
  if (footprint && !footprint.ok) {
    return footprint;
  }
  const volume = pileVolume({ ...pile, angleOfReposeDeg, bulkDensityTPerM3 });
  if (!volume.ok) {
    return volume;
  }
  warnings.push(...volume.value.warnings);
  assumptions.push(`volume by the ${volume.value.method} model`);
  const tonnage =
    pile.shapeModel === 'sacks'
      ? sackDryTonnes({ sackCount: pile.sackCount as number, sackMassKg: pile.sackMassKg as number, moisturePct })
      : dryTonnes({ volumeM3: volume.value.volumeM3, bulkDensityTPerM3, moisturePct, material: pile.material });
  if (!tonnage.ok) {
    return tonnage;
  }
  warnings.push(...tonnage.value.warnings);
  assumptions.push(pile.shapeModel === 'sacks' ? 'dry t = sacks × mass per sack × (1 − moisture)' : 'dry t = volume × bulk density × (1 − moisture)');

  const counted = samples.filter((sample) => sample.sampleType !== 'blank' && sample.sampleType !== 'standard');
  if (counted.length < samples.length) {
    assumptions.push(`${samples.length - counted.length} blank or standard sample(s) left out of the grade`);
  }
  const base = {
    areaM2: footprint?.ok ? footprint.value.areaM2 : null,
    perimeterM: footprint?.ok ? footprint.value.perimeterM : null,
    centroid: footprint?.ok ? footprint.value.centroid : null,
    volumeM3: volume.value.volumeM3,
    volumeMethod: volume.value.method,
    dryTonnes: tonnage.value.dryTonnes,
  };
  if (counted.length === 0) {
    warnings.push({ code: 'no-samples', message: 'No samples yet: the pile has tonnes but no grade.' });
    return ok({ ...base, grade: null, containedAuG: null, samplesNeeded: null, warnings, assumptions });
  }
  const grades = bestSampleGrades(counted, options.calibration);
  if (!grades.ok) {
    return grades;
  }
  const stats = gradeStats(
    grades.value.map((grade) => grade.gradeGpt),
    options,
  );
  if (!stats.ok) {
    return stats;
  }
  const sources = new Set(grades.value.map((grade) => grade.source));
  if (sources.has('pan')) {
    warnings.push({ code: 'uncalibrated-pan', message: 'Some grades are pan estimates with no calibration against assays.' });
  }
  warnings.push(...stats.value.warnings);
  const { n, meanGpt, medianGpt, sdGpt, cv, lognormalMeanGpt, ciLowGpt, ciHighGpt, confidenceLevel } = stats.value;
  assumptions.push(
    'grade: assay where present, else calibrated pan estimate, else pan estimate',
    `contained gold = dry t × mean grade; interval: bootstrap ${Math.round(confidenceLevel * 100)} % of the mean, fixed seed`,
    `samples needed for ±${Math.round(stats.value.targetRelativePrecision * 100)} % at ${Math.round(confidenceLevel * 100)} % confidence`,
  );
  return ok({
    ...base,
    grade: {
      n,
      meanGpt,
      medianGpt,
      sdGpt,
      cv,
      lognormalMeanGpt,
      ciLowGpt,
      ciHighGpt,
      confidenceLevel,
      source: sources.size === 1 ? [...sources][0] : 'mixed',
    },
    containedAuG: tonnage.value.dryTonnes * meanGpt,
    samplesNeeded: stats.value.samplesNeeded,
    warnings,
    assumptions,
  });
}
