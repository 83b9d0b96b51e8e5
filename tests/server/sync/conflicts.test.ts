import { Pile } from '../../../server/capture/pile.model';
import type { ConflictView, Mutation, PushResponse } from '../../../shared/sync/protocol';
import { createSyncTestApp, newPile, upsert, type SyncTestApp } from './support/sync-test-app';

describe('conflicts', () => {
  let app: SyncTestApp;

  beforeAll(async () => {
    app = await createSyncTestApp();
  });

  afterAll(async () => {
    await app.close();
  });

  const push = async (mutations: Mutation[], deviceId: string): Promise<PushResponse> =>
    (await app.as('geologist').post('/api/sync/push').send({ deviceId, mutations }).expect(200)).body as PushResponse;

  /** A pile edited on two devices from the same revision: device B's edit is the conflict. */
  async function makeConflict(): Promise<{ pileId: string; conflictId: string }> {
    const pile = newPile();
    const [created] = (await push([upsert('pile', pile)], 'device-a')).results;
    await push([upsert('pile', { ...pile, notes: 'from A' }, created.revision)], 'device-a');
    const [conflict] = (await push([upsert('pile', { ...pile, notes: 'from B' }, created.revision)], 'device-b')).results;
    return { pileId: pile.id, conflictId: conflict.conflictId as string };
  }

  describe('GET /api/sync/conflicts', () => {
    it('lists the open conflict with both versions', async () => {
      const { conflictId } = await makeConflict();
      const response = await app.as('geologist').get('/api/sync/conflicts').expect(200);
      const listed = (response.body.items as ConflictView[]).find((item) => item.id === conflictId);
      expect(listed).toMatchObject({ status: 'open', deviceData: { notes: 'from B' }, serverData: { notes: 'from A' } });
    });
  });

  describe('POST /api/sync/conflicts/:id/resolve', () => {
    it('when the geologist takes the device version, writes it as a new revision', async () => {
      const { pileId, conflictId } = await makeConflict();
      const before = (await Pile.findByPk(pileId))?.revision as number;

      const response = await app.as('geologist').post(`/api/sync/conflicts/${conflictId}/resolve`).send({ choice: 'device' }).expect(200);

      expect(response.body.revision).toBeGreaterThan(before);
      expect((await Pile.findByPk(pileId))?.notes).toBe('from B');
      expect(response.body.conflict.status).toBe('resolved');
    });

    it('when the geologist keeps the server version, changes no record', async () => {
      const { pileId, conflictId } = await makeConflict();
      const before = await Pile.findByPk(pileId);
      await app.as('geologist').post(`/api/sync/conflicts/${conflictId}/resolve`).send({ choice: 'server' }).expect(200);
      const after = await Pile.findByPk(pileId);
      expect(after?.revision).toBe(before?.revision);
      expect(after?.notes).toBe('from A');
    });

    it('when a merged record is given, validates it and writes it', async () => {
      const { pileId, conflictId } = await makeConflict();
      const current = (await Pile.findByPk(pileId))?.get({ plain: true }) as Record<string, unknown>;
      const { revision: _r, createdAt: _c, updatedAt: _u, deletedAt: _d, createdById: _o, deviceId: _v, ...data } = current;
      await app.as('geologist').post(`/api/sync/conflicts/${conflictId}/resolve`).send({ choice: 'merged', data: { ...data, notes: 'from A and B' } }).expect(200);
      expect((await Pile.findByPk(pileId))?.notes).toBe('from A and B');
    });

    it('refuses an invalid merged record with 400 and leaves the conflict open', async () => {
      const { pileId, conflictId } = await makeConflict();
      const response = await app.as('geologist').post(`/api/sync/conflicts/${conflictId}/resolve`).send({ choice: 'merged', data: { heightM: 'tall' } }).expect(400);
      expect(response.body.error.code).toBe('validation_failed');
      expect((await Pile.findByPk(pileId))?.notes).toBe('from A');
      const open = await app.as('geologist').get('/api/sync/conflicts').expect(200);
      expect((open.body.items as ConflictView[]).map((item) => item.id)).toContain(conflictId);
    });

    it('refuses a sampler with 403: only geologists resolve', async () => {
      const { conflictId } = await makeConflict();
      const response = await app.as('sampler').post(`/api/sync/conflicts/${conflictId}/resolve`).send({ choice: 'device' }).expect(403);
      expect(response.body.error.code).toBe('forbidden');
    });

    it('refuses a second resolution with 409', async () => {
      const { conflictId } = await makeConflict();
      await app.as('geologist').post(`/api/sync/conflicts/${conflictId}/resolve`).send({ choice: 'server' }).expect(200);
      await app.as('geologist').post(`/api/sync/conflicts/${conflictId}/resolve`).send({ choice: 'device' }).expect(409);
    });
  });

  describe('POST /api/sync/device', () => {
    it('gives each device its own number, the same on every ask', async () => {
      const first = await app.as('sampler').post('/api/sync/device').send({ deviceId: 'phone-1' }).expect(200);
      const second = await app.as('sampler').post('/api/sync/device').send({ deviceId: 'phone-2' }).expect(200);
      const again = await app.as('sampler').post('/api/sync/device').send({ deviceId: 'phone-1' }).expect(200);
      expect(second.body.deviceNumber).not.toBe(first.body.deviceNumber);
      expect(again.body.deviceNumber).toBe(first.body.deviceNumber);
    });
  });
});
