import { randomUUID } from 'node:crypto';
import request from 'supertest';
import { DEMO_ORGANIZATION, DEMO_PEOPLE, DEMO_SITES } from '../../../server/demo/demo-scenario';
import { Pile } from '../../../server/capture/pile.model';
import { Site } from '../../../server/sites/site.model';
import { signInAs } from '../accounts/support/sign-in';
import { createTestApp, type TestApp } from '../support/test-app';
import { push, squareFootprint } from './support/review-fixtures';

/**
 * The estimate of a pile is worked out by the server from what is stored. The expected values here
 * are computed by hand from the closed forms, not by calling the engine.
 */
let testApp: TestApp;
let geologist: string;
let sampler: string;
const JR = DEMO_SITES[0].id;
const IF = DEMO_SITES[1].id;
const geologistId = DEMO_PEOPLE.find((person) => person.role === 'geologist')?.id as string;
let sequence = 0;

beforeAll(async () => {
  testApp = await createTestApp();
  geologist = (await signInAs(testApp.app, 'geologist')).accessToken;
  sampler = (await signInAs(testApp.app, 'sampler')).accessToken;
});

afterAll(() => testApp.close());

const code = (siteCode: string, prefix = '') => `${siteCode}-42-${prefix}${String((sequence += 1)).padStart(4, '0')}`;

function pileRecord(siteId: string, siteCode: string, changes: Record<string, unknown> = {}) {
  return {
    id: randomUUID(), siteId, code: code(siteCode, 'P'), material: 'sluice-tailings', footprint: squareFootprint(33.4518, -4.0512, 20),
    heightM: 2, shapeModel: 'flat-topped', angleOfReposeDeg: 45, bulkDensityTPerM3: 1.8, moisturePct: 10,
    spotHeights: null, sackCount: null, sackMassKg: null, hazards: ['mercury'], notes: '', ...changes,
  };
}

function sampleRecord(pileId: string, siteCode: string, sampleType = 'routine') {
  return {
    id: randomUUID(), pileId, code: code(siteCode), sampleType, duplicateOfId: null, standardId: sampleType === 'standard' ? 'STD-1' : null,
    location: { type: 'Point', coordinates: [33.4518, -4.0512] }, gpsAccuracyM: 4, wetMassKg: 12, moisturePct: null, increments: 8,
    position: 'toe', collectedAt: '2026-03-02T08:00:00Z', collectorId: geologistId, deviceId: 'review-test-device',
  };
}

/** A pan test of 10 kg with weighed gold: grade = mg / (kg × efficiency) when the sample is dry. */
function panTestRecord(sampleId: string, goldMassMg: number) {
  return { id: randomUUID(), sampleId, massPannedKg: 10, colours: [], goldMassMg, panEfficiency: 0.8, testedAt: '2026-03-02T09:00:00Z' };
}

/** A flat-topped pile on a 20 m square with four pan-tested routine samples and one blank. */
async function seedPile(siteId: string = JR, siteCode = 'JR') {
  const pile = pileRecord(siteId, siteCode);
  const goldMg = [8, 16, 24, 40];
  const samples = goldMg.map(() => sampleRecord(pile.id, siteCode));
  const blank = sampleRecord(pile.id, siteCode, 'blank');
  const results = await push(testApp.app, geologist, [
    { entity: 'pile', data: pile },
    ...[...samples, blank].map((sample) => ({ entity: 'sample', data: sample })),
    ...samples.map((sample, index) => ({ entity: 'panTest', data: panTestRecord(sample.id, goldMg[index]) })),
    { entity: 'panTest', data: panTestRecord(blank.id, 0) },
  ]);
  expect(results.map((result) => result.status)).toEqual(results.map(() => 'applied'));
  return { pile, gradesGpt: goldMg.map((mg) => mg / (10 * 0.8)) };
}

