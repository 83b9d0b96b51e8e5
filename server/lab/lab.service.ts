/**
 * The assay-lab loop (DESIGN §2 step 6): a geologist makes a batch of samples with QA/QC items
 * inserted in a seeded random order, sends its submission sheet to the lab by e-mail, and the lab
 * (or the geologist) sends back a results file that is checked row by row before anything is
 * saved. Every write is one `database.transaction`; a results file either saves whole or not at all.
 */
import { createHash, randomUUID } from 'node:crypto';
import { Op, type Transaction } from 'sequelize';
import { planQcInsertion, type AssayValue } from '../../shared/engine';
import type { CurrentUser } from '../accounts/current-user';
import { assertCan, can } from '../accounts/policy';
import { Pile } from '../capture/pile.model';
import { Sample } from '../capture/sample.model';
import type { Database } from '../db/database';
import { writeCsv } from '../exports/csv';
import { AppError } from '../lib/errors';
import type { MailService, SentMail } from '../mail/mail.service';
import { checkBatches, type QaqcReport, type QcItem } from '../qaqc/batch-qaqc';
import { Site } from '../sites/site.model';
import { currentAssaysBySample, panEstimatesBySample } from './assay-grades';
import { LAB_CUSTODY_FIELDS, type CreateBatchInput, type CustodyInput } from './lab-batch-schemas';
import { AssayResult, LabBatch, LabBatchSample, ReferenceStandard, ResultImport, type BatchItemType } from './lab.models';
import { parseResultsFile, type FileProblem, type ParsedResults, type ResultRow, type RowStatus } from './results-csv';

/** The submission sheet's columns, in order (README: "Lab submission CSV"). */
export const SUBMISSION_COLUMNS = ['batch id', 'position', 'sample code', 'type', 'standard', 'material', 'mass kg', 'method', 'charge g', 'detection limit g/t'] as const;

/** What becomes of a row on save. */
export type RowChange = 'new' | 'unchanged' | 'supersedes' | null;

/** The dry-run (or save) report of a results file. */
export interface ImportReport {
  readonly batchId: string;
  readonly batchCode: string;
  readonly fileName: string;
  readonly fileHash: string;
  readonly isDryRun: boolean;
  readonly fileProblems: readonly FileProblem[];
  readonly rows: readonly (Omit<ResultRow, 'value'> & { readonly valueGpt: number | null; readonly isBelowDetection: boolean; readonly isAboveRange: boolean; readonly detectionLimitGpt: number | null; readonly change: RowChange })[];
  readonly notInFile: readonly string[];
  readonly summary: { readonly rows: number; readonly blocking: number; readonly byStatus: Partial<Record<RowStatus, number>>; readonly changed: number };
  readonly canSave: boolean;
  readonly isAlreadyImported: boolean;
  readonly isSaved: boolean;
  readonly importId: string | null;
  readonly qaqc: QaqcReport;
}

/** A batch as the API shows it; lab users see no types or standards of a blind batch. */
export type BatchView = ReturnType<typeof batchSummary> & {
  readonly items: readonly ItemView[];
  readonly imports: readonly { id: string; fileName: string; fileHash: string; rowCount: number; changedCount: number; importedById: string; importedAt: string }[];
  readonly qaqc: QaqcReport | null;
};

interface ItemView {
  readonly id: string;
  readonly position: number;
  readonly labCode: string;
  readonly itemType: BatchItemType | null;
  readonly isInserted: boolean | null;
  readonly sampleId: string | null;
  readonly sampleCode: string | null;
  readonly standardCode: string | null;
  readonly material: string | null;
  readonly massKg: number | null;
  readonly assay: { valueGpt: number; isBelowDetection: boolean; isAboveRange: boolean; detectionLimitGpt: number | null; rawValue: string } | null;
}

