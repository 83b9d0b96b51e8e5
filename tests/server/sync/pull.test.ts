import { SyncRevision } from '../../../server/sync/sync.models';
import type { Mutation, PullResponse, PulledChange, PushResponse } from '../../../shared/sync/protocol';
import { createSyncTestApp, IF, newPile, newSample, upsert, type SyncTestApp } from './support/sync-test-app';

describe('GET /api/sync/pull', () => {
  let app: SyncTestApp;
  /** The revision after the demo seed: the tests page from there, as a device that has pulled the demo. */
  let seeded: number;

  beforeEach(async () => {
    app = await createSyncTestApp();
    seeded = (await SyncRevision.findByPk(1))?.value ?? 0;
  });

  afterEach(async () => {
    await app.close();
  });

  const push = async (role: string, mutations: Mutation[]): Promise<PushResponse> =>
    (await app.as(role).post('/api/sync/push').send({ deviceId: 'device-a', mutations }).expect(200)).body as PushResponse;

  const pullPage = async (role: string, since: number, limit: number): Promise<PullResponse> =>
    (await app.as(role).get(`/api/sync/pull?since=${since}&limit=${limit}`).expect(200)).body as PullResponse;

  /** Pages from the seeded revision to the end, running `between` after each page. */
  const pullAll = async (role: string, limit: number, between: (page: number) => Promise<void> = async () => undefined) => {
    const changes: PulledChange[] = [];
    let since = seeded;
    for (let page = 0; page < 100; page += 1) {
      const response = await pullPage(role, since, limit);
      changes.push(...response.changes);
      since = response.cursor;
      await between(page);
      if (!response.hasMore) {
        break;
      }
    }
    return changes;
  };

  it('returns every change exactly once across pages, in revision order', async () => {
    const piles = Array.from({ length: 23 }, () => newPile());
    await push('sampler', piles.map((pile) => upsert('pile', pile)));

    const changes = await pullAll('sampler', 5);

    expect(changes.map((change) => change.id).sort()).toEqual(piles.map((pile) => pile.id).sort());
    const revisions = changes.map((change) => change.revision);
    expect(revisions).toEqual([...revisions].sort((a, b) => a - b));
    expect(changes[0].data).toEqual(piles.find((pile) => pile.id === changes[0].id));
  });

  it('never skips a change made while a device is paging: an edited record comes again at its new revision', async () => {
    // Arrange
    const piles = Array.from({ length: 12 }, () => newPile());
    const created = await push('sampler', piles.map((pile) => upsert('pile', pile)));
    const latecomer = newPile();

    // Act: after the first page, edit a pile from that page and add a new one.
    const changes = await pullAll('sampler', 4, async (page) => {
      if (page === 0) {
        await push('sampler', [upsert('pile', { ...piles[0], notes: 'edited while paging' }, created.results[0].revision), upsert('pile', latecomer)]);
      }
    });

    // Assert
    const latest = new Map(changes.map((change) => [change.id, change]));
    expect([...latest.keys()].sort()).toEqual([...piles, latecomer].map((pile) => pile.id).sort());
    expect((latest.get(piles[0].id)?.data as { notes: string }).notes).toBe('edited while paging');
  });

  it('shows only the sites the user belongs to', async () => {
    const atIronstone = newPile({ siteId: IF.id, code: 'IF-03-P0001' });
    await push('geologist', [upsert('pile', atIronstone)]);

    const forSampler = await pullAll('sampler', 50);
    const forGeologist = await pullAll('geologist', 50);

    expect(forSampler.map((change) => change.id)).not.toContain(atIronstone.id);
    expect(forGeologist.map((change) => change.id)).toContain(atIronstone.id);
  });

  it('carries soft deletes, so a deleted pile leaves every device', async () => {
    const pile = newPile();
    const [created] = (await push('sampler', [upsert('pile', pile)])).results;
    const { results } = await push('sampler', [{ ...upsert('pile', pile, created.revision), op: 'delete', data: null }]);
    expect(results[0].status).toBe('applied');

    const changes = await pullAll('sampler', 50);

    expect(changes.find((change) => change.id === pile.id)).toMatchObject({ revision: results[0].revision, deletedAt: expect.any(String) });
  });

  it('lists a sample with its pile site and answers an empty last page with the cursor unchanged', async () => {
    const pile = newPile();
    await push('sampler', [upsert('pile', pile), upsert('sample', newSample(pile.id))]);
    const first = await pullPage('sampler', seeded, 10);
    expect(first.changes.map((change) => change.entity)).toEqual(['pile', 'sample']);
    expect(first.changes[1].siteId).toBe(pile.siteId);
    const empty = await pullPage('sampler', first.cursor, 10);
    expect(empty).toEqual({ changes: [], cursor: first.cursor, hasMore: false });
  });

  it('refuses a negative cursor with 400', async () => {
    const response = await app.as('sampler').get('/api/sync/pull?since=-4').expect(400);
    expect(response.body.error.code).toBe('validation_failed');
  });
});
