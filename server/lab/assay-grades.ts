/**
 * The lab loop's answer to "what grade does this sample have, and where from?", for the review
 * desk (pile estimates, heat map) and the shortlist to call.
 *
 * - A sample's assay is its current (not superseded) result from a batch item that stands for the
 *   sample itself (a split duplicate inserted in the lab batch is QA/QC only and never the grade).
 *   Below-detection results count at half the detection limit (the engine's stated convention).
 * - Its pan estimate is its latest live pan test through the engine's `panTestGrade`, with the
 *   sample's moisture as the moisture of the panned material (as the capture form does).
 * - The site's calibration is the engine's `fitCalibration` over the routine samples holding both;
 *   it is used on samples without an assay only when a geologist has switched it on for the site
 *   (`Calibration` view) and the fit was not refused (fewer than 10 pairs, no variation).
 */
import { Op } from 'sequelize';
import {
  bestSampleGrades, fitCalibration, panTestGrade, valueForStatistics,
  type CalibrationFit, type EngineError, type EngineWarning, type GradeSource,
} from '../../shared/engine';
import { PanTest } from '../capture/pan-test.model';
import { Sample } from '../capture/sample.model';
import { AssayResult, LabBatchSample, SiteCalibration } from './lab.models';

/** One sample with both a pan estimate and an assay, as the calibration sees it. */
export interface CalibrationPoint {
  readonly sampleId: string;
  readonly code: string;
  readonly panGpt: number;
  readonly assayGpt: number;
}

/** A site's calibration: the fitted line (or why there is none) and whether it is applied. */
export interface SiteCalibrationView {
  readonly siteId: string;
  /** True when a geologist switched it on; grades use it only when `fit` is not null too. */
  readonly isApplied: boolean;
  readonly fit: CalibrationFit | null;
  /** Why no line was fitted (e.g. fewer than 10 pairs); empty when `fit` is set. */
  readonly refusals: readonly EngineError[];
  readonly points: readonly CalibrationPoint[];
}

/** The grade one sample contributes, with its source and the inputs behind it. */
export interface SampleGradeEntry {
  readonly sampleId: string;
  readonly code: string;
  readonly sampleType: Sample['sampleType'];
  /** null when the sample has neither an assay nor a usable pan test. */
  readonly gradeGpt: number | null;
  readonly source: GradeSource | null;
  readonly assayGpt: number | null;
  readonly isBelowDetection: boolean;
  readonly panGpt: number | null;
  readonly warnings: readonly EngineWarning[];
}

/** Current assays (g/t, for statistics) of these samples, from items that stand for the sample itself. */
export async function currentAssaysBySample(sampleIds: readonly string[]): Promise<Map<string, { valueGpt: number; isBelowDetection: boolean; detectionLimitGpt: number | null; isAboveRange: boolean }>> {
  const assays = new Map<string, { valueGpt: number; isBelowDetection: boolean; detectionLimitGpt: number | null; isAboveRange: boolean }>();
  if (sampleIds.length === 0) {
    return assays;
  }
  const rows = await AssayResult.findAll({ where: { sampleId: { [Op.in]: [...sampleIds] }, supersededAt: null }, order: [['createdAt', 'ASC'], ['id', 'ASC']] });
  const items = await LabBatchSample.findAll({ where: { id: { [Op.in]: rows.map((row) => row.batchSampleId) } } });
  const splitItemIds = new Set(items.filter((item) => item.isInserted).map((item) => item.id));
  for (const row of rows) {
    if (row.sampleId === null || splitItemIds.has(row.batchSampleId)) {
      continue;
    }
    // The latest current result wins when a sample was assayed in more than one batch.
    assays.set(row.sampleId, {
      valueGpt: valueForStatistics({ valueGpt: row.valueGpt, isBelowDetection: row.isBelowDetection, isAboveRange: row.isAboveRange, detectionLimitGpt: row.detectionLimitGpt, raw: row.rawValue }),
      isBelowDetection: row.isBelowDetection, detectionLimitGpt: row.detectionLimitGpt, isAboveRange: row.isAboveRange,
    });
  }
  return assays;
}

