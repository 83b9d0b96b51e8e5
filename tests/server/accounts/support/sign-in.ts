import type { Express } from 'express';
import request from 'supertest';
import { DEMO_PASSWORD } from '../../../../server/demo/demo-scenario';

/** Signs in over the API as a demo account (by role) and answers the tokens and profile. */
export async function signInAs(app: Express, role: string, extra: Record<string, unknown> = {}) {
  const response = await request(app)
    .post('/api/auth/login')
    .send({ email: `${role}@demo.heapsight.test`, password: DEMO_PASSWORD, ...extra })
    .expect(200);
  return response.body as { accessToken: string; refreshToken: string; user: { id: string; deviceId: string; siteIds: string[] } };
}
