import request from 'supertest';
import { Pile } from '../../../server/capture/pile.model';
import { calibrationForSite, sampleGradesForPile } from '../../../server/lab/assay-grades';
import { estimatePile } from '../../../shared/engine';
import { JR, batchBody, makeSamples, resultsCsv, tokenFor } from '../lab/support/lab-fixtures';
import { createTestApp, type TestApp } from '../support/test-app';

/**
 * The shortlist reads a site's samples once per data revision and keeps each pile's estimate by
 * a digest of its inputs. These pin that its figures are still exactly those of the lab loop's
 * per-pile path (`sampleGradesForPile`, then the engine's `estimatePile` with its fixed-seed
 * bootstrap), and that what is kept gives way to a push, an assay import and the calibration switch.
 */
let testApp: TestApp;
let manager: string;
let geologist: string;

beforeAll(async () => {
  testApp = await createTestApp();
  manager = await tokenFor(testApp.app, 'manager');
  geologist = await tokenFor(testApp.app, 'geologist');
});
afterAll(() => testApp.close());

interface Row {
  pileId: string;
  sampleCount: number;
  samplesWithoutGrade: number;
  gradeSource: string | null;
  dryTonnes: number | null;
  gradeGpt: number | null;
  gradeLowGpt: number | null;
  gradeHighGpt: number | null;
}

const shortlist = async () => (await request(testApp.app).get(`/api/shortlist?site=${JR.id}`).set('Authorization', `Bearer ${manager}`).expect(200)).body as { parameters: { confidenceLevel: number }; rows: Row[] };

/** Samples on a new pile of the demo site, given a footprint so the pile has tonnes (and so a grade block). */
async function pileOfSamples(specs: Parameters<typeof makeSamples>[2]) {
  const made = await makeSamples(testApp.app, geologist, specs);
  const as = (method: 'get' | 'patch', url: string) => request(testApp.app)[method](url).set('Authorization', `Bearer ${geologist}`);
  const pile = (await as('get', `/api/piles/${made.pileId}`).expect(200)).body;
  const footprint = { type: 'Polygon', coordinates: [[[33.4521, -4.0515], [33.4525, -4.0515], [33.4525, -4.0519], [33.4521, -4.0519], [33.4521, -4.0515]]] };
  await as('patch', `/api/piles/${made.pileId}`).send({ baseRevision: pile.revision, changes: { footprint } }).expect(200);
  return made;
}

/** Each pile's figures the way they were worked out before anything was kept: pile by pile, from the lab loop. */
async function perPileFigures(confidenceLevel: number) {
  const calibration = await calibrationForSite(JR.id);
  const fit = calibration.isApplied && calibration.fit ? calibration.fit : undefined;
  const piles = await Pile.findAll({ where: { siteId: JR.id, deletedAt: null } });
  const figures = new Map<string, Omit<Row, 'pileId'>>();
  for (const pile of piles) {
    const entries = await sampleGradesForPile(pile.id, calibration);
    const graded = entries.filter((entry) => entry.gradeGpt !== null);
    const estimate = estimatePile(
      {
        material: pile.material, footprint: pile.footprint ?? undefined, heightM: pile.heightM ?? undefined, shapeModel: pile.shapeModel,
        angleOfReposeDeg: pile.angleOfReposeDeg, bulkDensityTPerM3: pile.bulkDensityTPerM3, moisturePct: pile.moisturePct,
        spotHeights: pile.spotHeights ?? undefined, sackCount: pile.sackCount ?? undefined, sackMassKg: pile.sackMassKg ?? undefined,
      },
      graded.map((entry) => ({ sampleId: entry.sampleId, sampleType: entry.sampleType, assayGpt: entry.assayGpt, panGpt: entry.panGpt })),
      { confidenceLevel, calibration: fit },
    );
    const grade = estimate.ok ? estimate.value.grade : null;
    figures.set(pile.id, {
      sampleCount: grade?.n ?? 0, samplesWithoutGrade: entries.length - graded.length, gradeSource: grade?.source ?? null,
      dryTonnes: estimate.ok ? estimate.value.dryTonnes : null, gradeGpt: grade?.meanGpt ?? null, gradeLowGpt: grade?.ciLowGpt ?? null, gradeHighGpt: grade?.ciHighGpt ?? null,
    });
  }
  return figures;
}

