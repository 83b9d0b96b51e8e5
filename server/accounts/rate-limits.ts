import type { RequestHandler } from 'express';
import { rateLimit } from 'express-rate-limit';
import { AppError } from '../lib/errors';

/** One window for every limit: long enough to slow guessing, short enough to forgive a typo. */
const WINDOW_MS = 15 * 60 * 1000;
/** Failed sign-ins per address per window: a whole camp may share one satellite link's address. */
export const LOGIN_FAILURES_PER_IP = 30;
/** Failed sign-ins per account per window: a person mistyping never gets near it, guessing does. */
export const LOGIN_FAILURES_PER_ACCOUNT = 5;
/** Password-link requests (forgot password, open link, set password) per address per window. */
export const PASSWORD_LINK_REQUESTS_PER_IP = 20;

function refuse(message: string): RequestHandler {
  return (_request, response, next) => {
    const retryAfter = Number(response.getHeader('retry-after')) || Math.ceil(WINDOW_MS / 1000);
    next(new AppError('rate_limited', message, { retryAfterSeconds: retryAfter }));
  };
}

/**
 * The limiters for the sign-in routes, made per app so each app (and each test) counts alone.
 * Counts live in memory: one server process is the deployment this is built for.
 */
export function createAuthRateLimits() {
  const common = { windowMs: WINDOW_MS, standardHeaders: 'draft-8', legacyHeaders: false } as const;
  return {
    loginPerIp: rateLimit({
      ...common, limit: LOGIN_FAILURES_PER_IP, skipSuccessfulRequests: true,
      handler: refuse('Too many failed sign-ins from this network; wait 15 minutes and try again'),
    }),
    loginPerAccount: rateLimit({
      ...common, limit: LOGIN_FAILURES_PER_ACCOUNT, skipSuccessfulRequests: true, identifier: 'login-account',
      // Only a wrong password counts against the account; a malformed request never reached it.
      requestWasSuccessful: (_request, response) => response.statusCode !== 401,
      // The submitted address, normalised as the login schema does; no account lookup, so the
      // answer is the same for addresses that exist and those that do not.
      keyGenerator: (request) => `account:${String((request.body as { email?: unknown } | undefined)?.email).trim().toLowerCase()}`,
      skip: (request) => typeof (request.body as { email?: unknown } | undefined)?.email !== 'string',
      handler: refuse('Too many failed sign-ins for this account; wait 15 minutes and try again'),
    }),
    passwordLinksPerIp: rateLimit({
      ...common, limit: PASSWORD_LINK_REQUESTS_PER_IP,
      handler: refuse('Too many password requests from this network; wait 15 minutes and try again'),
    }),
  };
}
