import request from 'supertest';
import { DEMO_SITES } from '../../../server/demo/demo-scenario';
import { seedDemoTrialsAndEconomics } from '../../../server/demo/seed-demo-trials-economics';
import { EconomicsChange } from '../../../server/economics/economics.model';
import { Trial } from '../../../server/trials/trial.model';
import { createTestApp, type TestApp } from '../support/test-app';
import { createMemberSite, pushPiles, signInAll, type Tokens } from '../shortlist/support/shortlist-site';

describe('trials', () => {
  let testApp: TestApp;
  let tokens: Tokens;
  let siteId: string;
  let pileId: string;

  beforeAll(async () => {
    testApp = await createTestApp();
    tokens = await signInAll(testApp);
    siteId = await createMemberSite(testApp, 'XT', { lat: -3.9, lon: 34.2 });
    const ids = await pushPiles(testApp, tokens.geologist, siteId, 'XT', [
      { code: 'XT-09-P0001', box: [34.2005, -3.9005, 34.2008, -3.9002], heightM: 2, bulkDensityTPerM3: 1.5, moisturePct: 5, goldMassMg: [4], massPannedKg: 2 },
    ]);
    pileId = ids['XT-09-P0001'] as string;
  });

  afterAll(() => testApp.close());

  const post = (body: Record<string, unknown>, token = tokens.manager) => request(testApp.app).post('/api/trials').set('Authorization', `Bearer ${token}`).send(body);
  const valid = () => ({
    siteId, pileIds: [pileId], trialDate: '2025-05-10', equipmentNote: 'shaking table, deck 2', feedMassKg: 1000, feedGradeGpt: 10_000,
    concentrateMassKg: 12.74, concentrateGradeGpt: 630_000, tailingsGradeGpt: 2_000,
  });

  describe('POST /api/trials', () => {
    it('matches the two-product worked example: tin feed 1 %, concentrate 63 %, tailings 0.2 %', async () => {
      // Wills & Napier-Munn, "Wills' Mineral Processing Technology", two-product formula, tin example
      // (from memory): recovery ≈ 80.3 %, mass yield ≈ 1.27 %. Grades are given in g/t (1 % = 10,000 g/t);
      // the formula takes ratios, so the units cancel.
      const response = await post(valid());
      expect(response.status).toBe(201);
      expect(Math.round(response.body.recoveryTwoProduct * 1000) / 10).toBe(80.3);
      expect(Math.round(response.body.massYield * 10000) / 100).toBe(1.27);
      expect(response.body.enrichmentRatio).toBeCloseTo(63, 9);
      // Weighed: 12.74 kg × 63 % over 1000 kg × 1 % = 80.26 %.
      expect(response.body.recoveryWeighed).toBeCloseTo((12.74 * 630_000) / (1000 * 10_000), 12);
      expect(response.body.discrepancy).toBeCloseTo(response.body.recoveryWeighed - response.body.recoveryTwoProduct, 12);
      expect(response.body.isDiscrepancyOverTolerance).toBe(false);
      expect(response.body.pileCodes).toEqual(['XT-09-P0001']);
    });

    it('warns when weighed and two-product recovery disagree by more than the tolerance', async () => {
      const response = await post({ ...valid(), concentrateMassKg: 15 });
      expect(response.status).toBe(201);
      expect(response.body.isDiscrepancyOverTolerance).toBe(true);
      expect(response.body.warnings.map((warning: { code: string }) => warning.code)).toContain('discrepancy-over-tolerance');
    });

    it('reports middlings apart from the recovery', async () => {
      const response = await post({ ...valid(), middlingsMassKg: 20, middlingsGradeGpt: 5_000 });
      expect(response.status).toBe(201);
      expect(response.body.middlingsGoldFraction).toBeCloseTo((20 * 5_000) / (1000 * 10_000), 12);
      expect(Math.round(response.body.recoveryTwoProduct * 1000) / 10).toBe(80.3);
    });

    it.each([
      ['tailings assaying above the feed', { tailingsGradeGpt: 12_000 }, 'tailingsGradeGpt', /tailings .* must assay below the feed/],
      ['a concentrate assaying below the feed', { concentrateGradeGpt: 8_000 }, 'concentrateGradeGpt', /concentrate .* must assay above the feed/],
      ['a concentrate heavier than the feed', { concentrateMassKg: 1200 }, 'concentrateMassKg', /cannot weigh more than the feed/],
      ['a negative tailings grade', { tailingsGradeGpt: -1 }, 'tailingsGradeGpt', /must not be negative/],
      ['no pile', { pileIds: [] }, 'pileIds', /name the pile or piles fed/],
      ['a pile of another site', { pileIds: ['6f0e2a53-8c1d-4b7a-9a51-2d3c4e5f6b01'] }, 'pileIds', /no pile .* at this site/],
      ['middlings with no grade', { middlingsMassKg: 5 }, 'middlingsGradeGpt', /both their mass and their grade/],
    ])('refuses %s with a 400 naming the field, and stores nothing', async (_name, change, path, message) => {
      const before = await Trial.count();
      const response = await post({ ...valid(), ...change });
      expect(response.status).toBe(400);
      expect(response.body.error.code).toBe('validation_failed');
      const detail = (response.body.error.details as { path: string; message: string }[]).find((candidate) => candidate.path === path);
      expect(detail?.message).toMatch(message);
      expect(await Trial.count()).toBe(before);
    });

    it('refuses a sampler, who may not record trials', async () => {
      const before = await Trial.count();
      const response = await post(valid(), tokens.sampler);
      expect([403, 404]).toContain(response.status);
      expect(await Trial.count()).toBe(before);
    });
  });

  describe('GET /api/trials', () => {
    it('lists the site’s trials with their figures and the working recovery of the accepted ones', async () => {
      const response = await request(testApp.app).get(`/api/trials?site=${siteId}`).set('Authorization', `Bearer ${tokens.geologist}`);
      expect(response.status).toBe(200);
      const accepted = (response.body.items as { status: string; feedMassKg: number; recoveryTwoProduct: number }[]).filter((trial) => trial.status === 'accepted');
      expect(accepted.length).toBeGreaterThan(0);
      const weighted = accepted.reduce((sum, trial) => sum + trial.feedMassKg * trial.recoveryTwoProduct, 0) / accepted.reduce((sum, trial) => sum + trial.feedMassKg, 0);
      expect(response.body.workingRecovery).toMatchObject({ source: 'trials', trialCount: accepted.length });
      expect(response.body.workingRecovery.recovery).toBeCloseTo(weighted, 12);
    });

    it('falls back to the stated default recovery when no trial is accepted', async () => {
      const emptySite = await createMemberSite(testApp, 'XU', { lat: -3.9, lon: 34.2 });
      const response = await request(testApp.app).get(`/api/trials?site=${emptySite}`).set('Authorization', `Bearer ${tokens.manager}`);
      expect(response.body.items).toEqual([]);
      expect(response.body.workingRecovery).toMatchObject({ source: 'default', recovery: 0.5, trialCount: 0 });
    });
  });

  describe('PATCH /api/trials/:id', () => {
    it('takes a rejected trial out of the working recovery', async () => {
      const created = await post({ ...valid(), feedMassKg: 500, concentrateMassKg: 6.37 });
      const before = (await request(testApp.app).get(`/api/trials?site=${siteId}`).set('Authorization', `Bearer ${tokens.manager}`)).body.workingRecovery;
      const response = await request(testApp.app).patch(`/api/trials/${created.body.id}`).set('Authorization', `Bearer ${tokens.manager}`).send({ status: 'rejected' });
      expect(response.status).toBe(200);
      expect(response.body.status).toBe('rejected');
      const after = (await request(testApp.app).get(`/api/trials?site=${siteId}`).set('Authorization', `Bearer ${tokens.manager}`)).body.workingRecovery;
      expect(after.trialCount).toBe(before.trialCount - 1);
    });

    it('refuses a status that does not exist, changing nothing', async () => {
      const created = await post(valid());
      const response = await request(testApp.app).patch(`/api/trials/${created.body.id}`).set('Authorization', `Bearer ${tokens.manager}`).send({ status: 'maybe' });
      expect(response.status).toBe(400);
      expect((await Trial.findByPk(created.body.id))?.status).toBe('accepted');
    });
  });
});

