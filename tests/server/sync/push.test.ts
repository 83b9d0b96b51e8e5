import request from 'supertest';
import { Pile } from '../../../server/capture/pile.model';
import { Sample } from '../../../server/capture/sample.model';
import { ChangeLogEntry, SyncConflict, SyncMutation } from '../../../server/sync/sync.models';
import type { Mutation, PushResponse } from '../../../shared/sync/protocol';
import { createSyncTestApp, IF, newPanTest, newPile, newSample, upsert, type SyncTestApp } from './support/sync-test-app';

describe('POST /api/sync/push', () => {
  let app: SyncTestApp;

  beforeAll(async () => {
    app = await createSyncTestApp();
  });

  afterAll(async () => {
    await app.close();
  });

  const push = async (role: string, mutations: Mutation[], deviceId = 'device-a'): Promise<PushResponse> => {
    const response = await app.as(role).post('/api/sync/push').send({ deviceId, mutations }).expect(200);
    return response.body as PushResponse;
  };

  describe('when the same batch is pushed three times', () => {
    it('stores one record each and answers duplicate with the first revisions', async () => {
      // Arrange
      const pile = newPile();
      const sample = newSample(pile.id);
      const batch = [upsert('pile', pile), upsert('sample', sample), upsert('panTest', newPanTest(sample.id))];

      // Act
      const first = await push('sampler', batch);
      const second = await push('sampler', batch);
      const third = await push('sampler', batch);

      // Assert
      expect(first.results.map((result) => result.status)).toEqual(['applied', 'applied', 'applied']);
      for (const again of [second, third]) {
        expect(again.results.map((result) => result.status)).toEqual(['duplicate', 'duplicate', 'duplicate']);
        expect(again.results.map((result) => result.revision)).toEqual(first.results.map((result) => result.revision));
      }
      expect(await Pile.count({ where: { id: pile.id } })).toBe(1);
      expect(await Sample.count({ where: { pileId: pile.id } })).toBe(1);
      expect(await ChangeLogEntry.count({ where: { recordId: [pile.id, sample.id] } })).toBe(2);
    });

    it('treats a mutation repeated inside one batch as a duplicate of the first', async () => {
      const mutation = upsert('pile', newPile());
      const { results } = await push('sampler', [mutation, mutation]);
      expect(results.map((result) => result.status)).toEqual(['applied', 'duplicate']);
      expect(results[1].revision).toBe(results[0].revision);
    });
  });

  describe('when one mutation of a batch is invalid', () => {
    it('applies the valid ones and rejects that one with its reason, storing nothing of it', async () => {
      const good = newPile();
      const bad = newPile({ heightM: -3 });
      const alsoGood = newPile();
      const { results } = await push('sampler', [upsert('pile', good), upsert('pile', bad), upsert('pile', alsoGood)]);

      expect(results.map((result) => result.status)).toEqual(['applied', 'rejected', 'applied']);
      expect(results[1].errors).toEqual([expect.objectContaining({ path: 'heightM' })]);
      expect(results[1].revision).toBeNull();
      expect(await Pile.count({ where: { id: [good.id, bad.id, alsoGood.id] } })).toBe(2);
    });

    it('rejects a sample whose pile the server has never seen', async () => {
      const orphan = newSample('0b6f3c2e-1a4d-4e8b-9c7d-0000000f0f0f');
      const { results } = await push('sampler', [upsert('sample', orphan)]);
      expect(results[0]).toMatchObject({ status: 'rejected', errors: [{ path: 'pileId' }] });
    });

    it('rejects a second record with a code already used at the site, so the user can give it another', async () => {
      const first = newPile();
      const second = newPile({ code: first.code });
      const { results } = await push('sampler', [upsert('pile', first), upsert('pile', second)], 'device-b');
      expect(results.map((result) => result.status)).toEqual(['applied', 'rejected']);
      expect(results[1].errors[0].path).toBe('code');
    });

    it('accepts a sample pushed in the same batch as its new pile', async () => {
      const pile = newPile();
      const { results } = await push('sampler', [upsert('pile', pile), upsert('sample', newSample(pile.id))]);
      expect(results.map((result) => result.status)).toEqual(['applied', 'applied']);
    });
  });

  describe('when a batch is full (500 mutations)', () => {
    it('stores every record, one change-log row and one receipt each, in one transaction', async () => {
      // Arrange: a pile and 499 samples of it, as a phone sends a day's work.
      const pile = newPile();
      const samples = Array.from({ length: 499 }, () => newSample(pile.id));
      const batch = [upsert('pile', pile), ...samples.map((sample) => upsert('sample', sample))];

      // Act
      const { results } = await push('sampler', batch, 'device-full');
      const again = await push('sampler', batch, 'device-full');

      // Assert
      expect(results.every((result) => result.status === 'applied')).toBe(true);
      const revisions = results.map((result) => result.revision as number);
      expect(new Set(revisions).size).toBe(500);
      expect(revisions).toEqual([...revisions].sort((a, b) => a - b));
      expect(await Sample.count({ where: { pileId: pile.id } })).toBe(499);
      expect(await ChangeLogEntry.count({ where: { recordId: [pile.id, ...samples.map((sample) => sample.id)] } })).toBe(500);
      expect(await SyncMutation.count({ where: { mutationId: batch.map((mutation) => mutation.mutationId) } })).toBe(500);
      expect(again.results.map((result) => result.status)).toEqual(batch.map(() => 'duplicate'));
      expect(again.results.map((result) => result.revision)).toEqual(revisions);
      const stored = await Sample.findByPk(samples[7].id);
      expect(stored?.location).toEqual(samples[7].location);
      expect(stored?.collectedAt.toISOString()).toBe(samples[7].collectedAt);
    });
  });

  describe('when a record is changed', () => {
    it('keeps its createdAt, moves its updatedAt and its change-log row to the new revision', async () => {
      const pile = newPile();
      const [created] = (await push('sampler', [upsert('pile', pile)])).results;
      const before = await Pile.findByPk(pile.id);
      await new Promise((resolve) => setTimeout(resolve, 5));

      const [changed] = (await push('sampler', [upsert('pile', { ...pile, heightM: 2.9 }, created.revision)])).results;

      const after = await Pile.findByPk(pile.id);
      expect(changed).toMatchObject({ status: 'applied' });
      expect(after?.heightM).toBe(2.9);
      expect(after?.revision).toBe(changed.revision);
      expect(after?.createdAt?.getTime()).toBe(before?.createdAt?.getTime());
      expect(after?.updatedAt?.getTime()).toBeGreaterThan(before?.updatedAt?.getTime() as number);
      const entry = await ChangeLogEntry.findOne({ where: { entity: 'pile', recordId: pile.id } });
      expect(entry).toMatchObject({ revision: changed.revision, isDeleted: false });
    });
  });

  describe('when a reference in the data is not an id', () => {
    it('rejects that mutation with its reason and applies the rest (no lookup by a non-id, which PostgreSQL refuses)', async () => {
      const good = newPile();
      const badSite = newPile({ siteId: 'not-a-site-id' });
      const badParent = newSample('not-a-pile-id');
      const { results } = await push('sampler', [upsert('pile', badSite), upsert('sample', badParent), upsert('pile', good)]);

      expect(results.map((result) => result.status)).toEqual(['rejected', 'rejected', 'applied']);
      expect(results[0].errors).toEqual([expect.objectContaining({ path: 'siteId' })]);
      expect(results[1].errors).toEqual([expect.objectContaining({ path: 'pileId' })]);
      expect(await Pile.count({ where: { id: [good.id, badSite.id] } })).toBe(1);
    });
  });

  describe('permissions, per mutation', () => {
    it('rejects a pile at a site the sampler does not belong to, and applies the rest', async () => {
      const elsewhere = newPile({ siteId: IF.id, code: 'IF-07-P0001' });
      const home = newPile();
      const { results } = await push('sampler', [upsert('pile', elsewhere), upsert('pile', home)]);
      expect(results.map((result) => result.status)).toEqual(['rejected', 'applied']);
      expect(await Pile.count({ where: { id: elsewhere.id } })).toBe(0);
    });

    it('refuses a whole batch from a role that may not capture with 403, storing nothing', async () => {
      const pile = newPile();
      const response = await app.as('manager').post('/api/sync/push').send({ deviceId: 'device-m', mutations: [upsert('pile', pile)] }).expect(403);
      expect(response.body.error.code).toBe('forbidden');
      expect(await Pile.count({ where: { id: pile.id } })).toBe(0);
    });

    it('rejects a sampler changing a pile another person recorded', async () => {
      const geologistPile = newPile();
      const [created] = (await push('geologist', [upsert('pile', geologistPile)])).results;
      const { results } = await push('sampler', [upsert('pile', { ...geologistPile, notes: 'mine now' }, created.revision)]);
      expect(results[0].status).toBe('rejected');
      expect((await Pile.findByPk(geologistPile.id))?.notes).toBe(geologistPile.notes);
    });
  });

  describe('when two devices edit the same pile', () => {
    it('keeps the first edit, answers the second with a conflict and keeps both versions', async () => {
      // Arrange: both devices saw the pile at the same revision.
      const pile = newPile();
      const [created] = (await push('geologist', [upsert('pile', pile)])).results;

      // Act
      const fromA = await push('geologist', [upsert('pile', { ...pile, heightM: 3.1 }, created.revision)], 'device-a');
      const fromB = await push('geologist', [upsert('pile', { ...pile, heightM: 1.9 }, created.revision)], 'device-b');

      // Assert
      expect(fromA.results[0].status).toBe('applied');
      expect(fromB.results[0]).toMatchObject({ status: 'conflict', revision: fromA.results[0].revision });
      expect((await Pile.findByPk(pile.id))?.heightM).toBe(3.1);
      const conflict = await SyncConflict.findByPk(fromB.results[0].conflictId);
      expect(conflict).toMatchObject({ status: 'open', deviceId: 'device-b' });
      expect((conflict?.deviceData as { heightM: number }).heightM).toBe(1.9);
      expect((conflict?.serverData as { heightM: number }).heightM).toBe(3.1);
    });

    it('when both arrive at once, applies exactly one and keeps the other as a conflict', async () => {
      const pile = newPile();
      const [created] = (await push('geologist', [upsert('pile', pile)])).results;
      const answers = await Promise.all([1.5, 2.5].map((heightM, index) =>
        push('geologist', [upsert('pile', { ...pile, heightM }, created.revision)], `device-${index}`)));
      expect(answers.map((answer) => answer.results[0].status).sort()).toEqual(['applied', 'conflict']);
    });
  });

  describe('refusals of the whole request', () => {
    it('answers 400 for a body that is not a batch, and changes nothing', async () => {
      const before = await Pile.count();
      const response = await app.as('sampler').post('/api/sync/push').send({ deviceId: 'device-a', mutations: 'all of them' }).expect(400);
      expect(response.body.error.code).toBe('validation_failed');
      expect(await Pile.count()).toBe(before);
    });

    it('answers 401 without a sign-in', async () => {
      const response = await request(app.syncApp).post('/api/sync/push').send({ deviceId: 'd', mutations: [upsert('pile', newPile())] }).expect(401);
      expect(response.body.error.code).toBe('unauthenticated');
    });
  });
});
