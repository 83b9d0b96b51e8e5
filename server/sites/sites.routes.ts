import { Router } from 'express';
import { z } from 'zod';
import { currentUser } from '../accounts/current-user';
import { assertCan } from '../accounts/policy';
import { parseOrThrow } from '../lib/validate';
import { siteEconomicsSchema } from './site-economics';
import type { SitesService } from './sites.service';

const noQuery = z.strictObject({});
const idParams = z.strictObject({ id: z.uuid('Not a site id') });
/** Codes start sample codes (`JR-07-0042`), so they are short capitals and digits. */
const codeSchema = z.string().regex(/^[A-Z][A-Z0-9]{1,7}$/, 'A code is 2–8 capital letters or digits, starting with a letter');
const siteFields = {
  code: codeSchema,
  name: z.string().trim().min(1, 'Required').max(200, 'At most 200 characters'),
  processingLat: z.number().min(-90).max(90).nullable().optional(),
  processingLon: z.number().min(-180).max(180).nullable().optional(),
  economics: siteEconomicsSchema.nullable().optional(),
};
const processingPointComplete = (site: { processingLat?: number | null; processingLon?: number | null }) =>
  (site.processingLat === undefined) === (site.processingLon === undefined) && (site.processingLat === null) === (site.processingLon === null);
const createBody = z.strictObject(siteFields).refine(processingPointComplete, { message: 'Give both latitude and longitude of the processing point, or neither', path: ['processingLat'] });
const changesBody = z
  .strictObject({ ...siteFields, code: codeSchema.optional(), name: siteFields.name.optional() })
  .refine((changes) => Object.keys(changes).length > 0, 'Say what to change')
  .refine(processingPointComplete, { message: 'Give both latitude and longitude of the processing point, or neither', path: ['processingLat'] });

/** `GET|POST /api/sites`, `GET|PATCH /api/sites/:id`. */
export function sitesRoutes(sites: SitesService): Router {
  const router = Router();

  router.get('/sites', async (request, response) => {
    const user = currentUser(request);
    parseOrThrow(noQuery, request.query, 'query');
    response.json({ items: await sites.list(user) });
  });

  router.post('/sites', async (request, response) => {
    const user = currentUser(request);
    assertCan(user, 'sites:manage');
    parseOrThrow(noQuery, request.query, 'query');
    response.status(201).json(await sites.create(user, parseOrThrow(createBody, request.body, 'site')));
  });

  router.get('/sites/:id', async (request, response) => {
    const user = currentUser(request);
    const { id } = parseOrThrow(idParams, request.params, 'site id');
    parseOrThrow(noQuery, request.query, 'query');
    response.json(await sites.get(user, id));
  });

  router.patch('/sites/:id', async (request, response) => {
    const user = currentUser(request);
    assertCan(user, 'sites:manage');
    const { id } = parseOrThrow(idParams, request.params, 'site id');
    parseOrThrow(noQuery, request.query, 'query');
    response.json(await sites.update(user, id, parseOrThrow(changesBody, request.body, 'site changes')));
  });

  return router;
}