describe('the demo trials and economics', () => {
  let testApp: TestApp;
  let tokens: Tokens;

  beforeAll(async () => {
    testApp = await createTestApp();
    tokens = await signInAll(testApp);
  });

  afterAll(() => testApp.close());

  it('give each demo site accepted trials, a flagged pending one at IF, and a shortlist', async () => {
    const [jr, ifSite] = await Promise.all(DEMO_SITES.map((site) => request(testApp.app).get(`/api/trials?site=${site.id}`).set('Authorization', `Bearer ${tokens.manager}`)));
    expect(jr?.body.workingRecovery).toMatchObject({ source: 'trials', trialCount: 2 });
    const pending = (ifSite?.body.items as { status: string; isDiscrepancyOverTolerance: boolean }[]).filter((trial) => trial.status === 'pending');
    expect(pending).toEqual([expect.objectContaining({ isDiscrepancyOverTolerance: true })]);
    for (const site of DEMO_SITES) {
      const shortlist = await request(testApp.app).get(`/api/shortlist?site=${site.id}`).set('Authorization', `Bearer ${tokens.manager}`);
      expect(shortlist.status).toBe(200);
      expect(shortlist.body.sources.goldPricePerTroyOz).toBe('site');
    }
  });

  it('changes nothing when seeded again', async () => {
    const before = { trials: await Trial.count(), changes: await EconomicsChange.count() };
    await seedDemoTrialsAndEconomics(testApp.database);
    expect({ trials: await Trial.count(), changes: await EconomicsChange.count() }).toEqual(before);
  });
});