/** The shortlist's rows and the per-pile path's figures side by side, by pile. */
async function bothWays() {
  const view = await shortlist();
  const expected = await perPileFigures(view.parameters.confidenceLevel);
  const shown = new Map(view.rows.map(({ pileId, sampleCount, samplesWithoutGrade, gradeSource, dryTonnes, gradeGpt, gradeLowGpt, gradeHighGpt }) =>
    [pileId, { sampleCount, samplesWithoutGrade, gradeSource, dryTonnes, gradeGpt, gradeLowGpt, gradeHighGpt }]));
  return { shown, expected, view };
}

describe('GET /api/shortlist with kept site data', () => {
  it('gives every pile of the demo site exactly the figures of the per-pile path, bootstrap interval included', async () => {
    const { shown, expected } = await bothWays();
    expect(expected.size).toBeGreaterThan(3);
    expect([...expected.values()].some((figures) => figures.gradeLowGpt !== null)).toBe(true);
    expect(shown).toEqual(expected);
    // Asked again with nothing changed, from what was kept: the same answer.
    expect((await bothWays()).shown).toEqual(shown);
  });

  it('counts samples pushed since the last answer', async () => {
    const before = await shortlist();
    const made = await pileOfSamples([{ panGpt: 1.2 }, { panGpt: 0.8 }, { panGpt: 2.1 }, { panGpt: null }]);

    const { shown, expected, view } = await bothWays();

    expect(before.rows.find((row) => row.pileId === made.pileId)).toBeUndefined();
    expect(view.rows.find((row) => row.pileId === made.pileId)).toMatchObject({ sampleCount: 3, samplesWithoutGrade: 1, gradeSource: 'pan' });
    expect(shown).toEqual(expected);
  });

  it('takes an assay imported since the last answer (the lab loop moves no sync revision)', async () => {
    const made = await pileOfSamples([{ panGpt: 1 }, { panGpt: 1 }, { panGpt: 1 }]);
    const pileBefore = (await shortlist()).rows.find((row) => row.pileId === made.pileId) as Row;
    const batch = (await request(testApp.app).post('/api/lab-batches').set('Authorization', `Bearer ${geologist}`).send(batchBody(made.ids)).expect(201)).body;
    const rows = batch.items.map((item: { labCode: string }) => [item.labCode, '4.00']);
    await request(testApp.app).post(`/api/lab-batches/${batch.id}/results?dryRun=false`).set('Authorization', `Bearer ${geologist}`)
      .attach('file', Buffer.from(resultsCsv(rows)), 'results.csv').expect(200);

    const { shown, expected } = await bothWays();

    expect(pileBefore).toMatchObject({ gradeSource: 'pan', gradeGpt: 1 });
    expect(shown.get(made.pileId)).toMatchObject({ gradeSource: 'assay', gradeGpt: 4 });
    expect(shown).toEqual(expected);
  });

  it('follows the calibration switch, on and off', async () => {
    // Ten routine pairs with assay = 0.1 + 1.5 × pan, enough for the engine to fit a line.
    const pans = [0.2, 0.4, 0.6, 0.8, 1.0, 1.2, 1.4, 1.6, 1.8, 2.0];
    const paired = await makeSamples(testApp.app, geologist, pans.map((panGpt) => ({ panGpt })));
    const batch = (await request(testApp.app).post('/api/lab-batches').set('Authorization', `Bearer ${geologist}`).send(batchBody(paired.ids)).expect(201)).body;
    const rows = batch.items.map((item: { labCode: string; sampleId: string }) => [item.labCode, (0.1 + 1.5 * pans[paired.ids.indexOf(item.sampleId)]).toFixed(3)]);
    await request(testApp.app).post(`/api/lab-batches/${batch.id}/results?dryRun=false`).set('Authorization', `Bearer ${geologist}`)
      .attach('file', Buffer.from(resultsCsv(rows)), 'results.csv').expect(200);
    const panOnly = await pileOfSamples([{ panGpt: 1 }, { panGpt: 1.5 }, { panGpt: 0.5 }]);
    const switchTo = (isApplied: boolean) => request(testApp.app).put(`/api/calibration/${JR.id}`).set('Authorization', `Bearer ${geologist}`).send({ isApplied }).expect(200);

    await switchTo(true);
    const on = await bothWays();
    await switchTo(false);
    const off = await bothWays();

    expect(on.shown.get(panOnly.pileId)?.gradeSource).toBe('calibrated-pan');
    // The line runs through every pair of the site (the assays of the test before included), so only its effect is pinned here.
    expect(on.shown.get(panOnly.pileId)?.gradeGpt).toBeGreaterThan(1.2);
    expect(on.shown).toEqual(on.expected);
    expect(off.shown.get(panOnly.pileId)).toMatchObject({ gradeSource: 'pan', gradeGpt: 1 });
    expect(off.shown).toEqual(off.expected);
  });
});
