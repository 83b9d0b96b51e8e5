import { Router } from 'express';
import { z } from 'zod';
import { currentUser } from '../accounts/current-user';
import { parseOrThrow } from '../lib/validate';
import { samplesCsv } from './exports.service';

const samplesQuery = z.strictObject({ site: z.string().trim().regex(/^([0-9a-fA-F-]{36}|[A-Za-z0-9]{1,8})$/, 'a site id or code') });

/** `GET /api/exports/samples.csv?site=<id or code>`. */
export function exportsRoutes(): Router {
  const router = Router();
  router.get('/exports/samples.csv', async (request, response) => {
    const { site } = parseOrThrow(samplesQuery, request.query, 'query');
    const { fileName, csv } = await samplesCsv(currentUser(request), site);
    response.setHeader('Content-Type', 'text/csv; charset=utf-8');
    response.setHeader('Content-Disposition', `attachment; filename="${fileName}"`);
    response.send(csv);
  });
  return router;
}
