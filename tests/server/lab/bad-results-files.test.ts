import { readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import request from 'supertest';
import { AssayResult, ResultImport } from '../../../server/lab/lab.models';
import { createTestApp, type TestApp } from '../support/test-app';
import { batchBody, makeSamples, tokenFor } from './support/lab-fixtures';

/**
 * A corpus of bad results files (tests/fixtures/lab-results/). Each must get a clear report in the
 * dry run, be refused on save, and leave no assay and no import behind. The files name the items
 * of the first batch of a fresh database: JR-LB001-001 … JR-LB001-004.
 */
const FIXTURES = join(__dirname, '../../fixtures/lab-results');

/** What each file must be reported as: a file problem, or the status of each row in order. */
const EXPECTED: Record<string, { file: string } | { rows: string[]; message?: RegExp }> = {
  'semicolon-delimiter.csv': { file: 'wrong-delimiter' },
  'bom-unknown-code.csv': { rows: ['matched', 'unknown-code'] },
  'crlf-duplicate-row.csv': { rows: ['matched', 'matched', 'duplicate-row'], message: /first on line 2/ },
  'extra-column.csv': { file: 'unknown-column' },
  'missing-column.csv': { file: 'missing-column' },
  'extra-cells-in-row.csv': { rows: ['wrong-cell-count', 'matched'], message: /decimal mark/ },
  'missing-cells-in-row.csv': { rows: ['matched', 'wrong-cell-count'] },
  'unknown-codes.csv': { rows: ['matched', 'unknown-code', 'unknown-code'] },
  'text-in-number.csv': { rows: ['not-a-number', 'not-a-number', 'not-a-number'] },
  'comma-decimal-quoted.csv': { rows: ['not-a-number', 'matched'], message: /use a point as the decimal mark/ },
  'empty.csv': { file: 'empty-file' },
  'header-only.csv': { file: 'no-rows' },
  'workbook-not-csv.xlsx': { file: 'not-text' },
  'latin1-not-utf8.csv': { file: 'not-text' },
  'formula-injection.csv': { rows: ['formula-cell', 'formula-cell', 'formula-cell'] },
  'wrong-units.csv': { rows: ['wrong-units', 'matched'] },
  'missing-value.csv': { rows: ['missing-value', 'matched'] },
  'wrong-batch.csv': { rows: ['wrong-batch'] },
  'missing-code.csv': { rows: ['missing-code', 'matched'] },
};

let testApp: TestApp;
let geologist: string;
let batchId: string;

beforeAll(async () => {
  testApp = await createTestApp();
  geologist = await tokenFor(testApp.app, 'geologist');
  const { ids } = await makeSamples(testApp.app, geologist, [{ panGpt: 1 }, { panGpt: 2 }, { panGpt: 3 }, { panGpt: 4 }]);
  const batch = (await request(testApp.app).post('/api/lab-batches').set('Authorization', `Bearer ${geologist}`).send(batchBody(ids)).expect(201)).body;
  expect(batch.code).toBe('JR-LB001');
  batchId = batch.id;
});
afterAll(() => testApp.close());

const upload = (bytes: Buffer, fileName: string, dryRun: boolean) =>
  request(testApp.app).post(`/api/lab-batches/${batchId}/results?dryRun=${dryRun}`).set('Authorization', `Bearer ${geologist}`)
    .attach('file', bytes, { filename: fileName, contentType: 'text/csv' });

describe('POST /api/lab-batches/:id/results with a bad file', () => {
  it('has a corpus of at least 15 files, each with an expected report', () => {
    const files = readdirSync(FIXTURES).sort();
    expect(files.length).toBeGreaterThanOrEqual(15);
    expect(files).toEqual(Object.keys(EXPECTED).sort());
  });

  it.each(Object.entries(EXPECTED))('reports %s clearly and saves nothing', async (fileName, expected) => {
    const bytes = readFileSync(join(FIXTURES, fileName));

    const dry = (await upload(bytes, fileName, true).expect(200)).body;
    const save = await upload(bytes, fileName, false).expect(400);

    expect(dry.canSave).toBe(false);
    if ('file' in expected) {
      expect(dry.fileProblems.map((problem: { code: string }) => problem.code)).toContain(expected.file);
      expect(dry.fileProblems.every((problem: { message: string }) => problem.message.length > 20)).toBe(true);
    } else {
      expect(dry.fileProblems).toEqual([]);
      expect(dry.rows.map((row: { status: string }) => row.status)).toEqual(expected.rows);
      const blocking = dry.rows.filter((row: { isBlocking: boolean }) => row.isBlocking);
      expect(blocking.length).toBeGreaterThan(0);
      expect(blocking.every((row: { message: string }) => row.message.length > 10)).toBe(true);
      if (expected.message) {
        expect(blocking.map((row: { message: string }) => row.message).join('\n')).toMatch(expected.message);
      }
    }
    expect(save.body.error.code).toBe('validation_failed');
    expect(save.body.error.details.report.canSave).toBe(false);
    expect(await AssayResult.count()).toBe(0);
    expect(await ResultImport.count()).toBe(0);
  });

  it('reports the file lines of a CRLF file with a BOM correctly', async () => {
    const bytes = Buffer.from('\ufeffsample code,Au g/t\r\n\r\nJR-LB001-001,0.5\r\nJR-LB001-001,0.5\r\n', 'utf8');
    const dry = (await upload(bytes, 'lines.csv', true).expect(200)).body;
    expect(dry.rows.map((row: { line: number; status: string }) => [row.line, row.status])).toEqual([[3, 'matched'], [4, 'duplicate-row']]);
  });

  it('refuses a 5 MB file with 413 and saves nothing', async () => {
    // Generated here rather than committed: 5 MB of well-formed rows.
    const row = 'JR-LB001-001,0.53\n';
    const bytes = Buffer.from(`sample code,Au g/t\n${row.repeat(Math.ceil((5 * 1024 * 1024) / row.length))}`, 'utf8');
    expect(bytes.length).toBeGreaterThanOrEqual(5 * 1024 * 1024);

    const response = await upload(bytes, 'huge.csv', false).expect(413);

    expect(response.body.error).toMatchObject({ code: 'payload_too_large', message: expect.stringContaining('nothing was saved') });
    expect(await AssayResult.count()).toBe(0);
    expect(await ResultImport.count()).toBe(0);
  });

  it('refuses an upload with no file with 400', async () => {
    const response = await request(testApp.app).post(`/api/lab-batches/${batchId}/results?dryRun=true`).set('Authorization', `Bearer ${geologist}`).expect(400);
    expect(response.body.error.message).toMatch(/Attach the results CSV/);
  });
});
