import { randomUUID } from 'node:crypto';
import { Op } from 'sequelize';
import { Sample } from '../../../server/capture/sample.model';
import type { Mutation, PushResponse } from '../../../shared/sync/protocol';
import { createSyncTestApp, IF, newPile, newSample, upsert, type SyncTestApp } from '../sync/support/sync-test-app';

/**
 * `GET /api/samples` reads its rows raw and keeps each filter's total per data revision. These
 * pin that the pages are exactly what Sequelize's model instances give for the same query, and
 * that a kept total follows every write: a new sample, a deleted one, a changed type.
 */
describe('GET /api/samples paging and totals', () => {
  let app: SyncTestApp;
  const pile = newPile();

  beforeAll(async () => {
    app = await createSyncTestApp();
    // Eleven samples over four days, two of them at the same minute so the code breaks the tie.
    const samples = Array.from({ length: 11 }, (_, index) => newSample(pile.id, {
      collectedAt: new Date(Date.UTC(2025, 2, 4 + (index % 4), 8, index === 10 ? 9 : index)).toISOString(),
      sampleType: index % 5 === 4 ? 'blank' : 'routine',
      location: index === 3 ? null : { type: 'Point', coordinates: [33.4523 + index * 1e-5, -4.0517] },
      moisturePct: index === 2 ? null : 8,
    }));
    await push([upsert('pile', pile), ...samples.map((sample) => upsert('sample', sample))]);
  });

  afterAll(() => app.close());

  const push = async (mutations: Mutation[]): Promise<PushResponse> => {
    const body = (await app.as('geologist').post('/api/sync/push').send({ deviceId: 'device-a', mutations }).expect(200)).body as PushResponse;
    expect(body.results.every((result) => result.status === 'applied')).toBe(true);
    return body;
  };
  const list = async (query: string) => (await app.as('geologist').get(`/api/samples?pileId=${pile.id}&${query}`).expect(200)).body;

  /** What the route answered before rows were read raw: model instances, field by field. */
  async function fromModels(where: Record<string, unknown>, limit: number, offset: number) {
    const rows = await Sample.findAll({ where: { pileId: pile.id, deletedAt: null, ...where }, order: [['collectedAt', 'DESC'], ['code', 'ASC']], limit, offset });
    return rows.map((row) => ({
      id: row.id, pileId: row.pileId, code: row.code, sampleType: row.sampleType, duplicateOfId: row.duplicateOfId, standardId: row.standardId,
      location: row.location, gpsAccuracyM: row.gpsAccuracyM, wetMassKg: row.wetMassKg, moisturePct: row.moisturePct, increments: row.increments,
      position: row.position, collectedAt: row.collectedAt.toISOString(), collectorId: row.collectorId, deviceId: row.deviceId,
      revision: Number(row.revision), updatedAt: (row.updatedAt as Date).toISOString(), createdById: row.createdById,
      // What the Samples screen needs besides the record: no pan test or assay here, so no grade yet.
      pileCode: pile.code, gradeGpt: null, gradeSource: null,
    }));
  }

  it('answers every page with the rows, fields and order the model instances give', async () => {
    for (const offset of [0, 4, 8]) {
      const page = await list(`limit=4&offset=${offset}`);
      expect(page).toMatchObject({ total: 11, limit: 4, offset });
      expect(page.items).toEqual(await fromModels({}, 4, offset));
    }
  });

  it('answers the same filtered rows too (type, code prefix, date range)', async () => {
    const page = await list('sampleType=routine&codePrefix=JR-07-&collectedFrom=2025-03-05T00:00:00Z&collectedTo=2025-03-06T23:59:59Z&limit=50');
    const expected = await fromModels({ sampleType: 'routine', code: { [Op.startsWith]: 'JR-07-' }, collectedAt: { [Op.between]: [new Date('2025-03-05T00:00:00Z'), new Date('2025-03-06T23:59:59Z')] } }, 50, 0);
    expect(expected.length).toBeGreaterThan(0);
    expect(page.items).toEqual(expected);
    expect(page.total).toBe(expected.length);
  });

  it('counts a sample pushed after the total was kept', async () => {
    expect((await list('limit=1')).total).toBe(11);
    await push([upsert('sample', newSample(pile.id))]);
    expect((await list('limit=1')).total).toBe(12);
  });

  it('stops counting a deleted sample and follows a change of type, per filter', async () => {
    const [first, second] = (await list('sampleType=routine&limit=2')).items as { id: string; revision: number }[];
    const routineBefore = (await list('sampleType=routine&limit=1')).total;
    const allBefore = (await list('limit=1')).total;
    const stored = (await Sample.findByPk(second.id)) as Sample;

    await push([
      { mutationId: randomUUID(), entity: 'sample', id: first.id, op: 'delete', baseRevision: first.revision, data: null },
      upsert('sample', { ...newSample(pile.id), id: second.id, code: stored.code, collectedAt: stored.collectedAt.toISOString(), sampleType: 'blank' }, second.revision),
    ]);

    expect((await list('sampleType=routine&limit=1')).total).toBe(routineBefore - 2);
    expect((await list('sampleType=blank&limit=50')).items.map((item: { id: string }) => item.id)).toContain(second.id);
    expect((await list('limit=1')).total).toBe(allBefore - 1);
  });

  it('keeps totals apart per reader: a sampler of one site gets none of another site the geologist counted', async () => {
    const away = newPile({ siteId: IF.id, code: 'IF-07-P0901' });
    await push([upsert('pile', away), upsert('sample', newSample(away.id, { code: 'IF-07-0901' }))]);
    const counted = (await app.as('geologist').get(`/api/samples?siteId=${IF.id}&limit=1`).expect(200)).body;
    const refused = (await app.as('sampler').get(`/api/samples?siteId=${IF.id}&limit=1`).expect(200)).body;
    expect(counted.total).toBeGreaterThan(0);
    expect(refused).toMatchObject({ total: 0, items: [] });
  });
});