describe('GET /api/piles/:id/estimate', () => {
  describe('for a seeded flat-topped pile', () => {
    it('gives area, frustum volume, dry tonnes, grade statistics and contained gold that agree with the closed forms', async () => {
      // Arrange
      const { pile, gradesGpt } = await seedPile();

      // Act
      const response = await request(testApp.app).get(`/api/piles/${pile.id}/estimate`).set('Authorization', `Bearer ${geologist}`).expect(200);
      const estimate = response.body;

      // Assert: the 20 m square measured on the ellipsoid is within 0.5 % of 400 m².
      expect(estimate.areaM2).toBeGreaterThan(398);
      expect(estimate.areaM2).toBeLessThan(402);
      const side = Math.sqrt(estimate.areaM2);
      expect(estimate.perimeterM).toBeCloseTo(4 * side, 0);
      // Square frustum: the crest is the toe moved in by h / tan θ on every side; V = h/3 (A₁ + A₂ + √(A₁A₂)).
      const crest = side - (2 * 2) / Math.tan(Math.PI / 4);
      const baseArea = side * side;
      const crestArea = crest * crest;
      const frustumM3 = (2 / 3) * (baseArea + crestArea + Math.sqrt(baseArea * crestArea));
      expect(estimate.volumeM3).toBeCloseTo(frustumM3, 1);
      // Dry tonnes = volume × bulk density × (1 − moisture).
      expect(estimate.dryTonnes).toBeCloseTo(estimate.volumeM3 * 1.8 * (1 - 0.1), 6);
      expect(estimate.dryTonnes).toBeCloseTo(frustumM3 * 1.62, 0);
      // Grades 1, 2, 3, 5 g/t (the blank is left out): mean 2.75, median 2.5, sample SD by hand.
      const mean = gradesGpt.reduce((sum, grade) => sum + grade, 0) / gradesGpt.length;
      const sd = Math.sqrt(gradesGpt.reduce((sum, grade) => sum + (grade - mean) ** 2, 0) / (gradesGpt.length - 1));
      expect(estimate.grade.n).toBe(4);
      expect(estimate.grade.meanGpt).toBeCloseTo(2.75, 10);
      expect(estimate.grade.medianGpt).toBeCloseTo(2.5, 10);
      expect(estimate.grade.sdGpt).toBeCloseTo(sd, 10);
      expect(estimate.grade.cv).toBeCloseTo(sd / mean, 10);
      expect(estimate.grade.source).toBe('pan');
      expect(estimate.grade.ciLowGpt).toBeLessThan(mean);
      expect(estimate.grade.ciHighGpt).toBeGreaterThan(mean);
      // Contained gold = dry t × mean grade; samples for ±20 % at 90 %: ⌈(1.6449 · CV / 0.2)²⌉.
      expect(estimate.containedAuG).toBeCloseTo(estimate.dryTonnes * 2.75, 6);
      expect(estimate.samplesNeeded).toBe(Math.ceil(((1.6448536 * sd) / mean / 0.2) ** 2));
      expect(estimate.warnings.map((warning: { code: string }) => warning.code)).toContain('uncalibrated-pan');
      expect(estimate.assumptions.join(' ')).toMatch(/blank or standard/);
      expect(estimate.sampleGrades).toHaveLength(5);
    });

    it('recomputes from the stored record after an edit, taking nothing from the caller', async () => {
      const { pile } = await seedPile();
      const before = (await request(testApp.app).get(`/api/piles/${pile.id}/estimate`).set('Authorization', `Bearer ${geologist}`).expect(200)).body;
      const current = (await request(testApp.app).get(`/api/piles/${pile.id}`).set('Authorization', `Bearer ${geologist}`).expect(200)).body;

      await request(testApp.app).patch(`/api/piles/${pile.id}`).set('Authorization', `Bearer ${geologist}`)
        .send({ baseRevision: current.revision, changes: { shapeModel: 'cone', heightM: 3 } }).expect(200);
      const after = (await request(testApp.app).get(`/api/piles/${pile.id}/estimate`).set('Authorization', `Bearer ${geologist}`).expect(200)).body;

      // Cone: V = A·h/3.
      expect(after.volumeM3).toBeCloseTo((before.areaM2 * 3) / 3, 6);
      expect(after.volumeMethod).toBe('cone');
    });
  });

  describe('refusals', () => {
    it('refuses a figure offered by the caller with 400', async () => {
      const { pile } = await seedPile();
      const response = await request(testApp.app).get(`/api/piles/${pile.id}/estimate?dryTonnes=1`).set('Authorization', `Bearer ${geologist}`);
      expect(response.status).toBe(400);
      expect(response.body.error.code).toBe('validation_failed');
    });

    it('answers 404 for a pile of a site the caller is not a member of', async () => {
      const { pile } = await seedPile(IF, 'IF');
      const response = await request(testApp.app).get(`/api/piles/${pile.id}/estimate`).set('Authorization', `Bearer ${sampler}`);
      expect(response.status).toBe(404);
      expect(response.body.error.code).toBe('not_found');
    });

    it('answers 404 to a geologist for a pile of a site with no membership of theirs', async () => {
      const siteId = randomUUID();
      await testApp.database.transaction((transaction) =>
        Site.create({ id: siteId, organizationId: DEMO_ORGANIZATION.id, code: 'OT', name: 'Other camp', processingLat: null, processingLon: null, economics: null }, { transaction }),
      );
      const admin = (await signInAs(testApp.app, 'admin')).accessToken;
      // Nobody but an admin belongs there, and admins do not capture: the pile goes straight into the table.
      const pile = pileRecord(siteId, 'OT');
      await testApp.database.transaction((transaction) => Pile.create({ ...pile, createdById: geologistId, deviceId: null, revision: 1 }, { transaction }));

      const refused = await request(testApp.app).get(`/api/piles/${pile.id}/estimate`).set('Authorization', `Bearer ${geologist}`);
      const allowed = await request(testApp.app).get(`/api/piles/${pile.id}/estimate`).set('Authorization', `Bearer ${admin}`);

      expect(refused.status).toBe(404);
      expect(allowed.status).toBe(200);
      expect(allowed.body.grade).toBeNull();
    });

    it('answers 400 for an id that is not a UUID and 404 for an unknown pile', async () => {
      await request(testApp.app).get('/api/piles/not-a-pile/estimate').set('Authorization', `Bearer ${geologist}`).expect(400);
      await request(testApp.app).get(`/api/piles/${randomUUID()}/estimate`).set('Authorization', `Bearer ${geologist}`).expect(404);
    });

    it('answers 401 without a sign-in', async () => {
      const { pile } = await seedPile();
      await request(testApp.app).get(`/api/piles/${pile.id}/estimate`).expect(401);
    });
  });
});

describe('GET /api/review/sites/:siteId', () => {
  it('lists the piles with their estimates and the samples with their pan grades', async () => {
    const { pile } = await seedPile();
    const response = await request(testApp.app).get(`/api/review/sites/${JR}`).set('Authorization', `Bearer ${geologist}`).expect(200);

    const row = response.body.piles.find((candidate: { pile: { id: string } }) => candidate.pile.id === pile.id);
    expect(row.estimate.grade.meanGpt).toBeCloseTo(2.75, 10);
    const samples = response.body.samples.filter((sample: { pileId: string }) => sample.pileId === pile.id);
    expect(samples.map((sample: { gradeGpt: number }) => sample.gradeGpt).sort()).toEqual([0, 1, 2, 3, 5]);
    expect(samples.every((sample: { pileCode: string }) => sample.pileCode === pile.code)).toBe(true);
    expect(response.body.site.code).toBe('JR');
  });

  it('answers 404 for a site the caller is not a member of', async () => {
    const response = await request(testApp.app).get(`/api/review/sites/${IF}`).set('Authorization', `Bearer ${sampler}`);
    expect(response.status).toBe(404);
  });
});
