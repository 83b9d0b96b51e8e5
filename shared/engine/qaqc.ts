/**
 * Quality control of assays (Abzalov 2008; Stanley & Lawie 2007; Westgard-style rules for standards).
 * - Below-detection results such as `<0.01` are censored values: kept as a flag plus the limit,
 *   never a silent zero (Miesch 1967). Where a number is needed, the stated convention is half the
 *   detection limit (common practice, no source); 'detection-limit' and 'zero' may be chosen instead.
 * - Field duplicates: HARD = |a − b| / (a + b) (half the absolute relative difference), passing when
 *   HARD is within the tolerance (default 0.3: most gold pairs fall within ±30 % HARD, from memory).
 * - Blanks fail above a multiple of the detection limit (default 5×, common practice).
 * - Reference standards: within ±2 SD pass, 2–3 SD warn, beyond 3 SD fail; two results in a row
 *   beyond 2 SD on the same side fail (the 2-2s rule).
 */
import { EngineError, Result, checkNumber, checkNumbers, engineError, fail, ok } from './result';

/** An assay value as the laboratory reported it. */
export interface AssayValue {
  /** The number reported; for a censored value, the limit. */
  readonly valueGpt: number;
  readonly isBelowDetection: boolean;
  readonly isAboveRange: boolean;
  readonly detectionLimitGpt: number | null;
  readonly raw: string;
}

/** How a censored value becomes a number for statistics. */
export type CensoredConvention = 'half-detection-limit' | 'detection-limit' | 'zero';

/** The convention used unless another is chosen. */
export const DEFAULT_CENSORED_CONVENTION: CensoredConvention = 'half-detection-limit';

const NUMBER_PATTERN = /^[0-9]*\.?[0-9]+(?:[eE][-+]?[0-9]+)?$/;

/** Parses a laboratory value: `0.53`, `<0.01` (below detection), `>100` (above range). */
export function parseAssayValue(raw: string, detectionLimitGpt?: number): Result<AssayValue> {
  if (typeof raw !== 'string' || raw.trim() === '') {
    return fail(engineError('empty', 'value', 'the assay value is empty'));
  }
  const text = raw.trim().replace(/\s+/g, '');
  const prefix = text[0] === '<' || text[0] === '>' ? text[0] : '';
  const digits = text.slice(prefix.length);
  if (!NUMBER_PATTERN.test(digits)) {
    return fail(engineError('not-parseable', 'value', `"${raw}" is not a number, <limit or >limit (use a point as the decimal mark)`));
  }
  const value = Number(digits);
  if (prefix === '<') {
    if (value <= 0) {
      return fail(engineError('not-positive', 'value', `"${raw}": a detection limit must be above zero`));
    }
    return ok({ valueGpt: value, isBelowDetection: true, isAboveRange: false, detectionLimitGpt: value, raw });
  }
  const belowStatedLimit = detectionLimitGpt !== undefined && prefix === '' && value < detectionLimitGpt;
  return ok({
    valueGpt: value,
    isBelowDetection: belowStatedLimit,
    isAboveRange: prefix === '>',
    detectionLimitGpt: detectionLimitGpt ?? null,
    raw,
  });
}

/** The number a value stands for in statistics, by the stated convention for censored values. */
export function valueForStatistics(value: AssayValue, convention: CensoredConvention = DEFAULT_CENSORED_CONVENTION): number {
  if (!value.isBelowDetection) {
    return value.valueGpt;
  }
  const limit = value.detectionLimitGpt ?? value.valueGpt;
  return convention === 'zero' ? 0 : convention === 'detection-limit' ? limit : limit / 2;
}

/** Outcome of one check. */
export type QcStatus = 'pass' | 'warn' | 'fail';

/** A field-duplicate pair compared. */
export interface DuplicateCheck {
  readonly meanGpt: number;
  /** |a − b| / mean, fraction. */
  readonly relativeDifference: number;
  /** |a − b| / (a + b), fraction. */
  readonly hard: number;
  readonly tolerance: number;
  readonly status: QcStatus;
  readonly note?: string;
}

