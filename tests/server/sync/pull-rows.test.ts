import { Op, type Model, type ModelStatic } from 'sequelize';
import { PanTest } from '../../../server/capture/pan-test.model';
import { Pile } from '../../../server/capture/pile.model';
import { Sample } from '../../../server/capture/sample.model';
import { readableSiteIds } from '../../../server/accounts/policy';
import { Photo } from '../../../server/photos/photo.model';
import { ChangeLogEntry } from '../../../server/sync/sync.models';
import {
  panTestSchema, photoSchema, pileSchema, sampleSchema, type Mutation, type PullResponse, type PushResponse, type SyncEntity,
} from '../../../shared/sync/protocol';
import { createSyncTestApp, IF, loadUser, newPanTest, newPhoto, newPile, newSample, person, upsert, type SyncTestApp } from './support/sync-test-app';

/**
 * Pull reads raw rows rather than model instances. This checks the answer is, to the byte, what
 * the instance path gives (the way pull read before): every entity, JSON columns (footprints, spot
 * heights, hazards, locations, colours), DATE columns, soft deletes, and only the user's sites.
 */
const ENTITIES: { readonly [E in SyncEntity]: { model: ModelStatic<Model>; fields: string[]; dateFields: string[] } } = {
  pile: { model: Pile, fields: Object.keys(pileSchema.shape), dateFields: [] },
  sample: { model: Sample, fields: Object.keys(sampleSchema.shape), dateFields: ['collectedAt'] },
  panTest: { model: PanTest, fields: Object.keys(panTestSchema.shape), dateFields: ['testedAt'] },
  photo: { model: Photo, fields: Object.keys(photoSchema.shape), dateFields: ['takenAt'] },
};

/** One page as the instance path builds it: change-log instances, then each record's instance. */
async function pageByInstances(role: string, since: number, limit: number): Promise<PullResponse> {
  const user = await loadUser(person(role).email);
  const readable = readableSiteIds(user);
  const where: Record<string | symbol, unknown> = { revision: { [Op.gt]: since } };
  if (readable !== 'all') {
    where['siteId'] = { [Op.in]: [...readable] };
  }
  const rows = await ChangeLogEntry.findAll({ where, order: [['revision', 'ASC']], limit: limit + 1 });
  const page = rows.slice(0, limit);
  const changes: PullResponse['changes'][number][] = [];
  for (const row of page) {
    const { model, fields, dateFields } = ENTITIES[row.entity];
    const instance = await model.findByPk(row.recordId);
    if (!instance) {
      continue;
    }
    const plain = instance.get({ plain: true }) as Record<string, unknown>;
    const data: Record<string, unknown> = {};
    for (const field of fields) {
      const value = plain[field];
      data[field] = dateFields.includes(field) && value instanceof Date ? value.toISOString() : value;
    }
    const deletedAt = plain['deletedAt'] as Date | null;
    changes.push({
      entity: row.entity, id: plain['id'] as string, revision: Number(plain['revision']), siteId: plain['siteId'] as string,
      deletedAt: deletedAt ? deletedAt.toISOString() : null, data: data as never,
    });
  }
  return { changes, cursor: page.length > 0 ? page[page.length - 1].revision : since, hasMore: rows.length > limit };
}

