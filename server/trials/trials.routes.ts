import { Router } from 'express';
import { z } from 'zod';
import { currentUser } from '../accounts/current-user';
import { parseOrThrow } from '../lib/validate';
import { trialInputSchema, trialListQuerySchema, trialStatusSchema } from './trial-schemas';
import type { TrialsService } from './trials.service';

const idParams = z.strictObject({ id: z.uuid('a trial is named by its id') });

/** `GET /api/trials?site=…`, `POST /api/trials`, `PATCH /api/trials/:id` (accept or reject). */
export function trialsRoutes(trials: TrialsService): Router {
  const router = Router();

  router.get('/trials', async (request, response) => {
    const user = currentUser(request);
    const { site } = parseOrThrow(trialListQuerySchema, request.query, 'query');
    response.json(await trials.list(user, site));
  });

  router.post('/trials', async (request, response) => {
    const user = currentUser(request);
    const input = parseOrThrow(trialInputSchema, request.body, 'trial');
    response.status(201).json(await trials.create(user, input));
  });

  router.patch('/trials/:id', async (request, response) => {
    const user = currentUser(request);
    const { id } = parseOrThrow(idParams, request.params, 'trial id');
    const { status } = parseOrThrow(trialStatusSchema, request.body, 'trial status');
    response.json(await trials.setStatus(user, id, status));
  });

  return router;
}
