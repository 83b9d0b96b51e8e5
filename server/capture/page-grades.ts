/**
 * The grade of each sample on one page of `GET /api/samples`, worked out for that page alone.
 *
 * The answers are the review desk's (`siteGrades` in server/review/site-grades.ts), sample for
 * sample: the current assay where there is one (the lab loop's `currentAssaysBySample`), else the
 * pan estimate of the latest live pan test through the engine's `panTestGrade`, calibrated by the
 * engine's `bestSampleGrades` when the site's calibration is switched on and `fitCalibration` could
 * fit one over the routine samples holding both. The review desk grades every sample of a site
 * (20,000 at most); a page needs its own few hundred, plus the site's calibration line.
 *
 * The line is kept per site while nothing it is fitted from changes: the data revision (samples and
 * pan tests) and the assay table's count and latest change (imports and superseded results do not
 * move the data revision). The switch is read fresh on every page.
 */
import { fn, col, Op } from 'sequelize';
import { bestSampleGrades, fitCalibration, panTestGrade, type CalibrationFit, type GradeSource } from '../../shared/engine';
import type { PanTestData } from '../../shared/sync/protocol';
import { currentAssaysBySample, type CalibrationPoint } from '../lab/assay-grades';
import { AssayResult, LabBatch, LabBatchSample, SiteCalibration } from '../lab/lab.models';
import { RevisionCache, perDatabase } from './data-revision';
import { PanTest } from './pan-test.model';
import { Sample } from './sample.model';

/** What a listed sample shows of its grade: null grade and source when it has neither assay nor usable pan test. */
export interface PageGrade {
  readonly gradeGpt: number | null;
  readonly gradeSource: GradeSource | null;
}

/** The fields of a listed sample the grade needs. */
export interface GradedSample {
  readonly id: string;
  readonly siteId: string;
  readonly moisturePct: number | null;
}

/** The fitted line of a site (undefined when it cannot be fitted), kept per site and version. */
const fits = perDatabase(() => new RevisionCache<CalibrationFit | undefined>(16));

/**
 * Pan estimates (g/t, null when the test could not be read) of these samples from their latest
 * live pan test (testedAt descending, then id), with the sample's moisture as the moisture of the
 * panned material, as the lab loop's `panEstimatesBySample` works them; rows read raw.
 */
async function panGrades(samples: readonly Pick<GradedSample, 'id' | 'moisturePct'>[]): Promise<Map<string, number | null>> {
  const grades = new Map<string, number | null>();
  if (samples.length === 0) {
    return grades;
  }
  const moisture = new Map(samples.map((sample) => [sample.id, sample.moisturePct]));
  const rows = (await PanTest.findAll({
    attributes: ['sampleId', 'massPannedKg', 'colours', 'goldMassMg', 'panEfficiency'],
    where: { sampleId: { [Op.in]: [...moisture.keys()] }, deletedAt: null },
    order: [['testedAt', 'DESC'], ['id', 'ASC']],
    raw: true,
  })) as unknown as Record<string, unknown>[];
  for (const row of rows) {
    const sampleId = row['sampleId'] as string;
    if (grades.has(sampleId)) {
      continue;
    }
    const colours = (typeof row['colours'] === 'string' ? JSON.parse(row['colours']) : row['colours']) as PanTestData['colours'];
    const grade = panTestGrade({
      massPannedKg: row['massPannedKg'] as number, moisturePct: moisture.get(sampleId) ?? 0, colours,
      goldMassMg: (row['goldMassMg'] as number | null) ?? undefined, panEfficiency: (row['panEfficiency'] as number | null) ?? undefined,
    });
    grades.set(sampleId, grade.ok ? grade.value.gradeGpt : null);
  }
  return grades;
}

/**
 * The lab loop's current assays of these samples (`currentAssaysBySample`), asked only for those
 * holding any current result: most samples of a page were never assayed, and one raw read of ids
 * finds that out for the whole page where the lab loop's read takes two.
 */
async function assaysOf(sampleIds: readonly string[]): ReturnType<typeof currentAssaysBySample> {
  const held = (await AssayResult.findAll({ attributes: ['sampleId'], where: { sampleId: { [Op.in]: [...sampleIds] }, supersededAt: null }, raw: true })) as unknown as { sampleId: string }[];
  return currentAssaysBySample([...new Set(held.map((row) => row.sampleId))]);
}

