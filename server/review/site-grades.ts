/**
 * Every sample grade of a site in one pass: the samples and pan estimates from the site's table
 * (kept per data revision, `site-samples.ts`), the current assays and the calibration switch read
 * fresh from the lab loop's tables on every call. The answers are the lab loop's, sample for
 * sample (`sampleGradesForPile`, `calibrationForSite` in server/lab/assay-grades.ts): assay where
 * there is one, else the calibrated pan estimate when the site's calibration is on and fitted,
 * else the pan estimate. The tests hold the two side by side.
 */
import { createHash } from 'node:crypto';
import { Op } from 'sequelize';
import { bestSampleGrades, fitCalibration, type CalibrationFit } from '../../shared/engine';
import type { SampleData } from '../../shared/sync/protocol';
import type { RecordView } from '../capture/capture.repository';
import { RevisionCache, perDatabase } from '../capture/data-revision';
import { currentAssaysBySample, type CalibrationPoint } from '../lab/assay-grades';
import { LabBatch, LabBatchSample, SiteCalibration } from '../lab/lab.models';
import type { SampleGradeView } from './sample-grades';
import { siteSampleTable, type SiteSampleTable } from './site-samples';

/** The grades of all live samples of a site, with the calibration applied to pan-only samples (if any). */
export class SiteGrades {
  private readonly derived = new Map<string, unknown>();

  constructor(
    readonly table: SiteSampleTable,
    readonly grades: ReadonlyMap<string, SampleGradeView>,
    /** The fitted calibration when it is switched on for the site and could be fitted, else undefined. */
    readonly calibration: CalibrationFit | undefined,
  ) {}

  /** Something worked out from these grades alone, once (e.g. each pile's samples for the estimate). */
  derive<T>(name: string, make: (grades: SiteGrades) => T): T {
    if (!this.derived.has(name)) {
      this.derived.set(name, make(this));
    }
    return this.derived.get(name) as T;
  }
}

/**
 * Grades kept per site while nothing they come from changes: the sample table's revision, the
 * calibration switch and every current assay of the site are the key, so an import, a superseded
 * result or the switch flipped gives a new key and new grades.
 */
const kept = perDatabase(() => new RevisionCache<SiteGrades>(4));

/**
 * The current assays of the site's samples. A batch holds samples of its own site only (the lab
 * loop refuses others), so the samples that can have an assay are those in the site's batches:
 * usually a small part of the site, read through the lab loop's own `currentAssaysBySample`.
 */
async function siteAssays(siteId: string) {
  const batchIds = (await LabBatch.findAll({ attributes: ['id'], where: { siteId }, raw: true })).map((batch) => batch.id);
  if (batchIds.length === 0) {
    return currentAssaysBySample([]);
  }
  const items = await LabBatchSample.findAll({ attributes: ['sampleId'], where: { batchId: { [Op.in]: batchIds }, sampleId: { [Op.ne]: null } }, raw: true });
  return currentAssaysBySample([...new Set(items.map((item) => item.sampleId as string))]);
}

/** Grades of every live sample of the site, and the calibration in force. */
export async function siteGrades(siteId: string): Promise<SiteGrades> {
  const [table, assays, setting] = await Promise.all([siteSampleTable(siteId), siteAssays(siteId), SiteCalibration.findByPk(siteId)]);
  const isApplied = setting?.isApplied ?? false;
  const version = createHash('sha1').update(JSON.stringify([table.revision, isApplied, [...assays]])).digest('base64');
  return kept().get(siteId, version, async () => gradeSite(table, assays, isApplied));
}

function gradeSite(table: SiteSampleTable, assays: Awaited<ReturnType<typeof siteAssays>>, isApplied: boolean): SiteGrades {
  // The calibration over the routine samples holding both, by code, as `calibrationForSite` fits it.
  const points: CalibrationPoint[] = [];
  for (const sample of table.byCode) {
    const assay = assays.get(sample.id);
    const panGpt = table.pans.get(sample.id)?.panGpt;
    // Above-range results are a floor, not a value: they would bend the line.
    if (sample.sampleType === 'routine' && assay && !assay.isAboveRange && panGpt !== undefined && panGpt !== null) {
      points.push({ sampleId: sample.id, code: sample.code, panGpt, assayGpt: assay.valueGpt });
    }
  }
  const fitted = fitCalibration(points);
  const calibration = isApplied && fitted.ok ? fitted.value : undefined;

  const grades = new Map<string, SampleGradeView>();
  for (const sample of table.newestFirst) {
    const assay = assays.get(sample.id);
    const pan = table.pans.get(sample.id);
    const base = { assayGpt: assay?.valueGpt ?? null, isBelowDetection: assay?.isBelowDetection ?? false, panGpt: pan?.panGpt ?? null };
    const graded = bestSampleGrades([{ sampleId: sample.id, assayGpt: base.assayGpt, panGpt: base.panGpt }], calibration);
    const grade = graded.ok ? graded.value[0] : undefined;
    grades.set(sample.id, grade
      ? { ...base, gradeGpt: grade.gradeGpt, gradeSource: grade.source, warnings: [...grade.warnings, ...(grade.source === 'assay' ? [] : pan?.warnings ?? [])] }
      : { ...base, gradeGpt: null, gradeSource: null, warnings: pan?.warnings ?? [] });
  }
  return new SiteGrades(table, grades, calibration);
}

/** Samples grouped by pile, each pile's in the order given. */
export function samplesByPile(samples: readonly RecordView<SampleData>[]): Map<string, RecordView<SampleData>[]> {
  const byPile = new Map<string, RecordView<SampleData>[]>();
  for (const sample of samples) {
    const list = byPile.get(sample.pileId);
    if (list) list.push(sample);
    else byPile.set(sample.pileId, [sample]);
  }
  return byPile;
}