function batchSummary(batch: LabBatch, itemCount: number) {
  return {
    id: batch.id, siteId: batch.siteId, code: batch.code, labName: batch.labName, labContactEmail: batch.labContactEmail,
    method: batch.method, chargeMassG: batch.chargeMassG, detectionLimitGpt: batch.detectionLimitGpt, upperLimitGpt: batch.upperLimitGpt,
    isBlind: batch.isBlind, qcPlan: batch.qcPlan, status: batch.status, notes: batch.notes,
    dispatchedBy: batch.dispatchedBy, dispatchedAt: batch.dispatchedAt?.toISOString() ?? null, carrier: batch.carrier,
    sealNumbers: batch.sealNumbers, receivedBy: batch.receivedBy, receivedAt: batch.receivedAt?.toISOString() ?? null,
    conditionOnReceipt: batch.conditionOnReceipt, sentAt: batch.sentAt?.toISOString() ?? null,
    createdById: batch.createdById, createdAt: batch.createdAt.toISOString(), itemCount,
  };
}

function assayValueOf(row: AssayResult): AssayValue {
  return { valueGpt: row.valueGpt, isBelowDetection: row.isBelowDetection, isAboveRange: row.isAboveRange, detectionLimitGpt: row.detectionLimitGpt, raw: row.rawValue };
}

/** Reads the batch's items in dispatch order as QA/QC sees them. */
export function qcItemsOf(batch: LabBatch, items: readonly LabBatchSample[]): QcItem[] {
  return items.map((item) => ({
    id: item.id, batchId: batch.id, batchCode: batch.code, position: item.position, labCode: item.labCode, itemType: item.itemType,
    duplicateOfItemId: item.duplicateOfItemId, standardCode: item.standardCode, detectionLimitGpt: batch.detectionLimitGpt,
  }));
}

/** The lab loop's flows. */
export class LabService {
  constructor(
    private readonly database: Database,
    private readonly mail: MailService,
  ) {}

  /** The reference standards of the user's organisation. */
  async listStandards(user: CurrentUser) {
    if (!can(user, 'lab:manage') && !can(user, 'calibration:manage')) {
      assertCan(user, 'lab:manage');
    }
    const rows = await ReferenceStandard.findAll({ where: { organizationId: user.organizationId }, order: [['code', 'ASC']] });
    return rows.map((row) => ({ id: row.id, code: row.code, expectedGpt: row.expectedGpt, sdGpt: row.sdGpt, description: row.description }));
  }

  /** Samples of a site a geologist may put in a batch, with pile, pan estimate, assay and batches so far. */
  async listCandidates(user: CurrentUser, siteId: string) {
    assertCan(user, 'lab:manage', { siteId });
    const samples = await Sample.findAll({ where: { siteId, deletedAt: null }, order: [['code', 'ASC']] });
    const piles = await Pile.findAll({ where: { id: { [Op.in]: [...new Set(samples.map((sample) => sample.pileId))] } } });
    const [assays, pans, items] = await Promise.all([
      currentAssaysBySample(samples.map((sample) => sample.id)),
      panEstimatesBySample(samples),
      LabBatchSample.findAll({ where: { sampleId: { [Op.in]: samples.map((sample) => sample.id) }, isInserted: false } }),
    ]);
    const batches = await LabBatch.findAll({ where: { id: { [Op.in]: [...new Set(items.map((item) => item.batchId))] } } });
    return samples.map((sample) => {
      const pile = piles.find((candidate) => candidate.id === sample.pileId);
      const inBatches = items.filter((item) => item.sampleId === sample.id).map((item) => batches.find((batch) => batch.id === item.batchId)?.code ?? '');
      return {
        id: sample.id, code: sample.code, sampleType: sample.sampleType, pileId: sample.pileId, pileCode: pile?.code ?? null,
        material: pile?.material ?? null, wetMassKg: sample.wetMassKg, collectedAt: sample.collectedAt.toISOString(),
        panGpt: pans.get(sample.id)?.panGpt ?? null, assayGpt: assays.get(sample.id)?.valueGpt ?? null, batchCodes: inBatches,
      };
    });
  }