/** What the fitted lines are made from besides the data revision: every import or superseded result changes it. */
async function assayVersion(): Promise<string> {
  const row = (await AssayResult.findOne({
    attributes: [[fn('COUNT', col('id')), 'count'], [fn('MAX', col('updatedAt')), 'latest']],
    raw: true,
  })) as unknown as { count: number | string; latest: unknown } | null;
  const latest = row?.latest instanceof Date ? row.latest.toISOString() : String(row?.latest ?? '');
  return `${Number(row?.count ?? 0)}:${latest}`;
}

/**
 * The site's calibration line over its routine live samples holding both a current assay (not
 * above range) and a pan estimate, in the database's order of codes, as `gradeSite` fits it.
 * Only samples of the site's lab batches can hold an assay, so only those are read.
 */
async function fitForSite(siteId: string): Promise<CalibrationFit | undefined> {
  const batchIds = (await LabBatch.findAll({ attributes: ['id'], where: { siteId }, raw: true })).map((batch) => batch.id);
  if (batchIds.length === 0) {
    return undefined;
  }
  const items = await LabBatchSample.findAll({ attributes: ['sampleId'], where: { batchId: { [Op.in]: batchIds }, sampleId: { [Op.ne]: null } }, raw: true });
  const assays = await currentAssaysBySample([...new Set(items.map((item) => item.sampleId as string))]);
  if (assays.size === 0) {
    return undefined;
  }
  const samples = (await Sample.findAll({
    attributes: ['id', 'code', 'moisturePct'],
    where: { id: { [Op.in]: [...assays.keys()] }, siteId, deletedAt: null, sampleType: 'routine' },
    order: [['code', 'ASC']],
    raw: true,
  })) as unknown as { id: string; code: string; moisturePct: number | null }[];
  const pans = await panGrades(samples);
  const points: CalibrationPoint[] = [];
  for (const sample of samples) {
    const assay = assays.get(sample.id);
    const panGpt = pans.get(sample.id);
    // Above-range results are a floor, not a value: they would bend the line.
    if (assay && !assay.isAboveRange && panGpt !== undefined && panGpt !== null) {
      points.push({ sampleId: sample.id, code: sample.code, panGpt, assayGpt: assay.valueGpt });
    }
  }
  const fitted = fitCalibration(points);
  return fitted.ok ? fitted.value : undefined;
}

/**
 * The calibration in force for each of these sites: the fitted line where a geologist switched it
 * on and it could be fitted, else undefined.
 */
async function calibrationsOf(siteIds: readonly string[], dataRevision: number): Promise<Map<string, CalibrationFit | undefined>> {
  const calibrations = new Map<string, CalibrationFit | undefined>();
  if (siteIds.length === 0) {
    return calibrations;
  }
  const switchedOn = (await SiteCalibration.findAll({ attributes: ['siteId'], where: { siteId: { [Op.in]: [...siteIds] }, isApplied: true }, raw: true })).map((setting) => setting.siteId);
  if (switchedOn.length === 0) {
    return calibrations;
  }
  const version = `${dataRevision}:${await assayVersion()}`;
  await Promise.all(switchedOn.map(async (siteId) => calibrations.set(siteId, await fits().get(siteId, version, () => fitForSite(siteId)))));
  return calibrations;
}

/** Each sample's grade and its source, by sample id; `dataRevision` was read before the samples were. */
export async function gradesOfPage(samples: readonly GradedSample[], dataRevision: number): Promise<Map<string, PageGrade>> {
  const grades = new Map<string, PageGrade>();
  if (samples.length === 0) {
    return grades;
  }
  const [assays, pans] = await Promise.all([assaysOf(samples.map((sample) => sample.id)), panGrades(samples)]);
  // The line matters only to samples graded from a pan test alone.
  const panOnlySites = [...new Set(samples.filter((sample) => !assays.has(sample.id) && pans.get(sample.id) != null).map((sample) => sample.siteId))];
  const calibrations = await calibrationsOf(panOnlySites, dataRevision);
  for (const sample of samples) {
    const graded = bestSampleGrades([{ sampleId: sample.id, assayGpt: assays.get(sample.id)?.valueGpt ?? null, panGpt: pans.get(sample.id) ?? null }], calibrations.get(sample.siteId));
    const grade = graded.ok ? graded.value[0] : undefined;
    grades.set(sample.id, grade ? { gradeGpt: grade.gradeGpt, gradeSource: grade.source } : { gradeGpt: null, gradeSource: null });
  }
  return grades;
}
