import type { Mutation, PushResponse, SampleData } from '../../../shared/sync/protocol';
import { createSyncTestApp, IF, newPile, newSample, upsert, type SyncTestApp } from '../sync/support/sync-test-app';

/**
 * `GET /api/samples?sort=…&direction=…` for the Samples screen: each order pages without overlap
 * or gap, descending is the exact reverse of ascending, unknown masses sort as the smallest on
 * SQLite and PostgreSQL alike, and the pile-code order walks piles by code across pages.
 */
describe('GET /api/samples sorted', () => {
  let app: SyncTestApp;
  // Two piles whose codes sort the other way round from the order they were made in.
  const laterPile = newPile({ code: 'JR-88-P0002' });
  const earlierPile = newPile({ code: 'JR-88-P0001' });
  const made: SampleData[] = [];

  beforeAll(async () => {
    app = await createSyncTestApp();
    const specs: Partial<SampleData>[] = [
      { sampleType: 'routine', wetMassKg: 12.5, collectedAt: '2025-04-01T08:00:00.000Z' },
      { sampleType: 'blank', wetMassKg: null, collectedAt: '2025-04-03T08:00:00.000Z' },
      { sampleType: 'routine', wetMassKg: 3.25, collectedAt: '2025-04-02T08:00:00.000Z' },
      { sampleType: 'duplicate', wetMassKg: 12.5, collectedAt: '2025-04-02T08:00:00.000Z' },
      { sampleType: 'routine', wetMassKg: 40, collectedAt: '2025-04-05T08:00:00.000Z' },
      { sampleType: 'standard', wetMassKg: null, collectedAt: '2025-04-04T08:00:00.000Z' },
      { sampleType: 'routine', wetMassKg: 7, collectedAt: '2025-04-02T08:00:00.000Z' },
    ];
    specs.forEach((spec, index) => {
      const pileId = index % 2 === 0 ? laterPile.id : earlierPile.id;
      made.push(newSample(pileId, { code: `JR-88-${String(7 - index).padStart(4, '0')}`, ...spec, duplicateOfId: spec.sampleType === 'duplicate' ? made[0]?.id ?? null : null, standardId: spec.sampleType === 'standard' ? 'JRM-STD-2.5' : null }));
    });
    await push([upsert('pile', laterPile), upsert('pile', earlierPile), ...made.map((sample) => upsert('sample', sample))]);
  });

  afterAll(() => app.close());

  const push = async (mutations: Mutation[]): Promise<void> => {
    const body = (await app.as('geologist').post('/api/sync/push').send({ deviceId: 'device-a', mutations }).expect(200)).body as PushResponse;
    expect(body.results.map((result) => result.status)).toEqual(mutations.map(() => 'applied'));
  };
  type Item = { id: string; code: string; pileCode: string; wetMassKg: number | null; sampleType: string; collectedAt: string };
  const list = async (query: string): Promise<{ items: Item[]; total: number }> =>
    (await app.as('geologist').get(`/api/samples?siteId=${laterPile.siteId}&codePrefix=JR-88-&${query}`).expect(200)).body;
  const codes = async (query: string) => (await list(query)).items.map((item) => item.code);

  it('sorts by code, by collection date, by type and by wet mass, each way', async () => {
    expect(await codes('sort=code&direction=asc')).toEqual(['JR-88-0001', 'JR-88-0002', 'JR-88-0003', 'JR-88-0004', 'JR-88-0005', 'JR-88-0006', 'JR-88-0007']);
    // Ascending dates; samples of the same day by code descending, the exact reverse of newest first.
    expect(await codes('sort=collectedAt&direction=asc')).toEqual(['JR-88-0007', 'JR-88-0005', 'JR-88-0004', 'JR-88-0001', 'JR-88-0006', 'JR-88-0002', 'JR-88-0003']);
    expect(await codes('sort=collectedAt&direction=desc')).toEqual(await codes(''));
    // Types in word order (blank, duplicate, routine, standard), newest first within a type.
    expect(await codes('sort=sampleType')).toEqual(['JR-88-0006', 'JR-88-0004', 'JR-88-0003', 'JR-88-0001', 'JR-88-0005', 'JR-88-0007', 'JR-88-0002']);
    // Unknown masses first when ascending, last when descending; equal masses newest first, then code.
    const byMass = await list('sort=wetMassKg&direction=asc');
    expect(byMass.items.map((item) => [item.code, item.wetMassKg])).toEqual([
      ['JR-88-0002', null], ['JR-88-0006', null], ['JR-88-0005', 3.25], ['JR-88-0001', 7], ['JR-88-0004', 12.5], ['JR-88-0007', 12.5], ['JR-88-0003', 40],
    ]);
  });

  it('answers every descending order as the exact reverse of its ascending one', async () => {
    for (const sort of ['code', 'collectedAt', 'sampleType', 'wetMassKg', 'pileCode']) {
      const ascending = await codes(`sort=${sort}&direction=asc`);
      expect(await codes(`sort=${sort}&direction=desc`)).toEqual([...ascending].reverse());
      expect(await codes(`sort=${sort}`)).toEqual(ascending);
    }
  });

  it('orders by pile code, newest first within a pile, and gives each item its pile code', async () => {
    const { items, total } = await list('sort=pileCode');
    expect(total).toBe(7);
    expect(items.map((item) => [item.pileCode, item.code])).toEqual([
      ['JR-88-P0001', 'JR-88-0002'], ['JR-88-P0001', 'JR-88-0006'], ['JR-88-P0001', 'JR-88-0004'],
      ['JR-88-P0002', 'JR-88-0003'], ['JR-88-P0002', 'JR-88-0001'], ['JR-88-P0002', 'JR-88-0005'], ['JR-88-P0002', 'JR-88-0007'],
    ]);
  });

  it('pages every order without overlap or gap, across the boundary between piles too', async () => {
    for (const sort of ['code', 'collectedAt', 'sampleType', 'wetMassKg', 'pileCode']) {
      for (const direction of ['asc', 'desc']) {
        const whole = await codes(`sort=${sort}&direction=${direction}`);
        const pages = [];
        for (const offset of [0, 2, 4, 6]) {
          const page = await list(`sort=${sort}&direction=${direction}&limit=2&offset=${offset}`);
          expect(page.total).toBe(7);
          pages.push(...page.items.map((item) => item.code));
        }
        expect(pages).toEqual(whole);
      }
    }
  });

  it('sorts within the other filters (type, pile)', async () => {
    expect(await codes('sampleType=routine&sort=wetMassKg&direction=desc')).toEqual(['JR-88-0003', 'JR-88-0007', 'JR-88-0001', 'JR-88-0005']);
    const onePile = await list(`pileId=${laterPile.id}&sort=pileCode&limit=2&offset=1`);
    expect(onePile.total).toBe(4);
    expect(onePile.items.map((item) => item.code)).toEqual(['JR-88-0001', 'JR-88-0005']);
  });

  it('keeps the pile-code total per filter and follows a new sample', async () => {
    expect((await list('sort=pileCode&limit=1')).total).toBe(7);
    const added = newSample(earlierPile.id, { code: 'JR-88-0008', collectedAt: '2025-04-09T08:00:00.000Z' });
    await push([upsert('sample', added)]);
    const after = await list('sort=pileCode&limit=1');
    expect(after.total).toBe(8);
    expect(after.items[0].code).toBe('JR-88-0008');
  });

  it('gives a reader nothing of a site they are no member of, in the pile-code order too', async () => {
    const away = newPile({ siteId: IF.id, code: 'IF-88-P0001' });
    await push([upsert('pile', away), upsert('sample', newSample(away.id, { code: 'IF-88-0001' }))]);
    const refused = (await app.as('sampler').get(`/api/samples?siteId=${IF.id}&sort=pileCode`).expect(200)).body;
    expect(refused).toMatchObject({ total: 0, items: [] });
    const seen = (await app.as('geologist').get(`/api/samples?siteId=${IF.id}&codePrefix=IF-88-&sort=pileCode`).expect(200)).body;
    expect(seen.items.map((item: Item) => [item.pileCode, item.code])).toEqual([['IF-88-P0001', 'IF-88-0001']]);
  });

  describe('refusals', () => {
    it.each([
      ['an unknown sort column', 'sort=grade', 'sort'],
      ['a sort column in another case', 'sort=Code', 'sort'],
      ['an unknown direction', 'sort=code&direction=up', 'direction'],
      ['a direction with no sort column', 'direction=desc', 'direction'],
      ['a sort given twice', 'sort=code&sort=pileCode', 'sort'],
    ])('answers 400 in the error format for %s', async (_what, query, path) => {
      const response = await app.as('geologist').get(`/api/samples?${query}`).expect(400);
      expect(response.body.error).toMatchObject({ code: 'validation_failed', message: 'The query is not valid' });
      expect(response.body.error.details.map((detail: { path: string }) => detail.path)).toContain(path);
    });
  });
});