  /** Makes a batch: checks the samples, plans the QA/QC insertion from the seed, and stores the items in order. */
  async createBatch(user: CurrentUser, input: CreateBatchInput): Promise<BatchView> {
    assertCan(user, 'lab:manage', { siteId: input.siteId });
    const site = await Site.findOne({ where: { id: input.siteId, organizationId: user.organizationId } });
    if (!site) {
      throw new AppError('not_found', 'No such site');
    }
    const samples = await Sample.findAll({ where: { id: { [Op.in]: input.sampleIds }, deletedAt: null } });
    const problems = input.sampleIds.flatMap((id, index) => {
      const sample = samples.find((candidate) => candidate.id === id);
      if (!sample) return [{ path: `sampleIds.${index}`, message: 'No such sample' }];
      if (sample.siteId !== input.siteId) return [{ path: `sampleIds.${index}`, message: `Sample ${sample.code} belongs to another site` }];
      return [];
    });
    if (new Set(input.sampleIds).size !== input.sampleIds.length) {
      problems.push({ path: 'sampleIds', message: 'A sample can go into a batch only once' });
    }
    const standards = await ReferenceStandard.findAll({ where: { organizationId: user.organizationId } });
    input.standardCodes.forEach((code, index) => {
      if (!standards.some((standard) => standard.code === code)) problems.push({ path: `standardCodes.${index}`, message: `No reference standard "${code}"` });
    });
    if (input.standardEvery > 0 && input.standardCodes.length === 0) {
      problems.push({ path: 'standardCodes', message: 'Choose the reference standards to insert, or set standardEvery to 0' });
    }
    if (problems.length > 0) {
      throw new AppError('validation_failed', 'The batch is not valid', problems);
    }
    // A seed from the clock when none is given; it is stored, so the order can be re-derived.
    const seed = input.seed ?? (Date.now() % 2 ** 31);
    const plan = planQcInsertion({
      sampleIds: input.sampleIds, blankEvery: input.blankEvery, standardEvery: input.standardEvery,
      duplicateEvery: input.duplicateEvery, standardCodes: input.standardCodes, seed,
    });
    if (!plan.ok) {
      throw new AppError('validation_failed', 'The batch is not valid', plan.errors.map((error) => ({ path: error.field, message: error.message })));
    }
    const piles = await Pile.findAll({ where: { id: { [Op.in]: [...new Set(samples.map((sample) => sample.pileId))] } } });
    const materialOf = (sample: Sample) => piles.find((pile) => pile.id === sample.pileId)?.material ?? null;
    const masses = samples.map((sample) => sample.wetMassKg).filter((mass): mass is number => mass !== null).sort((a, b) => a - b);
    // Inserted bags look like the field bags around them (blind): the median mass and the commonest material.
    const typicalMassKg = masses.length > 0 ? (masses[Math.floor(masses.length / 2)] as number) : null;
    const typicalMaterial = mostCommon(samples.map(materialOf));

    const batchId = randomUUID();
    await this.database.transaction(async (transaction) => {
      const count = await LabBatch.count({ where: { siteId: site.id }, transaction });
      const code = `${site.code}-LB${String(count + 1).padStart(3, '0')}`;
      await LabBatch.create({
        id: batchId, organizationId: user.organizationId, siteId: site.id, code, labName: input.labName, labContactEmail: input.labContactEmail,
        method: input.method, chargeMassG: input.chargeMassG, detectionLimitGpt: input.detectionLimitGpt, upperLimitGpt: input.upperLimitGpt,
        isBlind: input.isBlind, qcPlan: { blankEvery: input.blankEvery, standardEvery: input.standardEvery, duplicateEvery: input.duplicateEvery, standardCodes: input.standardCodes, seed },
        status: 'draft', notes: input.notes, dispatchedBy: null, dispatchedAt: null, carrier: null, sealNumbers: null,
        receivedBy: null, receivedAt: null, conditionOnReceipt: null, sentAt: null, createdById: user.id,
      }, { transaction });
      const itemIdOfSample = new Map<string, string>();
      const rows = plan.value.map((planned, index) => {
        const id = randomUUID();
        const labCode = `${code}-${String(index + 1).padStart(3, '0')}`;
        const base = { id, batchId, position: index + 1, labCode, duplicateOfItemId: null as string | null, standardCode: null as string | null };
        if (planned.kind === 'sample') {
          const sample = samples.find((candidate) => candidate.id === planned.sampleId) as Sample;
          itemIdOfSample.set(sample.id, id);
          return { ...base, itemType: sample.sampleType, isInserted: false, sampleId: sample.id, standardCode: sample.standardId, material: materialOf(sample), massKg: sample.wetMassKg, duplicateOfSampleId: sample.sampleType === 'duplicate' ? sample.duplicateOfId : null };
        }
        if (planned.kind === 'split') {
          const sample = samples.find((candidate) => candidate.id === planned.ofSampleId) as Sample;
          return { ...base, itemType: 'duplicate' as const, isInserted: true, sampleId: sample.id, material: materialOf(sample), massKg: sample.wetMassKg, duplicateOfSampleId: sample.id };
        }
        return { ...base, itemType: planned.kind, isInserted: true, sampleId: null, standardCode: planned.kind === 'standard' ? planned.standardCode : null, material: typicalMaterial, massKg: typicalMassKg, duplicateOfSampleId: null };
      });
      for (const { duplicateOfSampleId, ...row } of rows) {
        const duplicateOfItemId = duplicateOfSampleId ? itemIdOfSample.get(duplicateOfSampleId) ?? null : null;
        await LabBatchSample.create({ ...row, duplicateOfItemId }, { transaction });
      }
    });
    return this.getBatch(user, batchId);
  }

