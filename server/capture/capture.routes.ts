import { Router, type RequestHandler } from 'express';
import { z } from 'zod';
import { SAMPLE_TYPES } from '../../shared/sync/protocol';
import { currentUser } from '../accounts/current-user';
import { parseOrThrow } from '../lib/validate';
import { SAMPLE_SORTS } from './capture.repository';
import type { CaptureService } from './capture.service';

/** Longest page the list routes return. */
const MAX_PAGE = 500;

const paging = {
  limit: z.coerce.number().int().min(1).max(MAX_PAGE).default(100),
  offset: z.coerce.number().int().min(0).default(0),
};
const pileIdSchema = z.object({ id: z.uuid() });
const pileListSchema = z.object({ siteId: z.uuid().optional(), ...paging }).strict();
const sampleListSchema = z
  .object({
    siteId: z.uuid().optional(),
    pileId: z.uuid().optional(),
    sampleType: z.enum(SAMPLE_TYPES).optional(),
    codePrefix: z.string().regex(/^[A-Z0-9-]{1,24}$/).optional(),
    collectedFrom: z.iso.datetime({ offset: true }).optional(),
    collectedTo: z.iso.datetime({ offset: true }).optional(),
    sort: z.enum(SAMPLE_SORTS).optional(),
    direction: z.enum(['asc', 'desc']).optional(),
    ...paging,
  })
  .strict()
  .refine((query) => query.direction === undefined || query.sort !== undefined, { path: ['direction'], message: 'A direction needs a sort column' });
/** A pile edit names the revision it was made on and the fields it changes (never id or site). */
const pilePatchSchema = z
  .object({
    baseRevision: z.number().int().min(0),
    changes: z.record(z.string(), z.unknown()).refine((changes) => !('id' in changes) && !('siteId' in changes), 'A pile keeps its id and site'),
  })
  .strict();

/** `GET /api/piles`, `GET|PATCH /api/piles/:id`, `GET /api/samples`. */
export function captureRoutes(capture: CaptureService, authenticate: RequestHandler): Router {
  const router = Router();

  router.get('/piles', authenticate, async (request, response) => {
    const filter = parseOrThrow(pileListSchema, request.query, 'query');
    response.json(await capture.listPiles(currentUser(request), filter));
  });

  router.get('/piles/:id', authenticate, async (request, response) => {
    const { id } = parseOrThrow(pileIdSchema, request.params, 'pile id');
    response.json(await capture.getPile(currentUser(request), id));
  });

  router.patch('/piles/:id', authenticate, async (request, response) => {
    const { id } = parseOrThrow(pileIdSchema, request.params, 'pile id');
    const { baseRevision, changes } = parseOrThrow(pilePatchSchema, request.body, 'pile edit');
    response.json(await capture.patchPile(currentUser(request), id, baseRevision, changes));
  });

  router.get('/samples', authenticate, async (request, response) => {
    const filter = parseOrThrow(sampleListSchema, request.query, 'query');
    response.json(await capture.listSamples(currentUser(request), filter));
  });

  return router;
}