/** Compares an original and its field duplicate (g/t) against a HARD tolerance (fraction). */
export function checkDuplicatePair(input: {
  readonly original: AssayValue;
  readonly duplicate: AssayValue;
  readonly tolerance?: number;
}): Result<DuplicateCheck> {
  const tolerance = input.tolerance ?? 0.3;
  const invalid = checkNumber('tolerance', tolerance, 'open-fraction');
  if (invalid) {
    return fail(invalid);
  }
  const { original, duplicate } = input;
  if (original.isBelowDetection && duplicate.isBelowDetection) {
    return ok({ meanGpt: 0, relativeDifference: 0, hard: 0, tolerance, status: 'pass', note: 'both below detection' });
  }
  const a = valueForStatistics(original);
  const b = valueForStatistics(duplicate);
  const sum = a + b;
  const hard = sum === 0 ? 0 : Math.abs(a - b) / sum;
  const note = original.isBelowDetection || duplicate.isBelowDetection ? 'one value below detection, taken at half the limit' : undefined;
  return ok({
    meanGpt: sum / 2,
    relativeDifference: 2 * hard,
    hard,
    tolerance,
    status: hard <= tolerance ? 'pass' : 'fail',
    ...(note ? { note } : {}),
  });
}

/** A blank checked against its detection limit. */
export interface BlankCheck {
  readonly valueGpt: number;
  readonly limitGpt: number;
  readonly multiple: number;
  readonly status: QcStatus;
}

/** Checks a blank: fails above `multiple` × detection limit (default 5, common practice). */
export function checkBlank(input: { readonly value: AssayValue; readonly detectionLimitGpt: number; readonly multiple?: number }): Result<BlankCheck> {
  const multiple = input.multiple ?? 5;
  const errors = checkNumbers([
    ['detectionLimitGpt', input.detectionLimitGpt, 'positive'],
    ['multiple', multiple, 'positive'],
  ]);
  if (errors.length > 0) {
    return fail(...errors);
  }
  const limitGpt = multiple * input.detectionLimitGpt;
  const valueGpt = input.value.isBelowDetection ? 0 : input.value.valueGpt;
  return ok({ valueGpt: input.value.valueGpt, limitGpt, multiple, status: valueGpt > limitGpt ? 'fail' : 'pass' });
}

/** A reference standard checked against its certified value. */
export interface StandardCheck {
  readonly zScore: number;
  readonly status: QcStatus;
  readonly reason: string;
}

/** Checks one standard: |z| ≤ 2 pass, 2–3 warn, > 3 fail. */
export function checkStandard(input: { readonly value: AssayValue; readonly expectedGpt: number; readonly sdGpt: number }): Result<StandardCheck> {
  const errors: EngineError[] = checkNumbers([
    ['expectedGpt', input.expectedGpt, 'positive'],
    ['sdGpt', input.sdGpt, 'positive'],
  ]);
  if (errors.length > 0) {
    return fail(...errors);
  }
  const zScore = (valueForStatistics(input.value) - input.expectedGpt) / input.sdGpt;
  const distance = Math.abs(zScore);
  if (distance > 3) return ok({ zScore, status: 'fail', reason: 'beyond 3 SD of the expected value' });
  if (distance > 2) return ok({ zScore, status: 'warn', reason: 'between 2 and 3 SD of the expected value' });
  return ok({ zScore, status: 'pass', reason: 'within 2 SD of the expected value' });
}

/** Checks a run of results of one standard, in assay order, adding the two-in-a-row (2-2s) rule. */
export function checkStandardSeries(input: {
  readonly values: readonly AssayValue[];
  readonly expectedGpt: number;
  readonly sdGpt: number;
}): Result<StandardCheck[]> {
  const checks: StandardCheck[] = [];
  for (const value of input.values) {
    const check = checkStandard({ value, expectedGpt: input.expectedGpt, sdGpt: input.sdGpt });
    if (!check.ok) {
      return check;
    }
    const previous = checks[checks.length - 1];
    const isSecondOnSameSide =
      previous !== undefined && Math.abs(previous.zScore) > 2 && Math.abs(check.value.zScore) > 2 && Math.sign(previous.zScore) === Math.sign(check.value.zScore);
    checks.push(
      isSecondOnSameSide && check.value.status !== 'fail'
        ? { zScore: check.value.zScore, status: 'fail', reason: 'second result in a row beyond 2 SD on the same side' }
        : check.value,
    );
  }
  return ok(checks);
}
