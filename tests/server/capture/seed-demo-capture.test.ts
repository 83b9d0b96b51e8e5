import { PanTest } from '../../../server/capture/pan-test.model';
import { Pile } from '../../../server/capture/pile.model';
import { Sample } from '../../../server/capture/sample.model';
import { DEMO_SITES } from '../../../server/demo/demo-scenario';
import { seedDemoCapture } from '../../../server/demo/seed-demo-capture';
import { ChangeLogEntry, SyncRevision } from '../../../server/sync/sync.models';
import { estimatePile, panTestGrade } from '../../../shared/engine';
import { parseHumanCode, type PanTestData, type PileData, type SampleData } from '../../../shared/sync';
import { createSyncTestApp, type SyncTestApp } from '../sync/support/sync-test-app';

/** The demo seed runs inside createTestApp (through seedDemo); these tests read what it wrote. */
describe('the demo field work', () => {
  let app: SyncTestApp;

  beforeAll(async () => {
    app = await createSyncTestApp();
  });

  afterAll(() => app.close());

  const counts = async () => ({
    piles: await Pile.count(), samples: await Sample.count(), panTests: await PanTest.count(),
    changes: await ChangeLogEntry.count(), revision: (await SyncRevision.findByPk(1))?.value,
  });

  it('lays out six piles at Jackal Ridge and four at Ironstone Flats, with samples and pan tests', async () => {
    const piles = await Pile.findAll();
    expect(piles.filter((pile) => pile.siteId === DEMO_SITES[0].id)).toHaveLength(6);
    expect(piles.filter((pile) => pile.siteId === DEMO_SITES[1].id)).toHaveLength(4);
    for (const pile of piles) {
      const samples = await Sample.count({ where: { pileId: pile.id } });
      expect(samples).toBeGreaterThanOrEqual(4);
      expect(samples).toBeLessThanOrEqual(12);
    }
    expect(await PanTest.count()).toBeGreaterThan(40);
  });

  it('gives human codes of the device code scheme', async () => {
    const codes = [...(await Pile.findAll()).map((pile) => pile.code), ...(await Sample.findAll()).map((sample) => sample.code)];
    expect(codes.every((code) => parseHumanCode(code) !== null)).toBe(true);
    expect(codes).toContain('JR-01-P0001');
    expect(codes).toContain('JR-01-0001');
  });

  it('has a field duplicate, a blank and a reference standard at Jackal Ridge', async () => {
    const types = (await Sample.findAll({ where: { siteId: DEMO_SITES[0].id } })).map((sample) => sample.sampleType);
    expect(new Set(types)).toEqual(new Set(['routine', 'duplicate', 'blank', 'standard']));
  });

  it('is in the change log, so a device pulls it', async () => {
    const response = await app.as('geologist').get('/api/sync/pull?since=0&limit=1000').expect(200);
    const entities = response.body.changes.map((change: { entity: string }) => change.entity);
    expect(entities.filter((entity: string) => entity === 'pile')).toHaveLength(10);
    expect(entities.filter((entity: string) => entity === 'sample')).toHaveLength(await Sample.count());
  });

  it('changes nothing when seeded again', async () => {
    const before = await counts();
    await expect(seedDemoCapture(app.database, new Date('2031-01-01T00:00:00Z'))).resolves.toEqual({ applied: 0 });
    expect(await counts()).toEqual(before);
  });

  it('gives every pile an estimate without errors, with grades from 0.3 to 6 g/t and one rich pile', async () => {
    const means: number[] = [];
    for (const row of await Pile.findAll()) {
      const pile = row.get({ plain: true }) as PileData;
      const samples = (await Sample.findAll({ where: { pileId: pile.id } })).map((sample) => sample.get({ plain: true }) as SampleData);
      const estimateSamples = [];
      for (const sample of samples) {
        const panTest = (await PanTest.findOne({ where: { sampleId: sample.id } }))?.get({ plain: true }) as PanTestData | undefined;
        const grade = panTest
          ? panTestGrade({ massPannedKg: panTest.massPannedKg, moisturePct: sample.moisturePct ?? 0, colours: panTest.colours, goldMassMg: panTest.goldMassMg ?? undefined, panEfficiency: panTest.panEfficiency ?? undefined })
          : null;
        expect(grade === null || grade.ok).toBe(true);
        estimateSamples.push({ sampleId: sample.id, sampleType: sample.sampleType, panGpt: grade?.ok ? grade.value.gradeGpt : null });
      }
      const estimate = estimatePile({
        material: pile.material, footprint: pile.footprint ?? undefined, heightM: pile.heightM ?? undefined, shapeModel: pile.shapeModel,
        angleOfReposeDeg: pile.angleOfReposeDeg, bulkDensityTPerM3: pile.bulkDensityTPerM3, moisturePct: pile.moisturePct,
        spotHeights: pile.spotHeights ?? undefined, sackCount: pile.sackCount ?? undefined, sackMassKg: pile.sackMassKg ?? undefined,
      }, estimateSamples.filter((sample) => sample.panGpt !== null));
      expect(estimate).toMatchObject({ ok: true });
      const value = estimate.ok ? estimate.value : null;
      expect(value?.dryTonnes).toBeGreaterThan(1);
      means.push(value?.grade?.meanGpt ?? Number.NaN);
    }
    expect(Math.min(...means)).toBeGreaterThanOrEqual(0.25);
    expect(Math.max(...means)).toBeLessThanOrEqual(6.5);
    expect(means.filter((mean) => mean > 4)).toHaveLength(1);
    expect(means.filter((mean) => mean < 0.6).length).toBeGreaterThanOrEqual(2);
  });
});
