import express, { type Express } from 'express';
import helmet from 'helmet';
import type { Logger } from 'pino';
import { pinoHttp } from 'pino-http';
import { authRoutes } from './accounts/auth.routes';
import { authenticate, installAuthentication } from './accounts/authenticate';
import { createAuthService } from './accounts/auth.service';
import { meRoutes } from './accounts/me.routes';
import { createPeopleService } from './accounts/people.service';
import { peopleRoutes } from './accounts/people.routes';
import { requireSignInFor } from './accounts/route-table';
import type { Database } from './db/database';
import { healthRoutes } from './health/health.routes';
import { labLoopRoutes } from './lab/lab.component';
import { labelRoutes } from './labels/labels.component';
import type { Config } from './lib/config';
import { apiNotFound, errorMiddleware } from './lib/errors';
import { refuseInvalidUtf8 } from './lib/validate';
import { createMailService } from './mail/mail.service';
import { outboxRoutes } from './mail/outbox.routes';
import { createReviewRoutes } from './review/review.component';
import { clientConfigRoutes } from './review/review.routes';
import { trialsEconomicsShortlistRoutes } from './shortlist/shortlist.component';
import { createSitesService } from './sites/sites.service';
import { sitesRoutes } from './sites/sites.routes';
import { captureSyncRoutes, createCaptureSyncServices } from './sync/capture-sync.component';
import { staticApp } from './web/static-app';

/** What the app needs from the outside world; tests pass their own. */
export interface AppContext {
  readonly config: Config;
  readonly database: Database;
  readonly logger: Logger;
}

/** JSON bodies are small records; photos and CSV files go through multer with their own limits. */
const JSON_BODY_LIMIT = '2mb';

/** Builds the Express app. Only main.ts listens, so tests can run it in process. */
export function createApp(context: AppContext): Express {
  const { config, database, logger } = context;
  if (!config.jwtSecret) {
    throw new Error('JWT_SECRET is required: set it to a random string of 32 or more characters');
  }
  const publicUrl = config.publicUrl ?? `http://${config.host}:${config.port}`;
  const mail = createMailService(context);
  const auth = createAuthService({ database, jwtSecret: config.jwtSecret, mail, publicUrl });

  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', 'loopback');
  app.use(helmet({ contentSecurityPolicy: { directives: contentSecurityPolicy(config) } }));
  app.use(pinoHttp({ logger, autoLogging: { ignore: (request) => !request.url?.startsWith('/api/') } }));

  installAuthentication(app, config.jwtSecret);

  // Public routes: health and signing in.
  const api = express.Router();
  api.use(express.json({ limit: JSON_BODY_LIMIT, strict: true, verify: refuseInvalidUtf8 }));
  api.use(healthRoutes(database));
  api.use(authRoutes(auth, logger));
  api.use(clientConfigRoutes(config));

  // Every route mounted on `signedIn` requires a valid access token (the wall answers 401 before
  // the route runs; unknown paths still get their 404). Mount new components here, and give each
  // of their routes a rule in tests/server/permissions/route-rules.ts.
  const signedIn = express.Router();
  signedIn.use(meRoutes(database));
  signedIn.use(sitesRoutes(createSitesService({ database })));
  signedIn.use(peopleRoutes(createPeopleService({ database, mail, publicUrl })));
  signedIn.use(outboxRoutes());
  signedIn.use(labLoopRoutes({ database, mail }));
  signedIn.use(captureSyncRoutes(createCaptureSyncServices(context), authenticate));
  signedIn.use(trialsEconomicsShortlistRoutes({ database, mail }));
  signedIn.use(createReviewRoutes(context));
  signedIn.use(labelRoutes(database));
  api.use(requireSignInFor(signedIn));
  api.use(signedIn);
  api.use(apiNotFound);
  app.use('/api', api);

  app.use(staticApp(config.staticDir));
  app.use(errorMiddleware(logger));
  return app;
}

/**
 * No inline script anywhere; styles allow inline because Angular injects component styles at run
 * time. Images may come from blobs (photos on the device) and the optional tile server.
 */
function contentSecurityPolicy(config: Config): Record<string, string[]> {
  const tileOrigin = config.mapTileUrl ? [new URL(config.mapTileUrl.replace(/\{[^}]+\}/g, '0')).origin] : [];
  return {
    'default-src': ["'self'"],
    'script-src': ["'self'"],
    'style-src': ["'self'", "'unsafe-inline'"],
    'img-src': ["'self'", 'data:', 'blob:', ...tileOrigin],
    'font-src': ["'self'"],
    'connect-src': ["'self'"],
    'worker-src': ["'self'", 'blob:'],
    'manifest-src': ["'self'"],
    'object-src': ["'none'"],
    'base-uri': ["'self'"],
    'form-action': ["'self'"],
    'frame-ancestors': ["'none'"],
  };
}
