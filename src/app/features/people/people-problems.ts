import type { TranslocoService } from '@jsverse/transloco';
import type { ApiProblem } from '../../core/http/api-error';
import type { ProblemKeys } from '../sign-in/problem-text';

/** Refusals that mean the same on every part of this screen. */
const SCREEN_PROBLEMS: ProblemKeys = {
  forbidden: 'people.problems.forbidden',
  unauthenticated: 'people.problems.signIn',
  token_expired: 'people.problems.signIn',
  offline: 'people.problems.offline',
  internal: 'people.problems.internal',
};

/** A field the server found wrong, said in words for the field it names. */
const FIELD_PROBLEMS: Readonly<Record<string, string>> = {
  email: 'people.problems.email',
  name: 'people.problems.name',
  siteIds: 'people.problems.unknownSites',
  labName: 'people.problems.labName',
  code: 'people.problems.siteCode',
  processingLat: 'people.problems.latitude',
  processingLon: 'people.problems.longitude',
};

/**
 * A refusal on People & sites in the reader's language: `keys` says what a code means for the
 * action tried (a `conflict` on inviting is a taken address, on saving a site a taken code); a field
 * error is named by its field; anything else keeps the server's words and its first detail.
 */
export function peopleProblemText(transloco: TranslocoService, problem: ApiProblem, keys: ProblemKeys = {}, params?: Record<string, unknown>): string {
  const field = problem.code === 'validation_failed' ? problem.details[0]?.path : undefined;
  const key = (field !== undefined ? FIELD_PROBLEMS[field] : undefined) ?? keys[problem.code] ?? SCREEN_PROBLEMS[problem.code];
  if (key) return transloco.translate(key, params);
  return problem.details[0]?.message ? `${problem.message}: ${problem.details[0].message}` : problem.message;
}
