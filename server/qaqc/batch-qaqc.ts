/**
 * The QA/QC verdicts of lab batches from their assays, through the engine's checks (Abzalov 2008;
 * REFERENCES.md): blanks against 5 × the batch's detection limit, reference standards against
 * their expected value ± 2 SD (warn) and ± 3 SD (fail) with the two-in-a-row rule over the series
 * in dispatch order, and field or split duplicates by HARD within 30 %. Pure: items, values and
 * standards in; verdicts out.
 */
import { checkBlank, checkDuplicatePair, checkStandardSeries, type AssayValue, type QcStatus } from '../../shared/engine';

/** What a verdict can be: a check's status, or that a value is still missing. */
export type QcVerdict = QcStatus | 'no-result' | 'unknown-standard';

/** A batch item as QA/QC sees it. */
export interface QcItem {
  readonly id: string;
  readonly batchId: string;
  readonly batchCode: string;
  readonly position: number;
  readonly labCode: string;
  readonly itemType: 'routine' | 'duplicate' | 'blank' | 'standard';
  readonly duplicateOfItemId: string | null;
  readonly standardCode: string | null;
  readonly detectionLimitGpt: number;
}

/** A reference standard's certified values. */
export interface QcStandard {
  readonly code: string;
  readonly expectedGpt: number;
  readonly sdGpt: number;
}

/** One blank checked. */
export interface BlankVerdict {
  readonly itemId: string;
  readonly batchCode: string;
  readonly labCode: string;
  readonly position: number;
  readonly valueGpt: number | null;
  readonly isBelowDetection: boolean;
  readonly limitGpt: number;
  readonly verdict: QcVerdict;
}

/** One standard result checked. */
export interface StandardVerdict {
  readonly itemId: string;
  readonly batchCode: string;
  readonly labCode: string;
  readonly position: number;
  readonly standardCode: string;
  readonly valueGpt: number | null;
  readonly expectedGpt: number | null;
  readonly sdGpt: number | null;
  readonly zScore: number | null;
  readonly verdict: QcVerdict;
  readonly reason: string;
}

/** One duplicate pair checked. */
export interface DuplicateVerdict {
  readonly itemId: string;
  readonly originalItemId: string;
  readonly batchCode: string;
  readonly labCode: string;
  readonly originalLabCode: string;
  readonly originalGpt: number | null;
  readonly duplicateGpt: number | null;
  readonly hard: number | null;
  readonly tolerance: number;
  readonly verdict: QcVerdict;
}

/** Every check of a set of batches, and the overall verdict of each batch. */
export interface QaqcReport {
  readonly blanks: readonly BlankVerdict[];
  readonly standards: readonly StandardVerdict[];
  readonly duplicates: readonly DuplicateVerdict[];
  readonly batches: readonly { readonly batchId: string; readonly batchCode: string; readonly verdict: QcVerdict | 'no-qc'; readonly reasons: readonly string[] }[];
}

/** HARD tolerance for gold field duplicates (within ±30 % HARD, from memory; REFERENCES.md). */
export const DUPLICATE_TOLERANCE = 0.3;

/**
 * Checks the QA/QC items of the given batches. `items` must be in batch order then dispatch order;
 * standards are checked as one series per standard across the batches given.
 */
