import { HttpClient, HttpParams } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { firstValueFrom } from 'rxjs';
import type { ProblemKeys } from '../sign-in/problem-text';

/** A batch as `GET /api/lab-batches` lists it. */
export interface BatchSummary {
  readonly id: string;
  readonly siteId: string;
  readonly code: string;
  readonly labName: string;
  readonly labContactEmail: string;
  readonly method: string;
  readonly chargeMassG: number;
  readonly detectionLimitGpt: number;
  readonly upperLimitGpt: number | null;
  readonly isBlind: boolean;
  readonly status: 'draft' | 'dispatched' | 'received' | 'reported';
  readonly dispatchedBy: string | null;
  readonly dispatchedAt: string | null;
  readonly carrier: string | null;
  readonly sealNumbers: string | null;
  readonly receivedBy: string | null;
  readonly receivedAt: string | null;
  readonly conditionOnReceipt: string | null;
  readonly sentAt: string | null;
  readonly createdAt: string;
  readonly itemCount: number;
}

/** A QA/QC verdict as the server gives it. */
export type QcVerdict = 'pass' | 'warn' | 'fail' | 'no-result' | 'unknown-standard' | 'no-qc';

/** The QA/QC checks of one or more batches (server/qaqc/batch-qaqc.ts). */
export interface QaqcReport {
  readonly blanks: readonly { itemId: string; batchCode: string; labCode: string; position: number; valueGpt: number | null; isBelowDetection: boolean; limitGpt: number; verdict: QcVerdict }[];
  readonly standards: readonly { itemId: string; batchCode: string; labCode: string; position: number; standardCode: string; valueGpt: number | null; expectedGpt: number | null; sdGpt: number | null; zScore: number | null; verdict: QcVerdict; reason: string }[];
  readonly duplicates: readonly { itemId: string; batchCode: string; labCode: string; originalLabCode: string; originalGpt: number | null; duplicateGpt: number | null; hard: number | null; tolerance: number; verdict: QcVerdict }[];
  readonly batches: readonly { batchId: string; batchCode: string; verdict: QcVerdict; reasons: readonly string[] }[];
}

/** One bag of a batch with its current assay. */
export interface BatchItem {
  readonly id: string;
  readonly position: number;
  readonly labCode: string;
  readonly itemType: 'routine' | 'duplicate' | 'blank' | 'standard' | null;
  readonly isInserted: boolean | null;
  readonly sampleId: string | null;
  readonly sampleCode: string | null;
  readonly standardCode: string | null;
  readonly material: string | null;
  readonly massKg: number | null;
  readonly assay: { valueGpt: number; isBelowDetection: boolean; isAboveRange: boolean; detectionLimitGpt: number | null; rawValue: string } | null;
}

/** A batch with its bags, imports and QA/QC. */
export interface BatchDetail extends BatchSummary {
  readonly items: readonly BatchItem[];
  readonly imports: readonly { id: string; fileName: string; rowCount: number; changedCount: number; importedAt: string }[];
  readonly qaqc: QaqcReport | null;
}

/** A sample that may go into a batch. */
export interface CandidateSample {
  readonly id: string;
  readonly code: string;
  readonly sampleType: 'routine' | 'duplicate' | 'blank' | 'standard';
  readonly pileCode: string | null;
  readonly material: string | null;
  readonly wetMassKg: number | null;
  readonly panGpt: number | null;
  readonly assayGpt: number | null;
  readonly batchCodes: readonly string[];
}

/** A reference standard on record. */
export interface ReferenceStandard {
  readonly code: string;
  readonly expectedGpt: number;
  readonly sdGpt: number;
  readonly description: string;
}

/** One row of a results-file report. */
export interface ReportRow {
  readonly line: number;
  readonly sampleCode: string;
  readonly rawValue: string;
  readonly status: string;
  readonly message: string;
  readonly isBlocking: boolean;
  readonly valueGpt: number | null;
  readonly isBelowDetection: boolean;
  readonly change: 'new' | 'unchanged' | 'supersedes' | null;
}

/** The dry-run (or save) report of a results file. */
export interface ImportReport {
  readonly fileName: string;
  readonly fileProblems: readonly { code: string; message: string }[];
  readonly rows: readonly ReportRow[];
  readonly notInFile: readonly string[];
  readonly summary: { rows: number; blocking: number; changed: number };
  readonly canSave: boolean;
  readonly isAlreadyImported: boolean;
  readonly isSaved: boolean;
  readonly qaqc: QaqcReport;
}

/** What a new batch needs (POST /api/lab-batches). */
export interface NewBatch {
  readonly siteId: string;
  readonly sampleIds: readonly string[];
  readonly labName: string;
  readonly labContactEmail: string;
  readonly method: string;
  readonly chargeMassG: number;
  readonly detectionLimitGpt: number;
  readonly upperLimitGpt: number | null;
  readonly isBlind: boolean;
  readonly blankEvery: number;
  readonly standardEvery: number;
  readonly duplicateEvery: number;
  readonly standardCodes: readonly string[];
  readonly seed: number;
  readonly notes: string;
}

