import { Router } from 'express';
import type { Logger } from 'pino';
import { parseOrThrow } from '../lib/validate';
import { forgotPasswordBody, linkBody, loginBody, noQuery, refreshBody, setPasswordBody } from './account-schemas';
import type { AuthService } from './auth.service';
import { createAuthRateLimits } from './rate-limits';

/**
 * The public sign-in routes under /api/auth (no access token needed):
 * login, refresh, logout, forgot password, and the e-mailed password link.
 */
export function authRoutes(auth: AuthService, logger: Logger): Router {
  const router = Router();
  const limits = createAuthRateLimits();

  router.post('/auth/login', limits.loginPerIp, limits.loginPerAccount, async (request, response) => {
    parseOrThrow(noQuery, request.query, 'query');
    const input = parseOrThrow(loginBody, request.body, 'sign-in');
    response.json(await auth.signIn(input));
  });

  router.post('/auth/refresh', async (request, response) => {
    parseOrThrow(noQuery, request.query, 'query');
    const { refreshToken } = parseOrThrow(refreshBody, request.body, 'refresh');
    response.json(await auth.refresh(refreshToken));
  });

  router.post('/auth/logout', async (request, response) => {
    parseOrThrow(noQuery, request.query, 'query');
    const { refreshToken } = parseOrThrow(refreshBody, request.body, 'sign-out');
    await auth.signOut(refreshToken);
    response.status(204).end();
  });

  router.post('/auth/password-reset', limits.passwordLinksPerIp, async (request, response) => {
    parseOrThrow(noQuery, request.query, 'query');
    const { email } = parseOrThrow(forgotPasswordBody, request.body, 'request');
    const { mailSent } = await auth.requestPasswordReset(email);
    mailSent.catch((error: unknown) => logger.error({ err: error }, 'password-reset e-mail failed'));
    response.status(202).json({ message: 'If that address has an account, a link to set a new password is on its way' });
  });

  router.post('/auth/link', limits.passwordLinksPerIp, async (request, response) => {
    parseOrThrow(noQuery, request.query, 'query');
    const { token } = parseOrThrow(linkBody, request.body, 'link');
    response.json(await auth.describeLink(token));
  });

  router.post('/auth/password', limits.passwordLinksPerIp, async (request, response) => {
    parseOrThrow(noQuery, request.query, 'query');
    const { token, password } = parseOrThrow(setPasswordBody, request.body, 'new password');
    response.json(await auth.setPassword(token, password));
  });

  return router;
}
