import Papa from 'papaparse';
import request from 'supertest';
import { sampleGradesForPile } from '../../../server/lab/assay-grades';
import { AssayResult, LabBatch, LabBatchSample, ResultImport } from '../../../server/lab/lab.models';
import { SUBMISSION_COLUMNS } from '../../../server/lab/lab.service';
import { createTestApp, type TestApp } from '../support/test-app';
import { IF, batchBody, makeSamples, readCsv, resultsCsv, tokenFor } from './support/lab-fixtures';

let testApp: TestApp;
let geologist: string;
let lab: string;
let sampler: string;

beforeAll(async () => {
  testApp = await createTestApp();
  [geologist, lab, sampler] = await Promise.all([tokenFor(testApp.app, 'geologist'), tokenFor(testApp.app, 'lab'), tokenFor(testApp.app, 'sampler')]);
});
afterAll(() => testApp.close());

const as = (token: string) => ({
  get: (url: string) => request(testApp.app).get(url).set('Authorization', `Bearer ${token}`),
  post: (url: string) => request(testApp.app).post(url).set('Authorization', `Bearer ${token}`),
  patch: (url: string) => request(testApp.app).patch(url).set('Authorization', `Bearer ${token}`),
});

async function newBatch(count: number, overrides: Record<string, unknown> = {}) {
  const samples = await makeSamples(testApp.app, geologist, Array.from({ length: count }, (_, index) => ({ panGpt: 0.2 + index / 10 })));
  const response = await as(geologist).post('/api/lab-batches').send(batchBody(samples.ids, overrides)).expect(201);
  return { samples, batch: response.body };
}

const upload = (token: string, batchId: string, csv: string | Buffer, dryRun: boolean, fileName = 'results.csv') =>
  as(token).post(`/api/lab-batches/${batchId}/results?dryRun=${dryRun}`).attach('file', Buffer.isBuffer(csv) ? csv : Buffer.from(csv, 'utf8'), { filename: fileName, contentType: 'text/csv' });

describe('POST /api/lab-batches', () => {
  it('inserts a blank and a standard per block of field samples, in an order the seed fixes', async () => {
    const samples = await makeSamples(testApp.app, geologist, Array.from({ length: 12 }, () => ({ panGpt: 1 })));
    const body = batchBody(samples.ids, { blankEvery: 5, standardEvery: 5, duplicateEvery: 6, standardCodes: ['JRM-STD-0.6', 'JRM-STD-2.5'] });

    const first = (await as(geologist).post('/api/lab-batches').send(body).expect(201)).body;
    const second = (await as(geologist).post('/api/lab-batches').send(body).expect(201)).body;

    const kinds = (batch: { items: { itemType: string }[] }) => batch.items.map((item) => item.itemType);
    expect(kinds(first).filter((kind) => kind === 'blank')).toHaveLength(3);
    expect(kinds(first).filter((kind) => kind === 'standard')).toHaveLength(3);
    expect(kinds(first).filter((kind) => kind === 'duplicate')).toHaveLength(2);
    expect(first.items).toHaveLength(12 + 3 + 3 + 2);
    // Same seed, same order of samples and QA/QC items; the codes differ only by batch.
    expect(second.items.map((item: { sampleId: string | null; itemType: string }) => [item.sampleId, item.itemType]))
      .toEqual(first.items.map((item: { sampleId: string | null; itemType: string }) => [item.sampleId, item.itemType]));
    expect(first.code).toMatch(/^JR-LB\d{3}$/);
    expect(first.items[0].labCode).toBe(`${first.code}-001`);
    expect(first.status).toBe('draft');
  });

  it('refuses samples of another site and unknown standards, and saves no batch', async () => {
    const other = await makeSamples(testApp.app, geologist, [{ panGpt: 1 }], IF);
    const before = await LabBatch.count();

    const response = await as(geologist).post('/api/lab-batches').send(batchBody(other.ids, { standardEvery: 5, standardCodes: ['NO-SUCH-STD'] })).expect(400);

    expect(response.body.error.code).toBe('validation_failed');
    expect(response.body.error.details.map((detail: { message: string }) => detail.message)).toEqual([
      expect.stringContaining('belongs to another site'), 'No reference standard "NO-SUCH-STD"',
    ]);
    expect(await LabBatch.count()).toBe(before);
  });

  it('refuses a lab user and a sampler with 403', async () => {
    const { ids } = await makeSamples(testApp.app, geologist, [{ panGpt: 1 }]);
    await as(lab).post('/api/lab-batches').send(batchBody(ids)).expect(403);
    await as(sampler).post('/api/lab-batches').send(batchBody(ids)).expect(403);
  });
});