  /** Batches the user may see: of a readable site for geologists, of their own lab for lab users. */
  async listBatches(user: CurrentUser, filter: { siteId?: string }) {
    assertCan(user, 'lab:results', ownLab(user));
    const where: Record<string, unknown> = { organizationId: user.organizationId };
    if (user.role === 'lab') {
      where['labName'] = user.labName ?? '';
    } else {
      where['siteId'] = { [Op.in]: user.siteIds.filter((siteId) => filter.siteId === undefined || siteId === filter.siteId) };
    }
    if (filter.siteId && user.role === 'lab') {
      where['siteId'] = filter.siteId;
    }
    const batches = await LabBatch.findAll({ where, order: [['createdAt', 'DESC'], ['code', 'DESC']] });
    const counts = await LabBatchSample.count({ where: { batchId: { [Op.in]: batches.map((batch) => batch.id) } }, group: ['batchId'] }) as unknown as { batchId: string; count: number }[];
    return batches.map((batch) => batchSummary(batch, Number(counts.find((entry) => entry.batchId === batch.id)?.count ?? 0)));
  }

  /** Loads a batch the user may reach with this permission, else 404 (so strangers cannot probe ids). */
  async loadBatch(user: CurrentUser, batchId: string, permission: 'lab:manage' | 'lab:results'): Promise<LabBatch> {
    assertCan(user, permission, ownLab(user));
    const batch = await LabBatch.findOne({ where: { id: batchId, organizationId: user.organizationId } });
    const scope = user.role === 'lab' ? { labName: batch?.labName ?? null } : { siteId: batch?.siteId ?? '' };
    if (!batch || !can(user, permission, scope)) {
      throw new AppError('not_found', 'No such lab batch');
    }
    return batch;
  }

  /** One batch with its items, current assays, imports and QA/QC verdicts. */
  async getBatch(user: CurrentUser, batchId: string): Promise<BatchView> {
    const batch = await this.loadBatch(user, batchId, 'lab:results');
    const items = await LabBatchSample.findAll({ where: { batchId }, order: [['position', 'ASC']] });
    const [assays, imports, samples, standards] = await Promise.all([
      AssayResult.findAll({ where: { batchId, supersededAt: null } }),
      ResultImport.findAll({ where: { batchId }, order: [['importedAt', 'ASC'], ['id', 'ASC']] }),
      Sample.findAll({ where: { id: { [Op.in]: items.map((item) => item.sampleId).filter((id): id is string => id !== null) } } }),
      ReferenceStandard.findAll({ where: { organizationId: batch.organizationId } }),
    ]);
    const isHiddenFromLab = user.role === 'lab' && batch.isBlind;
    const values = new Map(assays.map((row) => [row.batchSampleId, assayValueOf(row)]));
    return {
      ...batchSummary(batch, items.length),
      items: items.map((item) => {
        const assay = assays.find((row) => row.batchSampleId === item.id);
        return {
          id: item.id, position: item.position, labCode: item.labCode,
          itemType: isHiddenFromLab ? null : item.itemType, isInserted: isHiddenFromLab ? null : item.isInserted,
          sampleId: user.role === 'lab' ? null : item.sampleId,
          sampleCode: user.role === 'lab' ? null : samples.find((sample) => sample.id === item.sampleId)?.code ?? null,
          standardCode: isHiddenFromLab ? null : item.standardCode, material: item.material, massKg: item.massKg,
          assay: assay ? { valueGpt: assay.valueGpt, isBelowDetection: assay.isBelowDetection, isAboveRange: assay.isAboveRange, detectionLimitGpt: assay.detectionLimitGpt, rawValue: assay.rawValue } : null,
        };
      }),
      imports: imports.map((row) => ({ id: row.id, fileName: row.fileName, fileHash: row.fileHash, rowCount: row.rowCount, changedCount: row.changedCount, importedById: row.importedById, importedAt: row.importedAt.toISOString() })),
      qaqc: isHiddenFromLab ? null : checkBatches(qcItemsOf(batch, items), values, standards),
    };
  }

