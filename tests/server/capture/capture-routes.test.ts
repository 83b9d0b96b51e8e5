import { Pile } from '../../../server/capture/pile.model';
import type { Mutation, PushResponse } from '../../../shared/sync/protocol';
import { createSyncTestApp, IF, newPile, newSample, upsert, type SyncTestApp } from '../sync/support/sync-test-app';

describe('capture read routes', () => {
  let app: SyncTestApp;

  beforeAll(async () => {
    app = await createSyncTestApp();
  });

  afterAll(async () => {
    await app.close();
  });

  const push = async (role: string, mutations: Mutation[]): Promise<PushResponse> =>
    (await app.as(role).post('/api/sync/push').send({ deviceId: 'device-a', mutations }).expect(200)).body as PushResponse;

  describe('GET /api/piles', () => {
    it('lists the piles of the user\u2019s sites only', async () => {
      const home = newPile();
      const away = newPile({ siteId: IF.id, code: 'IF-02-P0001' });
      await push('geologist', [upsert('pile', home), upsert('pile', away)]);
      const response = await app.as('sampler').get('/api/piles?limit=500').expect(200);
      const ids = response.body.items.map((item: { id: string }) => item.id);
      expect(ids).toContain(home.id);
      expect(ids).not.toContain(away.id);
    });
  });

  describe('GET /api/piles/:id', () => {
    it('answers 404 for a pile at another site, as if it did not exist', async () => {
      const away = newPile({ siteId: IF.id, code: 'IF-02-P0002' });
      await push('geologist', [upsert('pile', away)]);
      await app.as('sampler').get(`/api/piles/${away.id}`).expect(404);
    });
  });

  describe('PATCH /api/piles/:id', () => {
    it('changes the fields on top of the revision named, as a new revision', async () => {
      const pile = newPile();
      const [created] = (await push('sampler', [upsert('pile', pile)])).results;
      const response = await app.as('sampler').patch(`/api/piles/${pile.id}`).send({ baseRevision: created.revision, changes: { heightM: 3.4 } }).expect(200);
      expect(response.body).toMatchObject({ id: pile.id, heightM: 3.4 });
      expect(response.body.revision).toBeGreaterThan(created.revision as number);
    });

    it('answers 409 on a stale revision and keeps the stored pile', async () => {
      const pile = newPile();
      const [created] = (await push('sampler', [upsert('pile', pile)])).results;
      await app.as('sampler').patch(`/api/piles/${pile.id}`).send({ baseRevision: created.revision, changes: { heightM: 3 } }).expect(200);
      const response = await app.as('sampler').patch(`/api/piles/${pile.id}`).send({ baseRevision: created.revision, changes: { heightM: 9 } }).expect(409);
      expect(response.body.error.details.conflictId).toEqual(expect.any(String));
      expect((await Pile.findByPk(pile.id))?.heightM).toBe(3);
    });

    it('answers 400 for an invalid value and changes nothing', async () => {
      const pile = newPile();
      const [created] = (await push('sampler', [upsert('pile', pile)])).results;
      const response = await app.as('sampler').patch(`/api/piles/${pile.id}`).send({ baseRevision: created.revision, changes: { angleOfReposeDeg: 89 } }).expect(400);
      expect(response.body.error.details[0].path).toBe('angleOfReposeDeg');
      expect((await Pile.findByPk(pile.id))?.revision).toBe(created.revision);
    });

    it('refuses a change of site with 400', async () => {
      const pile = newPile();
      const [created] = (await push('sampler', [upsert('pile', pile)])).results;
      await app.as('sampler').patch(`/api/piles/${pile.id}`).send({ baseRevision: created.revision, changes: { siteId: IF.id } }).expect(400);
    });

    it('refuses a manager with 403', async () => {
      const pile = newPile();
      const [created] = (await push('sampler', [upsert('pile', pile)])).results;
      await app.as('manager').patch(`/api/piles/${pile.id}`).send({ baseRevision: created.revision, changes: { heightM: 2 } }).expect(403);
    });
  });

  describe('GET /api/samples', () => {
    it('filters by pile and type, and pages', async () => {
      const pile = newPile();
      const samples = [newSample(pile.id), newSample(pile.id), newSample(pile.id, { sampleType: 'blank' })];
      await push('sampler', [upsert('pile', pile), ...samples.map((sample) => upsert('sample', sample))]);

      const routine = await app.as('sampler').get(`/api/samples?pileId=${pile.id}&sampleType=routine`).expect(200);
      const firstPage = await app.as('sampler').get(`/api/samples?pileId=${pile.id}&limit=2&offset=0`).expect(200);
      const secondPage = await app.as('sampler').get(`/api/samples?pileId=${pile.id}&limit=2&offset=2`).expect(200);

      expect(routine.body.total).toBe(2);
      expect(firstPage.body).toMatchObject({ total: 3, limit: 2, offset: 0 });
      const paged = [...firstPage.body.items, ...secondPage.body.items].map((item: { id: string }) => item.id).sort();
      expect(paged).toEqual(samples.map((sample) => sample.id).sort());
    });

    it('refuses an unknown filter with 400', async () => {
      await app.as('sampler').get('/api/samples?colour=gold').expect(400);
    });
  });
});
