/**
 * The site's QA/QC and calibration views (DESIGN §7): every batch's blanks, standards and
 * duplicates checked in batch order, the batches flagged, and the pan-vs-assay calibration with
 * the switch that applies it to samples without an assay.
 */
import { Op } from 'sequelize';
import type { CurrentUser } from '../accounts/current-user';
import { assertCan } from '../accounts/policy';
import type { Database } from '../db/database';
import { AssayResult, LabBatch, LabBatchSample, ReferenceStandard, SiteCalibration } from '../lab/lab.models';
import { calibrationForSite, type SiteCalibrationView } from '../lab/assay-grades';
import { qcItemsOf } from '../lab/lab.service';
import { checkBatches, type QaqcReport } from './batch-qaqc';

/** The QA/QC of every batch of a site, in the order the batches were made. */
export async function siteQaqc(siteId: string): Promise<QaqcReport & { standardsOnRecord: { code: string; expectedGpt: number; sdGpt: number }[] }> {
  const batches = await LabBatch.findAll({ where: { siteId }, order: [['createdAt', 'ASC'], ['code', 'ASC']] });
  const items = await LabBatchSample.findAll({ where: { batchId: { [Op.in]: batches.map((batch) => batch.id) } }, order: [['position', 'ASC']] });
  const assays = await AssayResult.findAll({ where: { batchId: { [Op.in]: batches.map((batch) => batch.id) }, supersededAt: null } });
  const standards = batches.length > 0 ? await ReferenceStandard.findAll({ where: { organizationId: batches[0]?.organizationId ?? '' } }) : [];
  const qcItems = batches.flatMap((batch) => qcItemsOf(batch, items.filter((item) => item.batchId === batch.id)));
  const values = new Map(assays.map((row) => [row.batchSampleId, { valueGpt: row.valueGpt, isBelowDetection: row.isBelowDetection, isAboveRange: row.isAboveRange, detectionLimitGpt: row.detectionLimitGpt, raw: row.rawValue }]));
  return {
    ...checkBatches(qcItems, values, standards),
    standardsOnRecord: standards.map((standard) => ({ code: standard.code, expectedGpt: standard.expectedGpt, sdGpt: standard.sdGpt })),
  };
}

/** Reading QA/QC and calibration, and switching the calibration on or off. */
export class QaqcService {
  constructor(private readonly database: Database) {}

  siteQaqc(user: CurrentUser, siteId: string) {
    assertCan(user, 'lab:manage', { siteId });
    return siteQaqc(siteId);
  }

  async calibration(user: CurrentUser, siteId: string): Promise<SiteCalibrationView> {
    assertCan(user, 'calibration:manage', { siteId });
    return calibrationForSite(siteId);
  }

  async setCalibrationApplied(user: CurrentUser, siteId: string, isApplied: boolean): Promise<SiteCalibrationView> {
    assertCan(user, 'calibration:manage', { siteId });
    await this.database.transaction(async (transaction) => {
      const existing = await SiteCalibration.findByPk(siteId, { transaction });
      if (existing) {
        await existing.update({ isApplied, changedById: user.id }, { transaction });
      } else {
        await SiteCalibration.create({ siteId, isApplied, changedById: user.id }, { transaction });
      }
    });
    return calibrationForSite(siteId);
  }
}
