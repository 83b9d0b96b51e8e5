import { randomUUID } from 'node:crypto';
import request from 'supertest';
import { Membership } from '../../../../server/accounts/membership.model';
import { DEMO_ORGANIZATION, DEMO_PASSWORD, DEMO_PEOPLE } from '../../../../server/demo/demo-scenario';
import { Site } from '../../../../server/sites/site.model';
import type { TestApp } from '../../support/test-app';

/** A pile seeded for a shortlist test: a rectangle of corners (lon, lat), a cone height and weighed-gold pan tests. */
export interface SeededPile {
  readonly code: string;
  /** West, south, east, north edges in degrees; null for a pile with no footprint. */
  readonly box: readonly [number, number, number, number] | null;
  readonly heightM: number;
  readonly bulkDensityTPerM3: number;
  readonly moisturePct: number;
  /** Gold weighed from each sample's pan test (mg); each pans `massPannedKg` of dry material at efficiency 1. */
  readonly goldMassMg: readonly number[];
  readonly massPannedKg: number;
}

/** Tokens of the demo people, by role. */
export type Tokens = Record<'sampler' | 'geologist' | 'manager' | 'admin' | 'lab', string>;

/** Signs every demo person in. */
export async function signInAll(testApp: TestApp): Promise<Tokens> {
  const tokens = {} as Tokens;
  for (const person of DEMO_PEOPLE) {
    const response = await request(testApp.app).post('/api/auth/login').send({ email: person.email, password: DEMO_PASSWORD, deviceId: randomUUID(), deviceName: `${person.role} test` });
    tokens[person.role as keyof Tokens] = response.body.accessToken as string;
  }
  return tokens;
}

/** A new site with a processing point, of which the demo geologist and manager are members. */
export async function createMemberSite(testApp: TestApp, code: string, processing: { lat: number; lon: number }): Promise<string> {
  const siteId = randomUUID();
  const members = DEMO_PEOPLE.filter((person) => person.role === 'geologist' || person.role === 'manager');
  await testApp.database.transaction(async (transaction) => {
    await Site.create({ id: siteId, organizationId: DEMO_ORGANIZATION.id, code, name: `${code} test camp`, processingLat: processing.lat, processingLon: processing.lon, economics: null }, { transaction });
    for (const person of members) {
      await Membership.create({ id: randomUUID(), userId: person.id, siteId }, { transaction });
    }
  });
  return siteId;
}

let sequence = 0;

/** Pushes piles, samples and pan tests through sync as the geologist; returns pile ids by code. */
export async function pushPiles(testApp: TestApp, token: string, siteId: string, siteCode: string, piles: readonly SeededPile[]): Promise<Record<string, string>> {
  const ids: Record<string, string> = {};
  const mutations: Record<string, unknown>[] = [];
  const geologist = DEMO_PEOPLE.find((person) => person.role === 'geologist');
  for (const pile of piles) {
    const pileId = randomUUID();
    ids[pile.code] = pileId;
    const footprint = pile.box
      ? { type: 'Polygon', coordinates: [[[pile.box[0], pile.box[1]], [pile.box[2], pile.box[1]], [pile.box[2], pile.box[3]], [pile.box[0], pile.box[3]], [pile.box[0], pile.box[1]]]] }
      : null;
    mutations.push({
      mutationId: randomUUID(), entity: 'pile', id: pileId, op: 'upsert', baseRevision: null,
      data: {
        id: pileId, siteId, code: pile.code, material: 'mill-discharge', footprint, heightM: pile.heightM, shapeModel: 'cone', angleOfReposeDeg: 34,
        bulkDensityTPerM3: pile.bulkDensityTPerM3, moisturePct: pile.moisturePct, spotHeights: null, sackCount: null, sackMassKg: null, hazards: ['mercury'], notes: '',
      },
    });
    for (const goldMassMg of pile.goldMassMg) {
      sequence += 1;
      const sampleId = randomUUID();
      const centre = pile.box ? [(pile.box[0] + pile.box[2]) / 2, (pile.box[1] + pile.box[3]) / 2] : [0, 0];
      mutations.push({
        mutationId: randomUUID(), entity: 'sample', id: sampleId, op: 'upsert', baseRevision: null,
        data: {
          id: sampleId, pileId, code: `${siteCode}-09-${String(sequence).padStart(4, '0')}`, sampleType: 'routine', duplicateOfId: null, standardId: null,
          location: { type: 'Point', coordinates: centre }, gpsAccuracyM: 4, wetMassKg: 10, moisturePct: 0, increments: 8, position: 'mid-slope',
          collectedAt: '2025-05-02T08:00:00.000Z', collectorId: geologist?.id, deviceId: 'shortlist-test',
        },
      });
      const panTestId = randomUUID();
      mutations.push({
        mutationId: randomUUID(), entity: 'panTest', id: panTestId, op: 'upsert', baseRevision: null,
        data: { id: panTestId, sampleId, massPannedKg: pile.massPannedKg, colours: [], goldMassMg, panEfficiency: 1, testedAt: '2025-05-02T10:00:00.000Z' },
      });
    }
  }
  const response = await request(testApp.app).post('/api/sync/push').set('Authorization', `Bearer ${token}`).send({ deviceId: 'shortlist-test', mutations });
  const refused = (response.body.results as { status: string }[] | undefined)?.filter((result) => result.status !== 'applied') ?? [response.body];
  if (response.status !== 200 || refused.length > 0) {
    throw new Error(`seeding failed: ${response.status} ${JSON.stringify(refused).slice(0, 500)}`);
  }
  return ids;
}
