import { randomUUID } from 'node:crypto';
import request from 'supertest';
import { IF, JR, makeSamples, person, tokenFor } from '../lab/support/lab-fixtures';
import { createTestApp, type TestApp } from '../support/test-app';

/**
 * `GET /api/review/sites/:siteId?view=map` is what the site map loads: the full review cut to the
 * fields the map draws, each sample one row of five values. These pin the shape, and that every
 * value is the full review's.
 */
let testApp: TestApp;
let geologist: string;

beforeAll(async () => {
  testApp = await createTestApp();
  geologist = await tokenFor(testApp.app, 'geologist');
  // A pile of one graded sample, then a sample with no location, which the map lists with null coordinates.
  const made = await makeSamples(testApp.app, geologist, [{ panGpt: 0.7 }]);
  const id = randomUUID();
  const data = {
    id, pileId: made.pileId, code: `${made.codes[0]}1`, sampleType: 'routine', duplicateOfId: null, standardId: null, location: null, gpsAccuracyM: null,
    wetMassKg: 3, moisturePct: null, increments: 8, position: 'toe', collectedAt: '2026-06-01T09:00:00.000Z', collectorId: person('geologist').id, deviceId: 'map-tests',
  };
  const pushed = await request(testApp.app).post('/api/sync/push').set('Authorization', `Bearer ${geologist}`)
    .send({ deviceId: 'map-tests', mutations: [{ mutationId: randomUUID(), entity: 'sample', id, op: 'upsert', baseRevision: null, data }] }).expect(200);
  expect(pushed.body.results[0].status).toBe('applied');
});
afterAll(() => testApp.close());

const get = (url: string, token = geologist) => request(testApp.app).get(url).set('Authorization', `Bearer ${token}`);

interface FullSample { id: string; code: string; sampleType: string; location: { coordinates: [number, number] } | null; gradeGpt: number | null }
interface FullPile { pile: { id: string; code: string; material: string; footprint: unknown }; estimate: { dryTonnes: number; containedAuG: number | null; grade: unknown } | null }

describe('GET /api/review/sites/:siteId?view=map', () => {
  it('answers the site, the image, the piles and one five-value row per sample, and nothing else', async () => {
    const map = (await get(`/api/review/sites/${JR.id}?view=map`).expect(200)).body;

    expect(Object.keys(map).sort()).toEqual(['image', 'piles', 'sampleFields', 'samples', 'site']);
    expect(map.sampleFields).toEqual(['code', 'sampleType', 'lon', 'lat', 'gradeGpt']);
    expect(map.site).toEqual({ id: JR.id, code: JR.code, name: JR.name });
    for (const row of map.piles) {
      expect(Object.keys(row).sort()).toEqual(['estimate', 'pile']);
      expect(Object.keys(row.pile).sort()).toEqual(['code', 'footprint', 'id', 'material']);
      if (row.estimate) expect(Object.keys(row.estimate).sort()).toEqual(['containedAuG', 'dryTonnes', 'grade']);
    }
    for (const sample of map.samples) {
      expect(sample).toHaveLength(5);
    }
  });

  it('holds the same piles, samples, order, places and grades as the full review', async () => {
    const [full, map] = await Promise.all([get(`/api/review/sites/${JR.id}`).expect(200), get(`/api/review/sites/${JR.id}?view=map`).expect(200)]);
    const samples = full.body.samples as FullSample[];
    const piles = full.body.piles as FullPile[];

    expect(samples.length).toBeGreaterThan(40);
    expect(samples.some((sample) => sample.location === null)).toBe(true);
    expect(map.body.samples).toEqual(samples.map((sample) => [
      sample.code, sample.sampleType, sample.location?.coordinates[0] ?? null, sample.location?.coordinates[1] ?? null, sample.gradeGpt,
    ]));
    expect(map.body.piles).toEqual(piles.map(({ pile, estimate }) => ({
      pile: { id: pile.id, code: pile.code, material: pile.material, footprint: pile.footprint },
      estimate: estimate && { dryTonnes: estimate.dryTonnes, containedAuG: estimate.containedAuG, grade: estimate.grade },
    })));
    expect(map.body.image).toEqual(full.body.image);
    // Some 60 bytes a sample instead of some 800.
    expect(map.text.length).toBeLessThan(full.text.length / 5);
  });

  it('refuses a view it does not know and any other query with 400, a site of no membership with 404', async () => {
    const unknown = await get(`/api/review/sites/${JR.id}?view=points`).expect(400);
    expect(unknown.body.error.code).toBe('validation_failed');
    await get(`/api/review/sites/${JR.id}?view=map&limit=5`).expect(400);
    const sampler = await tokenFor(testApp.app, 'sampler');
    const outside = await get(`/api/review/sites/${IF.id}?view=map`, sampler).expect(404);
    expect(outside.body.samples).toBeUndefined();
  });
});