  /** Fills in chain-of-custody fields: the dispatch side for geologists, the receiving side for the lab too. */
  async updateCustody(user: CurrentUser, batchId: string, changes: CustodyInput): Promise<BatchView> {
    const isManager = can(user, 'lab:manage');
    const batch = await this.loadBatch(user, batchId, isManager ? 'lab:manage' : 'lab:results');
    const fields = Object.keys(changes) as (keyof CustodyInput)[];
    const notAllowed = isManager ? [] : fields.filter((field) => !(LAB_CUSTODY_FIELDS as readonly string[]).includes(field));
    if (notAllowed.length > 0) {
      throw new AppError('forbidden', 'The laboratory fills in only the receiving side of the chain of custody', { fields: notAllowed });
    }
    const update: Record<string, unknown> = {};
    for (const field of fields) {
      const value = changes[field];
      update[field] = (field === 'dispatchedAt' || field === 'receivedAt') && typeof value === 'string' ? new Date(value) : value === '' ? null : value ?? null;
    }
    if (update['receivedAt'] && batch.status !== 'reported') {
      update['status'] = 'received';
    }
    await this.database.transaction((transaction) => LabBatch.update(update, { where: { id: batch.id }, transaction }));
    return this.getBatch(user, batch.id);
  }

  /** The submission sheet: one row per bag in dispatch order (README "Lab submission CSV"). */
  async submissionCsv(user: CurrentUser, batchId: string): Promise<{ fileName: string; csv: string; batch: LabBatch; itemCount: number }> {
    const batch = await this.loadBatch(user, batchId, 'lab:results');
    const items = await LabBatchSample.findAll({ where: { batchId }, order: [['position', 'ASC']] });
    const typeLabel: Record<BatchItemType, string> = { routine: 'routine', duplicate: 'field duplicate', blank: 'blank', standard: 'reference standard' };
    const rows = items.map((item) => [
      batch.code, item.position, item.labCode,
      batch.isBlind ? 'sample' : typeLabel[item.itemType],
      batch.isBlind ? null : item.standardCode,
      item.material, item.massKg, batch.method, batch.chargeMassG, batch.detectionLimitGpt,
    ]);
    return { fileName: `${batch.code}-submission.csv`, csv: writeCsv(SUBMISSION_COLUMNS, rows), batch, itemCount: items.length };
  }

