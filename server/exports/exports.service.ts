/**
 * `samples.csv`: every live sample of a site with its pile, WGS84 location, type, masses, pan
 * estimate, assay, calibrated grade, the grade used and its source, and QA/QC flags — one file a
 * geologist can open in a spreadsheet (text cells neutralised against formula injection).
 */
import { Op } from 'sequelize';
import { applyCalibration } from '../../shared/engine';
import type { CurrentUser } from '../accounts/current-user';
import { assertCan } from '../accounts/policy';
import { Pile } from '../capture/pile.model';
import { Sample } from '../capture/sample.model';
import { AppError } from '../lib/errors';
import { AssayResult, LabBatch, LabBatchSample } from '../lab/lab.models';
import { calibrationForSite, sampleGradesForPile } from '../lab/assay-grades';
import { siteQaqc } from '../qaqc/qaqc.service';
import { Site } from '../sites/site.model';
import { writeCsv } from './csv';

/** The columns of samples.csv, in order (README "Samples export"). */
export const SAMPLE_EXPORT_COLUMNS = [
  'sample code', 'site', 'pile', 'pile material', 'sample type', 'duplicate of', 'standard', 'lat', 'lon', 'gps accuracy m',
  'collected at', 'wet mass kg', 'moisture %', 'increments', 'pan estimate g/t', 'Au g/t', 'below detection', 'detection limit g/t',
  'above range', 'lab batch', 'calibrated grade g/t', 'grade used g/t', 'grade source', 'QA/QC flags',
] as const;

/** Builds samples.csv for a site named by id or code. */
export async function samplesCsv(user: CurrentUser, siteKey: string): Promise<{ fileName: string; csv: string }> {
  const site = await Site.findOne({ where: { organizationId: user.organizationId, ...(/^[0-9a-f-]{36}$/i.test(siteKey) ? { id: siteKey } : { code: siteKey.toUpperCase() }) } });
  if (!site) {
    throw new AppError('not_found', 'No such site');
  }
  assertCan(user, 'site:read', { siteId: site.id });
  const samples = await Sample.findAll({ where: { siteId: site.id, deletedAt: null }, order: [['code', 'ASC']] });
  const piles = await Pile.findAll({ where: { siteId: site.id } });
  const calibration = await calibrationForSite(site.id);
  const grades = new Map((await Promise.all(piles.map((pile) => sampleGradesForPile(pile.id, calibration)))).flat().map((grade) => [grade.sampleId, grade]));
  const assays = await AssayResult.findAll({ where: { sampleId: { [Op.in]: samples.map((sample) => sample.id) }, supersededAt: null }, order: [['createdAt', 'ASC']] });
  const items = await LabBatchSample.findAll({ where: { id: { [Op.in]: assays.map((assay) => assay.batchSampleId) } } });
  const batches = await LabBatch.findAll({ where: { siteId: site.id } });
  const qaqc = await siteQaqc(site.id);
  const flagsBySample = new Map<string, string[]>();
  const allItems = await LabBatchSample.findAll({ where: { batchId: { [Op.in]: batches.map((batch) => batch.id) } } });
  const flag = (itemId: string, text: string) => {
    const sampleId = allItems.find((item) => item.id === itemId)?.sampleId;
    if (sampleId) flagsBySample.set(sampleId, [...(flagsBySample.get(sampleId) ?? []), text]);
  };
  qaqc.blanks.filter((entry) => entry.verdict === 'fail' || entry.verdict === 'warn').forEach((entry) => flag(entry.itemId, `blank ${entry.verdict}`));
  qaqc.standards.filter((entry) => entry.verdict === 'fail' || entry.verdict === 'warn').forEach((entry) => flag(entry.itemId, `standard ${entry.verdict}`));
  qaqc.duplicates.filter((entry) => entry.verdict === 'fail').forEach((entry) => { flag(entry.itemId, 'duplicate pair fail'); flag(entry.originalItemId, 'duplicate pair fail'); });
  const flaggedBatches = new Map(qaqc.batches.filter((entry) => entry.verdict === 'fail' || entry.verdict === 'warn').map((entry) => [entry.batchId, entry.verdict]));

  const rows = samples.map((sample) => {
    const pile = piles.find((candidate) => candidate.id === sample.pileId);
    const ownAssays = assays.filter((assay) => assay.sampleId === sample.id && !items.find((item) => item.id === assay.batchSampleId)?.isInserted);
    const assay = ownAssays[ownAssays.length - 1];
    const batch = assay ? batches.find((candidate) => candidate.id === assay.batchId) : undefined;
    const grade = grades.get(sample.id);
    const calibrated = calibration.fit && grade?.panGpt != null ? applyCalibration(calibration.fit, grade.panGpt) : null;
    const flags = [...(flagsBySample.get(sample.id) ?? [])];
    if (batch && flaggedBatches.has(batch.id)) flags.push(`batch ${batch.code} QA/QC ${flaggedBatches.get(batch.id)}`);
    const [lon, lat] = sample.location?.coordinates ?? [null, null];
    return [
      sample.code, site.code, pile?.code ?? null, pile?.material ?? null, sample.sampleType,
      sample.duplicateOfId ? samples.find((candidate) => candidate.id === sample.duplicateOfId)?.code ?? sample.duplicateOfId : null,
      sample.standardId, lat ?? null, lon ?? null, sample.gpsAccuracyM, sample.collectedAt.toISOString(), sample.wetMassKg, sample.moisturePct,
      sample.increments, grade?.panGpt ?? null, assay ? assay.valueGpt : null, assay ? assay.isBelowDetection : null,
      assay?.detectionLimitGpt ?? null, assay ? assay.isAboveRange : null, batch?.code ?? null,
      calibrated?.ok ? calibrated.value.gradeGpt : null, grade?.gradeGpt ?? null, grade?.source ?? null, flags.join('; ') || null,
    ];
  });
  return { fileName: `${site.code}-samples.csv`, csv: writeCsv(SAMPLE_EXPORT_COLUMNS, rows) };
}
