import { createSecretKey } from 'node:crypto';
import type { Express, RequestHandler } from 'express';
import { TokenExpiredError } from 'jsonwebtoken';
import { Passport } from 'passport';
import { ExtractJwt, Strategy as JwtStrategy } from 'passport-jwt';
import { AppError } from '../lib/errors';
import { loadCurrentUser } from './accounts.repository';
import type { AccessPayload } from './tokens';
import { TOKEN_ALGORITHM, TOKEN_AUDIENCE, TOKEN_ISSUER } from './tokens';

/** Where the app keeps its own passport instance, so two apps in one process never share one. */
const AUTHENTICATOR_KEY = 'heapsightAuthenticator';

/** Why a bearer token was not accepted, passed from the strategy to the middleware. */
const NO_LONGER_VALID = 'no-longer-valid';

/**
 * Gives the app a passport instance with the JWT strategy: bearer token, HS256 only, issuer and
 * audience checked, and the user loaded fresh from the database on every request.
 */
export function installAuthentication(app: Express, secret: string): void {
  const authenticator = new Passport();
  authenticator.use(
    'jwt',
    new JwtStrategy(
      {
        jwtFromRequest: ExtractJwt.fromAuthHeaderAsBearerToken(),
        // A key object made once from the same bytes: given the string, jsonwebtoken first tries it
        // as a PEM public key on every request, and that thrown error cost about 1 ms a request under
        // load. passport-jwt hands the key to jsonwebtoken's verify as is; its types only say string | Buffer.
        secretOrKey: createSecretKey(Buffer.from(secret)) as unknown as Buffer,
        algorithms: [TOKEN_ALGORITHM],
        issuer: TOKEN_ISSUER,
        audience: TOKEN_AUDIENCE,
      },
      (payload: Partial<AccessPayload>, done: (error: unknown, user?: Express.User | false, info?: unknown) => void) => {
        if (typeof payload.sub !== 'string' || typeof payload.sid !== 'string') {
          done(null, false, NO_LONGER_VALID);
          return;
        }
        const deviceId = typeof payload.did === 'string' ? payload.did : null;
        loadCurrentUser(payload.sub, payload.sid, deviceId).then(
          (user) => done(null, user ?? false, NO_LONGER_VALID),
          (error: unknown) => done(error),
        );
      },
    ),
  );
  app.locals[AUTHENTICATOR_KEY] = authenticator;
}

/**
 * Requires a valid access token: sets `request.user` to the CurrentUser loaded fresh from the
 * database, or answers 401 with `token_expired` (the client refreshes and retries) or
 * `unauthenticated` (anything else). Running it twice on one request costs nothing.
 */
export const authenticate: RequestHandler = (request, response, next) => {
  if (request.user) {
    next();
    return;
  }
  const authenticator = request.app.locals[AUTHENTICATOR_KEY] as InstanceType<typeof Passport> | undefined;
  if (!authenticator) {
    next(new AppError('internal', 'Authentication is not set up'));
    return;
  }
  const handler = authenticator.authenticate('jwt', { session: false }, (error: unknown, user: Express.User | false, info: unknown) => {
    if (error) {
      next(error);
    } else if (!user) {
      next(info instanceof TokenExpiredError
        ? new AppError('token_expired', 'Your sign-in has timed out; refresh it')
        : new AppError('unauthenticated', info === NO_LONGER_VALID ? 'Your sign-in is no longer valid; sign in again' : 'Sign in to continue'));
    } else {
      request.user = user;
      next();
    }
  }) as RequestHandler;
  handler(request, response, next);
};
