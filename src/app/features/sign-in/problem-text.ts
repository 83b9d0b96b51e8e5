import type { TranslocoService } from '@jsverse/transloco';
import type { ApiErrorCode, ApiProblem } from '../../core/http/api-error';

/** Translation keys for the refusals a screen knows how to explain, by the API's error code. */
export type ProblemKeys = Partial<Record<ApiErrorCode, string>>;

/**
 * A refusal in the reader's language. The API's codes are coarse, so each screen says what a code
 * means where it is shown (on the sign-in form `unauthenticated` is a wrong password); a code the
 * screen does not know keeps the server's own words, which are more precise than a guess.
 */
export function problemText(transloco: TranslocoService, problem: ApiProblem, keys: ProblemKeys, params?: Record<string, unknown>): string {
  const key = keys[problem.code];
  return key ? transloco.translate(key, params) : problem.message;
}