describe('GET /api/sync/pull reads raw rows', () => {
  let app: SyncTestApp;

  beforeAll(async () => {
    app = await createSyncTestApp();
    const push = async (role: string, mutations: Mutation[]) => {
      const body = (await app.as(role).post('/api/sync/push').send({ deviceId: 'device-a', mutations }).expect(200)).body as PushResponse;
      expect(body.results.map((result) => result.status)).toEqual(mutations.map(() => 'applied'));
      return body;
    };
    const surveyed = newPile({
      spotHeights: [{ lon: 33.4522, lat: -4.0516, heightM: 2.1 }, { lon: 33.4524, lat: -4.0518, heightM: 0.35 }],
      hazards: ['mercury', 'silica-dust'], bulkDensityTPerM3: 1.62, sackCount: 40, sackMassKg: 48.5, notes: 'Quotes " and \\ kept; ünïcode too',
    });
    const bare = newPile({ footprint: null, angleOfReposeDeg: null, moisturePct: null, hazards: [] });
    const located = newSample(surveyed.id, { collectedAt: '2025-03-04T08:15:00.123Z' });
    const unlocated = newSample(surveyed.id, { location: null, gpsAccuracyM: null, wetMassKg: null, moisturePct: null, sampleType: 'duplicate', duplicateOfId: located.id });
    const removed = newSample(bare.id);
    const weighed = newPanTest(located.id, { colours: [], goldMassMg: 3.25, panEfficiency: 0.7 });
    const counted = newPanTest(located.id);
    const photo = newPhoto(located.id);
    const pilePhoto = newPhoto(surveyed.id, { ownerEntity: 'pile', contentType: 'image/webp', takenAt: '2025-03-05T23:59:59.999Z' });
    const otherSite = newPile({ siteId: IF.id, code: 'IF-07-P0001' });
    const created = await push('geologist', [
      upsert('pile', surveyed), upsert('pile', bare), upsert('pile', otherSite), upsert('sample', located), upsert('sample', unlocated),
      upsert('sample', removed), upsert('panTest', weighed), upsert('panTest', counted), upsert('photo', photo), upsert('photo', pilePhoto),
    ]);
    const removedRevision = created.results[5].revision;
    const countedRevision = created.results[7].revision;
    await push('geologist', [
      { ...upsert('sample', removed, removedRevision), op: 'delete', data: null },
      { ...upsert('panTest', counted, countedRevision), op: 'delete', data: null },
      upsert('pile', { ...bare, notes: 'Edited after the first push' }, created.results[1].revision),
    ]);
  });

  afterAll(async () => {
    await app.close();
  });

  it.each(['admin', 'geologist', 'sampler'])('answers %s, page by page, with the bytes the instance path gives', async (role) => {
    let since = 0;
    const seen = new Set<SyncEntity>();
    let deleted = 0;
    for (let page = 0; page < 200; page += 1) {
      const response = await app.as(role).get(`/api/sync/pull?since=${since}&limit=7`).expect(200);
      const expected = await pageByInstances(role, since, 7);
      expect(response.text).toBe(JSON.stringify(expected));
      const body = response.body as PullResponse;
      for (const change of body.changes) {
        seen.add(change.entity);
        deleted += change.deletedAt === null ? 0 : 1;
      }
      since = body.cursor;
      if (!body.hasMore) {
        break;
      }
    }
    expect([...seen].sort()).toEqual(['panTest', 'photo', 'pile', 'sample']);
    expect(deleted).toBeGreaterThanOrEqual(2);
  });

  it('gives JSON columns parsed, dates as ISO text and soft deletes with their time', async () => {
    const { changes } = (await app.as('admin').get('/api/sync/pull?since=0&limit=1000').expect(200)).body as PullResponse;
    const piles = changes.filter((change) => change.entity === 'pile').map((change) => change.data as Record<string, unknown>);
    const surveyed = piles.find((pile) => Array.isArray(pile['spotHeights']) && (pile['spotHeights'] as unknown[]).length === 2);
    expect(surveyed).toMatchObject({
      footprint: { type: 'Polygon' }, spotHeights: [{ lon: 33.4522, lat: -4.0516, heightM: 2.1 }, { lon: 33.4524, lat: -4.0518, heightM: 0.35 }],
      hazards: ['mercury', 'silica-dust'], sackCount: 40, notes: 'Quotes " and \\ kept; ünïcode too',
    });
    expect(piles.find((pile) => pile['notes'] === 'Edited after the first push')).toMatchObject({ footprint: null, hazards: [], angleOfReposeDeg: null, spotHeights: null });
    const samples = changes.filter((change) => change.entity === 'sample');
    expect(samples.find((change) => (change.data as { collectedAt: string }).collectedAt === '2025-03-04T08:15:00.123Z')?.data)
      .toMatchObject({ location: { type: 'Point', coordinates: [33.4523, -4.0517] } });
    const deleted = changes.filter((change) => change.deletedAt !== null);
    expect(deleted.map((change) => change.entity).sort()).toEqual(expect.arrayContaining(['panTest', 'sample']));
    for (const change of deleted) {
      expect(new Date(change.deletedAt as string).toISOString()).toBe(change.deletedAt);
    }
    const weighed = changes.find((change) => change.entity === 'panTest' && (change.data as { goldMassMg: number | null }).goldMassMg === 3.25);
    expect(weighed?.data).toMatchObject({ colours: [], panEfficiency: 0.7, testedAt: '2025-03-04T10:00:00.000Z' });
    expect(changes.find((change) => change.entity === 'photo' && (change.data as { ownerEntity: string }).ownerEntity === 'pile')?.data)
      .toMatchObject({ contentType: 'image/webp', takenAt: '2025-03-05T23:59:59.999Z' });
    expect(changes.every((change) => typeof change.revision === 'number')).toBe(true);
  });

  it('leaves out sites the user may not read', async () => {
    const { changes } = (await app.as('sampler').get('/api/sync/pull?since=0&limit=1000').expect(200)).body as PullResponse;
    expect(changes.length).toBeGreaterThan(0);
    expect(changes.some((change) => change.siteId === IF.id)).toBe(false);
  });
});
