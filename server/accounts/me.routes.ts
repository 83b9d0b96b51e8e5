import { Router } from 'express';
import { z } from 'zod';
import type { Database } from '../db/database';
import { AppError } from '../lib/errors';
import { parseOrThrow } from '../lib/validate';
import { deviceNameSchema, noQuery } from './account-schemas';
import { loadProfile } from './accounts.repository';
import { currentUser } from './current-user';
import { Device } from './device.model';

const deviceBody = z.strictObject({ name: deviceNameSchema });

/** `GET /api/me` (the profile the client caches) and `PATCH /api/me/device` (rename this device). */
export function meRoutes(database: Database): Router {
  const router = Router();

  router.get('/me', async (request, response) => {
    const user = currentUser(request);
    parseOrThrow(noQuery, request.query, 'query');
    response.json(await loadProfile(user));
  });

  router.patch('/me/device', async (request, response) => {
    const user = currentUser(request);
    parseOrThrow(noQuery, request.query, 'query');
    const { name } = parseOrThrow(deviceBody, request.body, 'device');
    const deviceId = user.deviceId;
    if (!deviceId) {
      throw new AppError('conflict', 'This sign-in has no device; sign in again from the device to name it');
    }
    await database.transaction(async (transaction) => {
      const [updated] = await Device.update({ name }, { where: { id: deviceId, userId: user.id }, transaction });
      if (updated === 0) {
        throw new AppError('conflict', 'This device now belongs to someone else; sign in again to use it');
      }
    });
    response.json(await loadProfile(user));
  });

  return router;
}