export function checkBatches(items: readonly QcItem[], values: ReadonlyMap<string, AssayValue>, standards: readonly QcStandard[]): QaqcReport {
  const blanks: BlankVerdict[] = items.filter((item) => item.itemType === 'blank').map((item) => {
    const value = values.get(item.id) ?? null;
    const base = { itemId: item.id, batchCode: item.batchCode, labCode: item.labCode, position: item.position, valueGpt: value?.valueGpt ?? null, isBelowDetection: value?.isBelowDetection ?? false, limitGpt: 5 * item.detectionLimitGpt };
    if (!value) return { ...base, verdict: 'no-result' as const };
    const check = checkBlank({ value, detectionLimitGpt: item.detectionLimitGpt });
    return { ...base, limitGpt: check.ok ? check.value.limitGpt : base.limitGpt, verdict: check.ok ? check.value.status : 'fail' };
  });

  const standardVerdicts: StandardVerdict[] = [];
  const standardItems = items.filter((item) => item.itemType === 'standard');
  for (const code of [...new Set(standardItems.map((item) => item.standardCode ?? ''))]) {
    const series = standardItems.filter((item) => (item.standardCode ?? '') === code);
    const standard = standards.find((candidate) => candidate.code === code);
    const withValues = series.filter((item) => values.has(item.id));
    const checks = standard ? checkStandardSeries({ values: withValues.map((item) => values.get(item.id) as AssayValue), expectedGpt: standard.expectedGpt, sdGpt: standard.sdGpt }) : null;
    for (const item of series) {
      const value = values.get(item.id) ?? null;
      const base = { itemId: item.id, batchCode: item.batchCode, labCode: item.labCode, position: item.position, standardCode: code, valueGpt: value?.valueGpt ?? null, expectedGpt: standard?.expectedGpt ?? null, sdGpt: standard?.sdGpt ?? null };
      if (!standard) {
        standardVerdicts.push({ ...base, zScore: null, verdict: 'unknown-standard', reason: `no reference standard "${code}" is on record` });
      } else if (!value || !checks?.ok) {
        standardVerdicts.push({ ...base, zScore: null, verdict: 'no-result', reason: 'no result yet' });
      } else {
        const check = checks.value[withValues.indexOf(item)];
        standardVerdicts.push({ ...base, zScore: check?.zScore ?? null, verdict: check?.status ?? 'no-result', reason: check?.reason ?? '' });
      }
    }
  }

  const byId = new Map(items.map((item) => [item.id, item]));
  const duplicates: DuplicateVerdict[] = items.filter((item) => item.duplicateOfItemId !== null).flatMap((item): DuplicateVerdict[] => {
    const original = byId.get(item.duplicateOfItemId as string);
    if (!original) return [];
    const a = values.get(original.id);
    const b = values.get(item.id);
    const base = { itemId: item.id, originalItemId: original.id, batchCode: item.batchCode, labCode: item.labCode, originalLabCode: original.labCode, originalGpt: a?.valueGpt ?? null, duplicateGpt: b?.valueGpt ?? null, tolerance: DUPLICATE_TOLERANCE };
    if (!a || !b) return [{ ...base, hard: null, verdict: 'no-result' as const }];
    const check = checkDuplicatePair({ original: a, duplicate: b, tolerance: DUPLICATE_TOLERANCE });
    return [{ ...base, hard: check.ok ? check.value.hard : null, verdict: check.ok ? check.value.status : ('fail' as const) }];
  });

  const batchIds = [...new Set(items.map((item) => item.batchId))];
  const batches = batchIds.map((batchId) => {
    const batchCode = items.find((item) => item.batchId === batchId)?.batchCode ?? '';
    const reasons: string[] = [];
    const verdicts: QcVerdict[] = [];
    const note = (verdict: QcVerdict, what: string) => {
      verdicts.push(verdict);
      if (verdict === 'fail' || verdict === 'warn' || verdict === 'unknown-standard') reasons.push(`${what}: ${verdict === 'unknown-standard' ? 'unknown standard' : verdict}`);
    };
    blanks.filter((entry) => byId.get(entry.itemId)?.batchId === batchId).forEach((entry) => note(entry.verdict, `blank ${entry.labCode}`));
    standardVerdicts.filter((entry) => byId.get(entry.itemId)?.batchId === batchId).forEach((entry) => note(entry.verdict, `standard ${entry.standardCode} (${entry.labCode})`));
    duplicates.filter((entry) => byId.get(entry.itemId)?.batchId === batchId).forEach((entry) => note(entry.verdict, `duplicate ${entry.labCode} of ${entry.originalLabCode}`));
    const verdict: QcVerdict | 'no-qc' = verdicts.length === 0 ? 'no-qc'
      : verdicts.includes('fail') || verdicts.includes('unknown-standard') ? 'fail'
      : verdicts.includes('warn') ? 'warn'
      : verdicts.includes('no-result') ? 'no-result' : 'pass';
    return { batchId, batchCode, verdict, reasons };
  });
  return { blanks, standards: standardVerdicts, duplicates, batches };
}
