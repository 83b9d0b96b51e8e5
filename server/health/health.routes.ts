import { Router } from 'express';
import packageJson from '../../package.json';
import type { Database } from '../db/database';

/** `GET /api/health`: up, which version, and whether the database answers. */
export function healthRoutes(database: Database): Router {
  const router = Router();
  router.get('/health', async (_request, response) => {
    const db = await database.sequelize
      .query('SELECT 1')
      .then(() => 'ok' as const)
      .catch(() => 'down' as const);
    response.status(db === 'ok' ? 200 : 503).json({ status: db === 'ok' ? 'ok' : 'degraded', version: packageJson.version, db });
  });
  return router;
}
