import request from 'supertest';
import { calibrationForSite, sampleGradesForPile } from '../../../server/lab/assay-grades';
import { SAMPLE_EXPORT_COLUMNS } from '../../../server/exports/exports.service';
import { createTestApp, type TestApp } from '../support/test-app';
import { JR, batchBody, makeSamples, readCsv, resultsCsv, tokenFor } from './support/lab-fixtures';

let testApp: TestApp;
let geologist: string;

beforeAll(async () => {
  testApp = await createTestApp();
  geologist = await tokenFor(testApp.app, 'geologist');
});
afterAll(() => testApp.close());

const as = (token: string) => ({
  get: (url: string) => request(testApp.app).get(url).set('Authorization', `Bearer ${token}`),
  post: (url: string) => request(testApp.app).post(url).set('Authorization', `Bearer ${token}`),
  put: (url: string) => request(testApp.app).put(url).set('Authorization', `Bearer ${token}`),
});

/** Makes samples with the given pan estimates, batches them, and imports assays for them (same order). */
async function assayed(pans: readonly (number | null)[], assays: readonly (string | null)[], specs: Record<number, object> = {}) {
  const samples = await makeSamples(testApp.app, geologist, pans.map((panGpt, index) => ({ panGpt, ...(specs[index] ?? {}) })));
  const withAssay = samples.ids.filter((_, index) => assays[index] !== null);
  const batch = (await as(geologist).post('/api/lab-batches').send(batchBody(withAssay)).expect(201)).body;
  const rows = batch.items.map((item: { labCode: string; sampleId: string }) => [item.labCode, assays[samples.ids.indexOf(item.sampleId)] as string]);
  await as(geologist).post(`/api/lab-batches/${batch.id}/results?dryRun=false`).attach('file', Buffer.from(resultsCsv(rows)), 'results.csv').expect(200);
  return { samples, batch };
}

describe('calibration', () => {
  it('fits assay against pan over the site, and applies it to samples without an assay only when switched on', async () => {
    // Arrange: 10 pairs on the line assay = 0.1 + 2 × pan, and one sample with a pan test only.
    const pans = [0.1, 0.2, 0.3, 0.4, 0.5, 0.6, 0.7, 0.8, 0.9, 1.0, 0.45];
    const assays = [...pans.slice(0, 10).map((pan) => (0.1 + 2 * pan).toFixed(4)), null];
    const { samples } = await assayed(pans, assays);

    const view = (await as(geologist).get(`/api/calibration?siteId=${JR.id}`).expect(200)).body;
    expect(view.fit.n).toBeGreaterThanOrEqual(10);
    expect(view.fit.slope).toBeCloseTo(2, 6);
    expect(view.fit.interceptGpt).toBeCloseTo(0.1, 6);
    expect(view.fit.r2).toBeCloseTo(1, 6);
    expect(view.isApplied).toBe(false);

    const off = (await sampleGradesForPile(samples.pileId)).find((grade) => grade.sampleId === samples.ids[10]);
    expect([off?.source, off?.gradeGpt]).toEqual(['pan', 0.45]);

    await as(geologist).put(`/api/calibration/${JR.id}`).send({ isApplied: true }).expect(200);
    const on = (await sampleGradesForPile(samples.pileId)).find((grade) => grade.sampleId === samples.ids[10]);
    expect(on?.source).toBe('calibrated-pan');
    expect(on?.gradeGpt).toBeCloseTo(1.0, 6);
    expect((await calibrationForSite(JR.id)).isApplied).toBe(true);
  });

  it('refuses a switch that is not a boolean with 400 and keeps the setting', async () => {
    const response = await as(geologist).put(`/api/calibration/${JR.id}`).send({ isApplied: 'yes' }).expect(400);
    expect(response.body.error.code).toBe('validation_failed');
  });
});

describe('GET /api/qaqc', () => {
  it('lists the blanks, standards and flagged batches of the site', async () => {
    const samples = await makeSamples(testApp.app, geologist, [{ panGpt: 1 }, { panGpt: 2 }]);
    const batch = (await as(geologist).post('/api/lab-batches').send(batchBody(samples.ids, { isBlind: false, blankEvery: 2, standardEvery: 2, standardCodes: ['JRM-STD-0.6'] })).expect(201)).body;
    // Standard 0.80 vs 0.61 ± 0.04: z = 4.75, beyond 3 SD.
    const rows = batch.items.map((item: { labCode: string; itemType: string }) => [item.labCode, item.itemType === 'standard' ? '0.80' : item.itemType === 'blank' ? '<0.005' : '1.5']);
    await as(geologist).post(`/api/lab-batches/${batch.id}/results?dryRun=false`).attach('file', Buffer.from(resultsCsv(rows)), 'results.csv').expect(200);

    const qaqc = (await as(geologist).get(`/api/qaqc?siteId=${JR.id}`).expect(200)).body;

    expect(qaqc.standards.filter((entry: { batchCode: string }) => entry.batchCode === batch.code).map((entry: { verdict: string; zScore: number }) => [entry.verdict, Number(entry.zScore.toFixed(2))])).toEqual([['fail', 4.75]]);
    expect(qaqc.blanks.filter((entry: { batchCode: string }) => entry.batchCode === batch.code).map((entry: { verdict: string }) => entry.verdict)).toEqual(['pass']);
    expect(qaqc.batches.find((entry: { batchId: string }) => entry.batchId === batch.id)).toMatchObject({ verdict: 'fail' });
    expect(qaqc.standardsOnRecord.map((standard: { code: string }) => standard.code)).toContain('JRM-STD-0.6');
  });
});

describe('GET /api/exports/samples.csv', () => {
  it('exports every sample with pile, WGS84 location, assay and grade source, neutralising formula-like text only', async () => {
    const { samples, batch } = await assayed([0.3, 0.2], ['0.42', '<0.005'], { 1: { sampleType: 'standard', standardId: '=HYPERLINK("http://example.test","x")', lonLat: [-0.5, -4.0512] } });

    const response = await as(geologist).get('/api/exports/samples.csv?site=JR').expect(200);

    expect(response.headers['content-disposition']).toBe('attachment; filename="JR-samples.csv"');
    const { header, rows } = readCsv(response.text);
    expect(header).toEqual([...SAMPLE_EXPORT_COLUMNS]);
    const col = (name: (typeof SAMPLE_EXPORT_COLUMNS)[number]) => header.indexOf(name);
    const first = rows.find((row) => row[0] === samples.codes[0]) as string[];
    expect([first[col('pile')], first[col('Au g/t')], first[col('grade source')], first[col('lab batch')], first[col('pan estimate g/t')]]).toEqual([samples.pileCode, '0.42', 'assay', batch.code, '0.3']);
    const second = rows.find((row) => row[0] === samples.codes[1]) as string[];
    // The formula-like standard id is text: neutralised. The negative longitude is a number: as is.
    expect(second[col('standard')]).toBe('\'=HYPERLINK("http://example.test","x")');
    expect([second[col('lon')], second[col('lat')]]).toEqual(['-0.5', '-4.0512']);
    expect([second[col('Au g/t')], second[col('below detection')], second[col('detection limit g/t')]]).toEqual(['0.005', 'yes', '0.005']);
  });

  it('refuses a site the user is no member of', async () => {
    const sampler = await tokenFor(testApp.app, 'sampler');
    await as(sampler).get('/api/exports/samples.csv?site=IF').expect(403);
    await as(geologist).get('/api/exports/samples.csv?site=NOPE').expect(404);
    await as(geologist).get('/api/exports/samples.csv?site=%3DCMD').expect(400);
  });
});
