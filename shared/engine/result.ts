/**
 * How every engine function reports an expected failure: as a value, never a throw, so that the
 * field app and the API show the same message (STYLE.md: expected failures come back as values).
 * A function returns `Result<T>`; `ok: false` carries one or more `EngineError`s, each naming the
 * input field at fault. Throws are kept for programmer errors only (a broken invariant).
 */

/** The closed set of reasons an input is refused. */
export type EngineErrorCode =
  | 'not-a-number'
  | 'negative'
  | 'not-positive'
  | 'out-of-range'
  | 'empty'
  | 'too-few'
  | 'unknown-value'
  | 'degenerate-ring'
  | 'self-intersection'
  | 'holes-not-supported'
  | 'grade-order'
  | 'no-convergence'
  | 'not-parseable'
  | 'missing'
  | 'no-variation';

/** One refused input: a machine code, a sentence for people, and the field it concerns. */
export interface EngineError {
  readonly code: EngineErrorCode;
  readonly field: string;
  readonly message: string;
  readonly details?: Readonly<Record<string, unknown>>;
}

/** Something the user should know about an accepted input or a computed result. */
export interface EngineWarning {
  readonly code: string;
  readonly message: string;
}

/** A computed value, or the reasons it could not be computed. */
export type Result<T> =
  | { readonly ok: true; readonly value: T }
  | { readonly ok: false; readonly errors: readonly EngineError[] };

/** Wraps a computed value. */
export function ok<T>(value: T): Result<T> {
  return { ok: true, value };
}

/** Wraps one or more refusals. */
export function fail<T = never>(...errors: EngineError[]): Result<T> {
  return { ok: false, errors };
}

/** Builds one refusal. */
export function engineError(
  code: EngineErrorCode,
  field: string,
  message: string,
  details?: Readonly<Record<string, unknown>>,
): EngineError {
  return details === undefined ? { code, field, message } : { code, field, message, details };
}

/** Returns the value of a successful result or throws: for tests and already-validated data. */
export function unwrap<T>(result: Result<T>): T {
  if (result.ok) {
    return result.value;
  }
  throw new Error(`unexpected engine error: ${result.errors.map((error) => error.message).join('; ')}`);
}

/** A rule a numeric input must satisfy. */
export type NumberRule = 'finite' | 'non-negative' | 'positive' | 'fraction' | 'open-fraction' | 'percent-below-100';

/**
 * Checks one numeric input against a rule; undefined means the input is valid.
 * `fraction` is [0, 1], `open-fraction` is (0, 1], `percent-below-100` is [0, 100).
 */
export function checkNumber(field: string, value: unknown, rule: NumberRule = 'finite'): EngineError | undefined {
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    return engineError('not-a-number', field, `${field} must be a finite number (got ${String(value)})`);
  }
  switch (rule) {
    case 'finite':
      return undefined;
    case 'non-negative':
      return value < 0 ? engineError('negative', field, `${field} must not be negative (got ${value})`) : undefined;
    case 'positive':
      return value <= 0 ? engineError('not-positive', field, `${field} must be greater than zero (got ${value})`) : undefined;
    case 'fraction':
      return value < 0 || value > 1
        ? engineError('out-of-range', field, `${field} must be a fraction between 0 and 1 (got ${value})`)
        : undefined;
    case 'open-fraction':
      return value <= 0 || value > 1
        ? engineError('out-of-range', field, `${field} must be above 0 and at most 1 (got ${value})`)
        : undefined;
    case 'percent-below-100':
      return value < 0 || value >= 100
        ? engineError('out-of-range', field, `${field} must be at least 0 % and below 100 % (got ${value})`)
        : undefined;
  }
}

/** Checks several numeric inputs at once and keeps every refusal, so the user fixes them in one pass. */
export function checkNumbers(checks: ReadonlyArray<readonly [string, unknown, NumberRule?]>): EngineError[] {
  const errors: EngineError[] = [];
  for (const [field, value, rule] of checks) {
    const error = checkNumber(field, value, rule);
    if (error) {
      errors.push(error);
    }
  }
  return errors;
}
