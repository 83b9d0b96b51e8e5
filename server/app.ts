import express, { type Express } from 'express';
import helmet from 'helmet';
import type { Logger } from 'pino';
import { pinoHttp } from 'pino-http';
import type { Database } from './db/database';
import { healthRoutes } from './health/health.routes';
import type { Config } from './lib/config';
import { apiNotFound, errorMiddleware } from './lib/errors';
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
  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', 'loopback');
  app.use(helmet({ contentSecurityPolicy: { directives: contentSecurityPolicy(config) } }));
  app.use(pinoHttp({ logger, autoLogging: { ignore: (request) => !request.url?.startsWith('/api/') } }));

  const api = express.Router();
  api.use(express.json({ limit: JSON_BODY_LIMIT, strict: true }));
  api.use(healthRoutes(database));
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