describe('GET /api/lab-batches/:id/submission.csv', () => {
  it('lists every bag in dispatch order with blanks and standards shipped blind', async () => {
    const { batch } = await newBatch(6, { blankEvery: 3, standardEvery: 6, standardCodes: ['JRM-STD-2.5'] });

    const response = await as(geologist).get(`/api/lab-batches/${batch.id}/submission.csv`).expect(200);

    expect(response.headers['content-type']).toBe('text/csv; charset=utf-8');
    expect(response.headers['content-disposition']).toBe(`attachment; filename="${batch.code}-submission.csv"`);
    const { header, rows } = readCsv(response.text);
    expect(header).toEqual([...SUBMISSION_COLUMNS]);
    expect(rows.map((row) => row[2])).toEqual(batch.items.map((item: { labCode: string }) => item.labCode));
    expect(rows.map((row) => row[1])).toEqual(batch.items.map((_: unknown, index: number) => String(index + 1)));
    expect(new Set(rows.map((row) => row[3]))).toEqual(new Set(['sample']));
    expect(new Set(rows.map((row) => row[4]))).toEqual(new Set(['']));
    expect(rows.every((row) => row[0] === batch.code && row[7] === 'Fire assay, AAS finish' && row[8] === '30' && row[9] === '0.005')).toBe(true);
  });

  it('names types and standards when the batch is not blind', async () => {
    const { batch } = await newBatch(2, { isBlind: false, blankEvery: 2, standardEvery: 2, standardCodes: ['JRM-STD-8'] });
    const { rows } = readCsv((await as(lab).get(`/api/lab-batches/${batch.id}/submission.csv`).expect(200)).text);
    expect(rows.map((row) => row[3]).sort()).toEqual(['blank', 'reference standard', 'routine', 'routine']);
    expect(rows.find((row) => row[3] === 'reference standard')?.[4]).toBe('JRM-STD-8');
  });
});