  /** E-mails the submission sheet to the lab contact, and marks the batch dispatched when the mail went. */
  async sendBatch(user: CurrentUser, batchId: string): Promise<{ mail: SentMail; batch: BatchView }> {
    const { fileName, csv, batch, itemCount } = await this.submissionCsv(user, batchId);
    assertCan(user, 'lab:manage', { siteId: batch.siteId });
    const site = await Site.findByPk(batch.siteId);
    const custody = [
      `Dispatched by: ${batch.dispatchedBy ?? '—'}`, `Dispatched at: ${batch.dispatchedAt?.toISOString() ?? '—'}`,
      `Carrier: ${batch.carrier ?? '—'}`, `Seal numbers: ${batch.sealNumbers ?? '—'}`,
    ];
    const text = [
      `Lab batch ${batch.code} from ${site?.name ?? 'our site'}: ${itemCount} samples for ${batch.labName}.`,
      '',
      `Method: ${batch.method}`,
      `Charge: ${batch.chargeMassG} g`,
      `Detection limit: ${batch.detectionLimitGpt} g/t${batch.upperLimitGpt ? `; upper limit ${batch.upperLimitGpt} g/t` : ''}`,
      '',
      'Chain of custody',
      ...custody,
      '',
      `The submission sheet is attached (${fileName}), one row per bag in dispatch order.`,
      'Please return the results as CSV (UTF-8, comma-separated, a point as the decimal mark) with the columns',
      '"sample code" and "Au g/t", and optionally "detection limit g/t", "units", "method", "lab job" and "batch id".',
      'Write values below detection as <limit (e.g. <0.005) and values above range as >limit.',
      '',
      `Sent by ${user.name} (${user.email}) through Heapsight.`,
    ].join('\n');
    const mail = await this.mail.sendMail({
      to: batch.labContactEmail,
      subject: `Lab batch ${batch.code}: ${itemCount} samples for ${batch.method}`,
      text,
      attachments: [{ filename: fileName, content: Buffer.from(csv, 'utf8'), contentType: 'text/csv; charset=utf-8' }],
      organizationId: batch.organizationId,
    });
    if (mail.status === 'sent') {
      await this.database.transaction((transaction) =>
        LabBatch.update({ sentAt: new Date(), status: batch.status === 'draft' ? 'dispatched' : batch.status }, { where: { id: batch.id }, transaction }),
      );
    }
    return { mail, batch: await this.getBatch(user, batch.id) };
  }

  /**
   * Checks a results file against the batch and reports every row; with `isDryRun` false, saves
   * when nothing blocks, in one transaction: new values, and corrected ones superseding the old
   * (kept as history). The same file twice changes nothing.
   */
  async importResults(user: CurrentUser, batchId: string, file: { fileName: string; bytes: Buffer }, isDryRun: boolean): Promise<ImportReport> {
    const batch = await this.loadBatch(user, batchId, 'lab:results');
    const fileHash = createHash('sha256').update(file.bytes).digest('hex');
    const build = async (transaction?: Transaction) => {
      const items = await LabBatchSample.findAll({ where: { batchId }, order: [['position', 'ASC']], transaction });
      const current = await AssayResult.findAll({ where: { batchId, supersededAt: null }, transaction });
      const previous = await ResultImport.findOne({ where: { batchId, fileHash }, transaction });
      const standards = await ReferenceStandard.findAll({ where: { organizationId: batch.organizationId }, transaction });
      const parsed = parseResultsFile(file.bytes, { code: batch.code, detectionLimitGpt: batch.detectionLimitGpt, upperLimitGpt: batch.upperLimitGpt, method: batch.method, items });
      return { items, current, previous, report: this.reportOf(batch, file.fileName, fileHash, isDryRun, parsed, items, current, standards, previous !== null) };
    };
    const { report } = await build();
    if (isDryRun) {
      return report;
    }
    if (!report.canSave) {
      throw new AppError('validation_failed', 'The results file has problems; nothing was saved', { report });
    }
    if (report.isAlreadyImported || report.summary.changed === 0) {
      return report;
    }
    return this.database.transaction(async (transaction) => {
      // Read again inside the transaction, so two imports at once cannot both supersede one value.
      const fresh = await build(transaction);
      if (!fresh.report.canSave) {
        throw new AppError('validation_failed', 'The results file has problems; nothing was saved', { report: fresh.report });
      }
      if (fresh.report.isAlreadyImported || fresh.report.summary.changed === 0) {
        return fresh.report;
      }
      const importId = randomUUID();
      const now = new Date();
      await ResultImport.create({
        id: importId, batchId, fileName: file.fileName.slice(0, 255), fileHash, byteSize: file.bytes.length,
        rowCount: fresh.report.rows.length, changedCount: fresh.report.summary.changed, importedById: user.id, importedAt: now,
      }, { transaction });
      const parsedRows = parseResultsFile(file.bytes, { code: batch.code, detectionLimitGpt: batch.detectionLimitGpt, upperLimitGpt: batch.upperLimitGpt, method: batch.method, items: fresh.items }).rows;
      for (const row of fresh.report.rows) {
        if (row.change !== 'new' && row.change !== 'supersedes') continue;
        const parsedRow = parsedRows.find((candidate) => candidate.line === row.line) as ResultRow;
        const value = parsedRow.value as AssayValue;
        const item = fresh.items.find((candidate) => candidate.id === row.itemId) as LabBatchSample;
        if (row.change === 'supersedes') {
          await AssayResult.update({ supersededAt: now, supersededByImportId: importId }, { where: { batchSampleId: item.id, supersededAt: null }, transaction });
        }
        await AssayResult.create({
          id: randomUUID(), batchId, batchSampleId: item.id, sampleId: item.sampleId, valueGpt: value.valueGpt,
          isBelowDetection: value.isBelowDetection, isAboveRange: value.isAboveRange, detectionLimitGpt: value.detectionLimitGpt,
          rawValue: value.raw.slice(0, 64), method: (row.method ?? batch.method).slice(0, 120), labJob: row.labJob?.slice(0, 64) ?? null,
          importId, supersededAt: null, supersededByImportId: null,
        }, { transaction });
      }
      await LabBatch.update({ status: 'reported' }, { where: { id: batchId }, transaction });
      return { ...fresh.report, isSaved: true, importId };
    });
  }

