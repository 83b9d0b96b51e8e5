import { HttpClient, HttpParams } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { firstValueFrom } from 'rxjs';
import type { ProblemKeys } from '../sign-in/problem-text';

/** A QA/QC verdict as the server gives it. */
export type QcVerdict = 'pass' | 'warn' | 'fail' | 'no-result' | 'unknown-standard' | 'no-qc';

/** `GET /api/qaqc`: every check of a site's batches, in batch order. */
export interface SiteQaqc {
  readonly blanks: readonly { itemId: string; batchCode: string; labCode: string; valueGpt: number | null; isBelowDetection: boolean; limitGpt: number; verdict: QcVerdict }[];
  readonly standards: readonly { itemId: string; batchCode: string; labCode: string; standardCode: string; valueGpt: number | null; expectedGpt: number | null; sdGpt: number | null; zScore: number | null; verdict: QcVerdict }[];
  readonly duplicates: readonly { itemId: string; batchCode: string; labCode: string; originalLabCode: string; originalGpt: number | null; duplicateGpt: number | null; hard: number | null; tolerance: number; verdict: QcVerdict }[];
  readonly batches: readonly { batchId: string; batchCode: string; verdict: QcVerdict; reasons: readonly string[] }[];
  readonly standardsOnRecord: readonly { code: string; expectedGpt: number; sdGpt: number }[];
}

/** `GET /api/calibration`: the site's pan-vs-assay line and whether it is applied. */
export interface SiteCalibration {
  readonly siteId: string;
  readonly isApplied: boolean;
  readonly fit: { slope: number; interceptGpt: number; n: number; r2: number; residualSdGpt: number; panRangeGpt: [number, number]; warnings: { code: string; message: string }[] } | null;
  readonly refusals: readonly { code: string; message: string; details?: Readonly<Record<string, unknown>> }[];
  readonly points: readonly { sampleId: string; code: string; panGpt: number; assayGpt: number }[];
}

/** The QA/QC and calibration API. */
@Injectable({ providedIn: 'root' })
export class QaqcStore {
  private readonly http = inject(HttpClient);

  qaqc(siteId: string): Promise<SiteQaqc> {
    return firstValueFrom(this.http.get<SiteQaqc>('/api/qaqc', { params: new HttpParams().set('siteId', siteId) }));
  }

  calibration(siteId: string): Promise<SiteCalibration> {
    return firstValueFrom(this.http.get<SiteCalibration>('/api/calibration', { params: new HttpParams().set('siteId', siteId) }));
  }

  setApplied(siteId: string, isApplied: boolean): Promise<SiteCalibration> {
    return firstValueFrom(this.http.put<SiteCalibration>(`/api/calibration/${siteId}`, { isApplied }));
  }
}

/** Icon and words (translation key) for a verdict, so it never rests on colour alone. */
export const VERDICT_LABELS: Record<QcVerdict, { icon: string; key: string }> = {
  pass: { icon: 'check_circle', key: 'qaqc.verdict.pass' },
  warn: { icon: 'warning', key: 'qaqc.verdict.warn' },
  fail: { icon: 'cancel', key: 'qaqc.verdict.fail' },
  'no-result': { icon: 'hourglass_empty', key: 'qaqc.verdict.noResult' },
  'unknown-standard': { icon: 'help', key: 'qaqc.verdict.unknownStandard' },
  'no-qc': { icon: 'remove', key: 'qaqc.verdict.noQc' },
};

/**
 * The refusals these pages explain in the reader's language, by the API's error code; a validation
 * failure or a conflict keeps the server's words, which name the exact problem.
 */
export const QAQC_PROBLEMS: ProblemKeys = {
  offline: 'qaqc.problems.offline',
  unauthenticated: 'qaqc.problems.signIn',
  token_expired: 'qaqc.problems.signIn',
  forbidden: 'qaqc.problems.forbidden',
  not_found: 'qaqc.problems.notFound',
  internal: 'qaqc.problems.internal',
};