/** Chain-of-custody fields (PATCH /api/lab-batches/:id/custody). */
export type CustodyChanges = Partial<Pick<BatchSummary, 'dispatchedBy' | 'dispatchedAt' | 'carrier' | 'sealNumbers' | 'receivedBy' | 'receivedAt' | 'conditionOnReceipt'>>;

/** The lab-batch API, for the pages of this feature. */
@Injectable({ providedIn: 'root' })
export class LabBatchesStore {
  private readonly http = inject(HttpClient);

  async list(siteId?: string): Promise<readonly BatchSummary[]> {
    const params = siteId ? new HttpParams().set('siteId', siteId) : new HttpParams();
    return (await firstValueFrom(this.http.get<{ items: BatchSummary[] }>('/api/lab-batches', { params }))).items;
  }

  get(id: string): Promise<BatchDetail> {
    return firstValueFrom(this.http.get<BatchDetail>(`/api/lab-batches/${id}`));
  }

  async candidates(siteId: string): Promise<readonly CandidateSample[]> {
    return (await firstValueFrom(this.http.get<{ items: CandidateSample[] }>('/api/lab-batches/candidates', { params: new HttpParams().set('siteId', siteId) }))).items;
  }

  async standards(): Promise<readonly ReferenceStandard[]> {
    return (await firstValueFrom(this.http.get<{ items: ReferenceStandard[] }>('/api/reference-standards'))).items;
  }

  create(batch: NewBatch): Promise<BatchDetail> {
    return firstValueFrom(this.http.post<BatchDetail>('/api/lab-batches', batch));
  }

  updateCustody(id: string, changes: CustodyChanges): Promise<BatchDetail> {
    return firstValueFrom(this.http.patch<BatchDetail>(`/api/lab-batches/${id}/custody`, changes));
  }

  send(id: string): Promise<{ mail: { status: 'sent' | 'failed' | 'sending'; errorMessage: string | null }; batch: BatchDetail }> {
    return firstValueFrom(this.http.post<{ mail: { status: 'sent' | 'failed' | 'sending'; errorMessage: string | null }; batch: BatchDetail }>(`/api/lab-batches/${id}/send`, {}));
  }

  submissionCsv(id: string): Promise<Blob> {
    return firstValueFrom(this.http.get(`/api/lab-batches/${id}/submission.csv`, { responseType: 'blob' }));
  }

  importResults(id: string, file: File, isDryRun: boolean): Promise<ImportReport> {
    const form = new FormData();
    form.append('file', file, file.name);
    return firstValueFrom(this.http.post<ImportReport>(`/api/lab-batches/${id}/results`, form, { params: new HttpParams().set('dryRun', String(isDryRun)) }));
  }
}

/** Icon and words (translation key) for a verdict, so it never rests on colour alone. */
export const VERDICT_LABELS: Record<QcVerdict, { icon: string; key: string }> = {
  pass: { icon: 'check_circle', key: 'labBatches.verdict.pass' },
  warn: { icon: 'warning', key: 'labBatches.verdict.warn' },
  fail: { icon: 'cancel', key: 'labBatches.verdict.fail' },
  'no-result': { icon: 'hourglass_empty', key: 'labBatches.verdict.noResult' },
  'unknown-standard': { icon: 'help', key: 'labBatches.verdict.unknownStandard' },
  'no-qc': { icon: 'remove', key: 'labBatches.verdict.noQc' },
};

/** Icon and words (translation key) for a batch status. */
export const STATUS_LABELS: Record<BatchSummary['status'], { icon: string; key: string }> = {
  draft: { icon: 'edit_note', key: 'labBatches.status.draft' },
  dispatched: { icon: 'local_shipping', key: 'labBatches.status.dispatched' },
  received: { icon: 'inventory', key: 'labBatches.status.received' },
  reported: { icon: 'fact_check', key: 'labBatches.status.reported' },
};

/**
 * The refusals these pages explain in the reader's language, by the API's error code. A validation
 * failure or a conflict keeps the server's words: they name the exact field or state.
 */
export const LAB_BATCH_PROBLEMS: ProblemKeys = {
  offline: 'labBatches.problems.offline',
  unauthenticated: 'labBatches.problems.signIn',
  token_expired: 'labBatches.problems.signIn',
  forbidden: 'labBatches.problems.forbidden',
  not_found: 'labBatches.problems.notFound',
  payload_too_large: 'labBatches.problems.tooLarge',
  unsupported_media_type: 'labBatches.problems.notCsv',
  rate_limited: 'labBatches.problems.rateLimited',
  internal: 'labBatches.problems.internal',
};

/** Saves a blob as a file through a temporary link. */
export function saveBlob(blob: Blob, fileName: string): void {
  const url = URL.createObjectURL(blob);
  const link = document.createElement('a');
  link.href = url;
  link.download = fileName;
  link.click();
  setTimeout(() => URL.revokeObjectURL(url), 0);
}
