import { Router } from 'express';
import { z } from 'zod';
import { currentUser } from '../accounts/current-user';
import { parseOrThrow } from '../lib/validate';
import type { QaqcService } from './qaqc.service';

const siteQuery = z.strictObject({ siteId: z.uuid() });
const siteParams = z.strictObject({ siteId: z.uuid() });
const calibrationSwitch = z.strictObject({ isApplied: z.boolean() });

/** `GET /api/qaqc?siteId=`, `GET /api/calibration?siteId=`, `PUT /api/calibration/:siteId`. */
export function qaqcRoutes(qaqc: QaqcService): Router {
  const router = Router();

  router.get('/qaqc', async (request, response) => {
    const { siteId } = parseOrThrow(siteQuery, request.query, 'query');
    response.json(await qaqc.siteQaqc(currentUser(request), siteId));
  });

  router.get('/calibration', async (request, response) => {
    const { siteId } = parseOrThrow(siteQuery, request.query, 'query');
    response.json(await qaqc.calibration(currentUser(request), siteId));
  });

  router.put('/calibration/:siteId', async (request, response) => {
    const { siteId } = parseOrThrow(siteParams, request.params, 'site id');
    const { isApplied } = parseOrThrow(calibrationSwitch, request.body, 'calibration switch');
    response.json(await qaqc.setCalibrationApplied(currentUser(request), siteId, isApplied));
  });

  return router;
}