describe('POST /api/lab-batches/:id/results', () => {
  it('gives back exactly the values sent, through the submission sheet and a results file', async () => {
    // Arrange: a batch, its submission sheet, and a results file written from that sheet.
    const { samples, batch } = await newBatch(8, { blankEvery: 4, standardEvery: 8, standardCodes: ['JRM-STD-2.5'] });
    const sheet = readCsv((await as(lab).get(`/api/lab-batches/${batch.id}/submission.csv`).expect(200)).text);
    const sent = ['1.234', '<0.005', '0.87', '-0.005', 'BDL', '12.5', '0.006', '2.49', '0.41', '3.3', '0.02', '7'];
    const rows = sheet.rows.map((row, index) => [row[2] as string, sent[index] as string]);
    const file = resultsCsv(rows);

    // Act: dry run, then save.
    const dry = (await upload(lab, batch.id, file, true).expect(200)).body;
    const countAfterDryRun = await AssayResult.count({ where: { batchId: batch.id } });
    const saved = (await upload(lab, batch.id, file, false).expect(200)).body;

    // Assert: every row matched, nothing lost, values as sent.
    expect([dry.canSave, dry.isSaved, countAfterDryRun]).toEqual([true, false, 0]);
    expect(await AssayResult.count({ where: { batchId: batch.id } })).toBe(rows.length);
    expect(saved.isSaved).toBe(true);
    const belowDetection = rows.filter(([, raw]) => raw === 'BDL' || /^[<-]/.test(raw as string)).length;
    expect(belowDetection).toBe(3);
    expect(saved.summary).toEqual({ rows: rows.length, blocking: 0, changed: rows.length, byStatus: { matched: rows.length - belowDetection, 'below-detection': belowDetection } });
    const view = (await as(geologist).get(`/api/lab-batches/${batch.id}`).expect(200)).body;
    const back = view.items.map((item: { labCode: string; assay: { rawValue: string; valueGpt: number; isBelowDetection: boolean; detectionLimitGpt: number | null } }) => [item.labCode, item.assay.valueGpt, item.assay.isBelowDetection, item.assay.detectionLimitGpt]);
    expect(back).toEqual(rows.map(([code, raw]) => {
      if (raw === 'BDL') return [code, 0.005, true, 0.005];
      if (raw?.startsWith('<') || raw?.startsWith('-')) return [code, 0.005, true, 0.005];
      return [code, Number(raw), Number(raw) < 0.005, 0.005];
    }));
    expect(view.status).toBe('reported');
    // The pile's grades now come from the assays (below detection at half the limit).
    const grades = await sampleGradesForPile(samples.pileId);
    const byCode = new Map(view.items.map((item: { sampleCode: string; assay: { valueGpt: number; isBelowDetection: boolean } }) => [item.sampleCode, item.assay]));
    for (const grade of grades) {
      const assay = byCode.get(grade.code) as { valueGpt: number; isBelowDetection: boolean };
      expect([grade.source, grade.gradeGpt]).toEqual(['assay', assay.isBelowDetection ? assay.valueGpt / 2 : assay.valueGpt]);
    }
  });

  it('changes nothing when the same file is imported again, and supersedes with history on a corrected file', async () => {
    const { batch } = await newBatch(3);
    const codes = batch.items.map((item: { labCode: string }) => item.labCode);
    const original = resultsCsv([[codes[0], '1.1'], [codes[1], '2.2'], [codes[2], '3.3']]);
    await upload(geologist, batch.id, original, false).expect(200);

    const again = (await upload(geologist, batch.id, original, false, 'results-copy.csv').expect(200)).body;
    expect([again.isAlreadyImported, again.isSaved]).toEqual([true, false]);
    expect(await ResultImport.count({ where: { batchId: batch.id } })).toBe(1);
    expect(await AssayResult.count({ where: { batchId: batch.id } })).toBe(3);

    const corrected = resultsCsv([[codes[0], '1.1'], [codes[1], '2.25'], [codes[2], '3.3']]);
    const report = (await upload(geologist, batch.id, corrected, false, 'results-corrected.csv').expect(200)).body;

    expect(report.rows.map((row: { change: string }) => row.change)).toEqual(['unchanged', 'supersedes', 'unchanged']);
    const history = await AssayResult.findAll({ where: { batchId: batch.id }, order: [['createdAt', 'ASC']] });
    expect(history).toHaveLength(4);
    const superseded = history.filter((row) => row.supersededAt !== null);
    expect(superseded.map((row) => [row.valueGpt, row.supersededByImportId])).toEqual([[2.2, report.importId]]);
    const imports = await ResultImport.findAll({ where: { batchId: batch.id }, order: [['importedAt', 'ASC']] });
    expect(imports.map((row) => [row.fileName, row.changedCount])).toEqual([['results.csv', 3], ['results-corrected.csv', 1]]);
  });

  it('reports the QA/QC verdicts of the batch with the dry run', async () => {
    const { batch } = await newBatch(2, { isBlind: false, blankEvery: 2, standardEvery: 2, standardCodes: ['JRM-STD-2.5'] });
    const valueFor = (item: { itemType: string }) => (item.itemType === 'blank' ? '0.2' : item.itemType === 'standard' ? '2.55' : '1.0');
    const file = resultsCsv(batch.items.map((item: { labCode: string; itemType: string }) => [item.labCode, valueFor(item)]));

    const report = (await upload(geologist, batch.id, file, true).expect(200)).body;

    // Blank 0.2 g/t > 5 × 0.005: fail. Standard 2.55 vs 2.52 ± 0.12: z = 0.25, pass.
    expect(report.qaqc.blanks.map((entry: { verdict: string }) => entry.verdict)).toEqual(['fail']);
    expect(report.qaqc.standards.map((entry: { verdict: string }) => entry.verdict)).toEqual(['pass']);
    expect(report.qaqc.standards[0].zScore).toBeCloseTo(0.25, 6);
    expect(report.qaqc.batches).toEqual([{ batchId: batch.id, batchCode: batch.code, verdict: 'fail', reasons: [expect.stringMatching(/^blank .* fail$/)] }]);
    expect(await AssayResult.count({ where: { batchId: batch.id } })).toBe(0);
  });

  it('refuses to save a file with a blocking row, and saves nothing of it', async () => {
    const { batch } = await newBatch(2);
    const codes = batch.items.map((item: { labCode: string }) => item.labCode);

    const response = await upload(geologist, batch.id, resultsCsv([[codes[0], '0.5'], [codes[1], 'n/a']]), false).expect(400);

    expect(response.body.error.code).toBe('validation_failed');
    expect(response.body.error.details.report.rows.map((row: { status: string }) => row.status)).toEqual(['matched', 'not-a-number']);
    expect(await AssayResult.count({ where: { batchId: batch.id } })).toBe(0);
    expect(await ResultImport.count({ where: { batchId: batch.id } })).toBe(0);
  });
});

