import { Router, type RequestHandler } from 'express';
import { z } from 'zod';
import { pullQuerySchema, pushRequestSchema, resolveConflictSchema } from '../../shared/sync/protocol';
import { currentUser } from '../accounts/current-user';
import { parseOrThrow } from '../lib/validate';
import type { SyncService } from './sync.service';

const conflictIdSchema = z.object({ id: z.uuid() });
const conflictListSchema = z.object({ status: z.enum(['open', 'resolved']).default('open') }).strict();
const deviceSchema = z.object({ deviceId: z.string().min(1).max(64) }).strict();

/** `POST /api/sync/push`, `GET /api/sync/pull`, conflicts and device numbers. */
export function syncRoutes(sync: SyncService, authenticate: RequestHandler): Router {
  const router = Router();

  router.post('/sync/push', authenticate, async (request, response) => {
    const body = parseOrThrow(pushRequestSchema, request.body, 'push');
    response.json(await sync.push(currentUser(request), body));
  });

  router.get('/sync/pull', authenticate, async (request, response) => {
    const { since, limit } = parseOrThrow(pullQuerySchema, request.query, 'query');
    response.setHeader('Cache-Control', 'no-store');
    response.json(await sync.pull(currentUser(request), since, limit));
  });

  router.get('/sync/conflicts', authenticate, async (request, response) => {
    const { status } = parseOrThrow(conflictListSchema, request.query, 'query');
    response.setHeader('Cache-Control', 'no-store');
    response.json({ items: await sync.listConflicts(currentUser(request), status) });
  });

  router.post('/sync/conflicts/:id/resolve', authenticate, async (request, response) => {
    const { id } = parseOrThrow(conflictIdSchema, request.params, 'conflict id');
    const resolution = parseOrThrow(resolveConflictSchema, request.body, 'resolution');
    response.json(await sync.resolveConflict(currentUser(request), id, resolution));
  });

  router.post('/sync/device', authenticate, async (request, response) => {
    const { deviceId } = parseOrThrow(deviceSchema, request.body, 'device');
    response.json(await sync.registerDevice(currentUser(request), deviceId));
  });

  return router;
}
