import express, { type Express, type RequestHandler } from 'express';
import { randomUUID } from 'node:crypto';
import request from 'supertest';
import type { CurrentUser } from '../../../../server/accounts/current-user';
import { Membership } from '../../../../server/accounts/membership.model';
import { User } from '../../../../server/accounts/user.model';
import { DEMO_PEOPLE, DEMO_SITES } from '../../../../server/demo/demo-scenario';
import { AppError, errorMiddleware } from '../../../../server/lib/errors';
import { createLogger } from '../../../../server/lib/logger';
import { captureSyncRoutes, createCaptureSyncServices, type CaptureSyncServices } from '../../../../server/sync/capture-sync.component';
import type { Mutation, PanTestData, PileData, PhotoData, SampleData } from '../../../../shared/sync/protocol';
import { createTestApp, type TestApp } from '../../support/test-app';

export const JR = DEMO_SITES[0];
export const IF = DEMO_SITES[1];
export const person = (role: string) => DEMO_PEOPLE.find((candidate) => candidate.role === role) as (typeof DEMO_PEOPLE)[number];

/** Loads a demo person as the authentication middleware would (fresh from the database). */
export async function loadUser(email: string, deviceId: string | null = null): Promise<CurrentUser> {
  const user = await User.findOne({ where: { email } });
  if (!user) {
    throw new Error(`no user ${email}`);
  }
  const memberships = await Membership.findAll({ where: { userId: user.id } });
  return {
    id: user.id, organizationId: user.organizationId, email: user.email, name: user.name, role: user.role,
    labName: user.labName, siteIds: memberships.map((membership) => membership.siteId), deviceId,
  };
}

/**
 * The capture and sync routes over a fresh demo database. Requests sign in by naming a demo user
 * in `x-test-user`, standing in for the bearer token; a request without it gets the real 401.
 */
export interface SyncTestApp extends TestApp {
  readonly syncApp: Express;
  readonly services: CaptureSyncServices;
  as(role: string): { post(path: string): request.Test; get(path: string): request.Test; put(path: string): request.Test; patch(path: string): request.Test };
}

export async function createSyncTestApp(): Promise<SyncTestApp> {
  const base = await createTestApp();
  const logger = createLogger('silent');
  const services = createCaptureSyncServices({ config: base.config, database: base.database, logger });
  const signIn: RequestHandler = async (incoming, _response, next) => {
    const email = incoming.header('x-test-user');
    if (!email) {
      next(new AppError('unauthenticated', 'Sign in to continue'));
      return;
    }
    incoming.user = await loadUser(email, incoming.header('x-test-device') ?? null);
    next();
  };
  const syncApp = express();
  syncApp.use(express.json({ limit: '2mb' }));
  syncApp.use('/api', captureSyncRoutes(services, signIn));
  syncApp.use(errorMiddleware(logger));
  const as = (role: string) => {
    const email = person(role).email;
    const agent = request(syncApp);
    return {
      post: (path: string) => agent.post(path).set('x-test-user', email),
      get: (path: string) => agent.get(path).set('x-test-user', email),
      put: (path: string) => agent.put(path).set('x-test-user', email),
      patch: (path: string) => agent.patch(path).set('x-test-user', email),
    };
  };
  return {
    ...base,
    syncApp,
    services,
    as,
    async close() {
      await services.imageJobs.idle();
      await base.close();
    },
  };
}

/** Valid records in the demo's JR site; each test changes what it tests. */
let pileSequence = 0;
export function newPile(overrides: Partial<PileData> = {}): PileData {
  pileSequence += 1;
  return {
    id: randomUUID(), siteId: JR.id, code: `JR-07-P${String(pileSequence).padStart(4, '0')}`, material: 'sluice-tailings',
    footprint: { type: 'Polygon', coordinates: [[[33.4521, -4.0515], [33.4525, -4.0515], [33.4525, -4.0519], [33.4521, -4.0519], [33.4521, -4.0515]]] },
    heightM: 2.4, shapeModel: 'cone', angleOfReposeDeg: 34, bulkDensityTPerM3: null, moisturePct: 6, spotHeights: null,
    sackCount: null, sackMassKg: null, hazards: ['mercury'], notes: 'Owner: cooperative', ...overrides,
  };
}

let sampleSequence = 0;
export function newSample(pileId: string, overrides: Partial<SampleData> = {}): SampleData {
  sampleSequence += 1;
  return {
    id: randomUUID(), pileId, code: `JR-07-${String(sampleSequence).padStart(4, '0')}`, sampleType: 'routine', duplicateOfId: null,
    standardId: null, location: { type: 'Point', coordinates: [33.4523, -4.0517] }, gpsAccuracyM: 4.5, wetMassKg: 11.2, moisturePct: 8,
    increments: 10, position: 'mid-slope', collectedAt: '2025-03-04T08:15:00.000Z', collectorId: person('sampler').id, deviceId: 'device-a', ...overrides,
  };
}

export function newPanTest(sampleId: string, overrides: Partial<PanTestData> = {}): PanTestData {
  return {
    id: randomUUID(), sampleId, massPannedKg: 2, colours: [{ sizeClass: 'fine', count: 14 }, { sizeClass: 'very-fine', count: 30 }],
    goldMassMg: null, panEfficiency: null, testedAt: '2025-03-04T10:00:00.000Z', ...overrides,
  };
}

export function newPhoto(ownerId: string, overrides: Partial<PhotoData> = {}): PhotoData {
  return {
    id: randomUUID(), ownerEntity: 'sample', ownerId, contentType: 'image/jpeg', originalWidth: 640, originalHeight: 480,
    byteSize: 11830, takenAt: '2025-03-04T08:16:00.000Z', ...overrides,
  };
}

/** A mutation that creates or updates a record. */
export function upsert<T extends { id: string }>(entity: Mutation["entity"], data: T, baseRevision: number | null = null): Mutation {
  return { mutationId: randomUUID(), entity, id: data.id, op: 'upsert', baseRevision, data };
}