describe('GET /api/lab-batches as the lab', () => {
  it('shows the lab its batches but not the types or field codes of a blind batch', async () => {
    const { batch } = await newBatch(2, { blankEvery: 2 });
    const list = (await as(lab).get('/api/lab-batches').expect(200)).body.items;
    expect(list.map((entry: { id: string }) => entry.id)).toContain(batch.id);
    const view = (await as(lab).get(`/api/lab-batches/${batch.id}`).expect(200)).body;
    expect(view.items.map((item: { itemType: unknown; sampleCode: unknown }) => [item.itemType, item.sampleCode])).toEqual([[null, null], [null, null], [null, null]]);
    expect(view.qaqc).toBeNull();
  });

  it('lets the lab fill in the receiving side of the chain of custody, and nothing else', async () => {
    const { batch } = await newBatch(1);
    const received = (await as(lab).patch(`/api/lab-batches/${batch.id}/custody`).send({ receivedBy: 'R. Tembo', receivedAt: '2026-06-03T09:00:00Z', conditionOnReceipt: 'seals intact' }).expect(200)).body;
    expect([received.receivedBy, received.receivedAt, received.conditionOnReceipt, received.status]).toEqual(['R. Tembo', '2026-06-03T09:00:00.000Z', 'seals intact', 'received']);

    const refused = await as(lab).patch(`/api/lab-batches/${batch.id}/custody`).send({ carrier: 'Someone else' }).expect(403);
    expect(refused.body.error.details).toEqual({ fields: ['carrier'] });
    expect((await LabBatch.findByPk(batch.id))?.carrier).toBeNull();
  });
});

describe('the submission sheet written with papaparse', () => {
  it('round-trips a pile material and codes through RFC 4180 parsing', async () => {
    const { batch } = await newBatch(1);
    const text = (await as(geologist).get(`/api/lab-batches/${batch.id}/submission.csv`).expect(200)).text;
    expect(text.endsWith('\r\n')).toBe(true);
    const parsed = Papa.parse<Record<string, string>>(text, { header: true, skipEmptyLines: true });
    expect(parsed.errors).toEqual([]);
    expect(parsed.data[0]).toMatchObject({ 'sample code': `${batch.code}-001`, material: 'sluice-tailings', type: 'sample' });
    expect(await LabBatchSample.count({ where: { batchId: batch.id } })).toBe(1);
  });
});
