import { Router } from 'express';
import { z } from 'zod';
import { currentUser } from '../accounts/current-user';
import { parseOrThrow } from '../lib/validate';
import { economicsChangeSchema } from './economics-parameters';
import type { EconomicsService } from './economics.service';

const siteParams = z.strictObject({ siteId: z.uuid('the site is named by its id') });
const noQuery = z.strictObject({});

/** `GET /api/economics/:siteId` (parameters in force and their history), `PATCH` (managers set some). */
export function economicsRoutes(economics: EconomicsService): Router {
  const router = Router();

  router.get('/economics/:siteId', async (request, response) => {
    const { siteId } = parseOrThrow(siteParams, request.params, 'site id');
    parseOrThrow(noQuery, request.query, 'query');
    response.json(await economics.get(currentUser(request), siteId));
  });

  router.patch('/economics/:siteId', async (request, response) => {
    const user = currentUser(request);
    const { siteId } = parseOrThrow(siteParams, request.params, 'site id');
    const changes = parseOrThrow(economicsChangeSchema, request.body, 'economic parameters');
    response.json(await economics.update(user, siteId, changes));
  });

  return router;
}