/** Pan estimates (g/t) of these samples from their latest live pan test. */
export async function panEstimatesBySample(samples: readonly Pick<Sample, 'id' | 'moisturePct'>[]): Promise<Map<string, { panGpt: number | null; warnings: readonly EngineWarning[] }>> {
  const estimates = new Map<string, { panGpt: number | null; warnings: readonly EngineWarning[] }>();
  if (samples.length === 0) {
    return estimates;
  }
  const panTests = await PanTest.findAll({ where: { sampleId: { [Op.in]: samples.map((sample) => sample.id) }, deletedAt: null }, order: [['testedAt', 'DESC'], ['id', 'ASC']] });
  // The first of each sample's tests in that order is its latest; a map keeps this linear (a
  // search of the whole list per sample took 15 s at 20,000 samples).
  const latestBySample = new Map<string, PanTest>();
  for (const panTest of panTests) {
    if (!latestBySample.has(panTest.sampleId)) latestBySample.set(panTest.sampleId, panTest);
  }
  for (const sample of samples) {
    const latest = latestBySample.get(sample.id);
    if (!latest) {
      continue;
    }
    const grade = panTestGrade({
      massPannedKg: latest.massPannedKg, moisturePct: sample.moisturePct ?? 0, colours: latest.colours,
      goldMassMg: latest.goldMassMg ?? undefined, panEfficiency: latest.panEfficiency ?? undefined,
    });
    estimates.set(sample.id, grade.ok
      ? { panGpt: grade.value.gradeGpt, warnings: grade.value.warnings }
      : { panGpt: null, warnings: grade.errors.map((error) => ({ code: error.code, message: error.message })) });
  }
  return estimates;
}

/** The site's pan-vs-assay calibration, fitted on the fly from current data, and whether it is applied. */
export async function calibrationForSite(siteId: string): Promise<SiteCalibrationView> {
  const samples = await Sample.findAll({ where: { siteId, deletedAt: null, sampleType: 'routine' }, order: [['code', 'ASC']] });
  const [assays, pans, setting] = await Promise.all([
    currentAssaysBySample(samples.map((sample) => sample.id)),
    panEstimatesBySample(samples),
    SiteCalibration.findByPk(siteId),
  ]);
  const points: CalibrationPoint[] = [];
  for (const sample of samples) {
    const assay = assays.get(sample.id);
    const panGpt = pans.get(sample.id)?.panGpt;
    // Above-range results are a floor, not a value: they would bend the line.
    if (assay && !assay.isAboveRange && panGpt !== undefined && panGpt !== null) {
      points.push({ sampleId: sample.id, code: sample.code, panGpt, assayGpt: assay.valueGpt });
    }
  }
  const fitted = fitCalibration(points);
  return {
    siteId,
    isApplied: setting?.isApplied ?? false,
    fit: fitted.ok ? fitted.value : null,
    refusals: fitted.ok ? [] : fitted.errors,
    points,
  };
}

/**
 * The grade of every live sample of a pile: assay where present, else the calibrated pan
 * estimate (when the site's calibration is applied and fitted), else the pan estimate, each with
 * its source tag. Blanks and standards are listed with their values but carry no pile grade
 * meaning; callers filter on `sampleType`. A caller grading many piles of one site passes the
 * site's calibration once instead of having it fitted again for every pile.
 */
export async function sampleGradesForPile(pileId: string, siteCalibration?: SiteCalibrationView): Promise<SampleGradeEntry[]> {
  const samples = await Sample.findAll({ where: { pileId, deletedAt: null }, order: [['code', 'ASC']] });
  if (samples.length === 0) {
    return [];
  }
  const calibration = siteCalibration?.siteId === samples[0].siteId ? siteCalibration : await calibrationForSite(samples[0].siteId);
  const fit = calibration.isApplied && calibration.fit ? calibration.fit : undefined;
  const [assays, pans] = await Promise.all([currentAssaysBySample(samples.map((sample) => sample.id)), panEstimatesBySample(samples)]);
  return samples.map((sample) => {
    const assay = assays.get(sample.id);
    const pan = pans.get(sample.id);
    const base = {
      sampleId: sample.id, code: sample.code, sampleType: sample.sampleType,
      assayGpt: assay?.valueGpt ?? null, isBelowDetection: assay?.isBelowDetection ?? false, panGpt: pan?.panGpt ?? null,
    };
    const graded = bestSampleGrades([{ sampleId: sample.id, assayGpt: base.assayGpt, panGpt: base.panGpt }], fit);
    const [grade] = graded.ok ? graded.value : [];
    if (!grade) {
      return { ...base, gradeGpt: null, source: null, warnings: pan?.warnings ?? [] };
    }
    return { ...base, gradeGpt: grade.gradeGpt, source: grade.source, warnings: [...grade.warnings, ...(grade.source === 'assay' ? [] : pan?.warnings ?? [])] };
  });
}