  private reportOf(
    batch: LabBatch, fileName: string, fileHash: string, isDryRun: boolean, parsed: ParsedResults,
    items: readonly LabBatchSample[], current: readonly AssayResult[], standards: readonly ReferenceStandard[], isAlreadyImported: boolean,
  ): ImportReport {
    const rows = parsed.rows.map(({ value, ...row }) => {
      const existing = current.find((assay) => assay.batchSampleId === row.itemId);
      const method = row.method ?? batch.method;
      const change: RowChange = row.isBlocking || !value ? null
        : !existing ? 'new'
        : existing.valueGpt === value.valueGpt && existing.isBelowDetection === value.isBelowDetection && existing.isAboveRange === value.isAboveRange
          && existing.detectionLimitGpt === value.detectionLimitGpt && existing.method === method && (existing.labJob ?? null) === (row.labJob ?? null) ? 'unchanged' : 'supersedes';
      return { ...row, valueGpt: value?.valueGpt ?? null, isBelowDetection: value?.isBelowDetection ?? false, isAboveRange: value?.isAboveRange ?? false, detectionLimitGpt: value?.detectionLimitGpt ?? null, change };
    });
    const byStatus: Partial<Record<RowStatus, number>> = {};
    for (const row of rows) byStatus[row.status] = (byStatus[row.status] ?? 0) + 1;
    const blocking = rows.filter((row) => row.isBlocking).length;
    // QA/QC as it would stand after saving: current values, with the file's savable rows on top.
    const values = new Map(current.map((assay) => [assay.batchSampleId, assayValueOf(assay)]));
    for (const row of parsed.rows) {
      if (!row.isBlocking && row.itemId && row.value) values.set(row.itemId, row.value);
    }
    return {
      batchId: batch.id, batchCode: batch.code, fileName, fileHash, isDryRun, fileProblems: parsed.fileProblems, rows, notInFile: parsed.notInFile,
      summary: { rows: rows.length, blocking, byStatus, changed: rows.filter((row) => row.change === 'new' || row.change === 'supersedes').length },
      canSave: parsed.fileProblems.length === 0 && blocking === 0 && rows.length > 0,
      isAlreadyImported, isSaved: false, importId: null,
      qaqc: checkBatches(qcItemsOf(batch, items), values, standards),
    };
  }
}

/** The scope "any batch of my own lab": what a lab user's permission is first checked against. */
function ownLab(user: CurrentUser): { labName?: string | null } {
  return user.role === 'lab' ? { labName: user.labName } : {};
}

function mostCommon(values: readonly (string | null)[]): string | null {
  const counts = new Map<string, number>();
  for (const value of values) if (value !== null) counts.set(value, (counts.get(value) ?? 0) + 1);
  return [...counts.entries()].sort((a, b) => b[1] - a[1] || a[0].localeCompare(b[0]))[0]?.[0] ?? null;
}
