import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import Papa from 'papaparse';
import request from 'supertest';
import { MailMessage } from '../../../server/mail/mail-message.model';
import { neutraliseCell } from '../../../server/shortlist/shortlist-csv';
import { pdfText } from '../../../server/shortlist/shortlist-report';
import { createTestApp, type TestApp } from '../support/test-app';
import { createMemberSite, pushPiles, signInAll, type Tokens } from './support/shortlist-site';

/** Text of a PDF by poppler's pdftotext (Debian poppler-utils). */
function pdfToText(pdf: Buffer): string {
  const folder = mkdtempSync(join(tmpdir(), 'heapsight-pdf-'));
  try {
    writeFileSync(join(folder, 'report.pdf'), pdf);
    return execFileSync('pdftotext', ['-layout', join(folder, 'report.pdf'), '-'], { encoding: 'utf8' });
  } finally {
    rmSync(folder, { recursive: true, force: true });
  }
}

describe('the decision report', () => {
  let testApp: TestApp;
  let tokens: Tokens;
  let siteId: string;

  beforeAll(async () => {
    testApp = await createTestApp();
    tokens = await signInAll(testApp);
    siteId = await createMemberSite(testApp, 'XR', { lat: -3.9, lon: 34.2 });
    await pushPiles(testApp, tokens.geologist, siteId, 'XR', [
      { code: 'XR-09-P0001', box: [34.2005, -3.9005, 34.2008, -3.9002], heightM: 2.5, bulkDensityTPerM3: 1.5, moisturePct: 5, goldMassMg: [6, 8, 10, 7, 9], massPannedKg: 2 },
      { code: 'XR-09-P0002', box: [34.201, -3.901, 34.2012, -3.9008], heightM: 2, bulkDensityTPerM3: 1.5, moisturePct: 5, goldMassMg: [5], massPannedKg: 2 },
    ]);
  });

  afterAll(() => testApp.close());

  const get = (path: string, token = tokens.manager) => request(testApp.app).get(path).set('Authorization', `Bearer ${token}`)
    .buffer(true).parse((response, callback) => {
      const chunks: Buffer[] = [];
      response.on('data', (chunk: Buffer) => chunks.push(chunk));
      response.on('end', () => callback(null, Buffer.concat(chunks)));
    });

  describe('GET /api/shortlist/report.pdf', () => {
    it('is a PDF naming the site, the parameters, the safety cautions and the planning-estimate statement', async () => {
      const response = await get(`/api/shortlist/report.pdf?site=${siteId}&goldPricePerTroyOz=2222`);
      expect(response.status).toBe(200);
      expect(response.headers['content-type']).toBe('application/pdf');
      expect(response.headers['content-disposition']).toMatch(/attachment; filename="heapsight-shortlist-XR-\d{4}-\d{2}-\d{2}\.pdf"/);
      const pdf = response.body as Buffer;
      expect(pdf.subarray(0, 5).toString('latin1')).toBe('%PDF-');
      const text = pdfToText(pdf).replace(/\s+/g, ' ');
      expect(text).toContain('XR test camp');
      expect(text).toContain('2,222.00 USD per troy oz');
      expect(text).toContain('XR-09-P0001');
      expect(text).toContain('Mercury may be in old tailings');
      expect(text).toContain('Pile faces and pit walls collapse');
      expect(text).toContain('estimates for planning, not a resource statement');
      expect(text).toMatch(/XR-09-P0002: too few samples: 1 graded/);
    });

    it('refuses a price of zero before making anything', async () => {
      const response = await request(testApp.app).get(`/api/shortlist/report.pdf?site=${siteId}&goldPricePerTroyOz=0`).set('Authorization', `Bearer ${tokens.manager}`);
      expect(response.status).toBe(400);
      expect(response.body.error.code).toBe('validation_failed');
    });
  });

  describe('GET /api/shortlist/report.csv', () => {
    it('holds the same table, one row per pile, numbers unformatted', async () => {
      const response = await get(`/api/shortlist/report.csv?site=${siteId}`);
      expect(response.status).toBe(200);
      expect(response.headers['content-type']).toBe('text/csv; charset=utf-8');
      const parsed = Papa.parse<Record<string, string>>((response.body as Buffer).toString('utf8').replace(/^\uFEFF/, ''), { header: true, skipEmptyLines: true });
      expect(parsed.data.map((row) => row['Pile'])).toEqual(['XR-09-P0001', 'XR-09-P0002']);
      const json = (await request(testApp.app).get(`/api/shortlist?site=${siteId}`).set('Authorization', `Bearer ${tokens.manager}`)).body;
      expect(Number(parsed.data[0]?.['Net USD'])).toBeCloseTo(json.rows[0].netValue, 6);
      expect(parsed.data[1]?.['Rank']).toBe('');
      expect(parsed.data[1]?.['Status']).toMatch(/^not ranked: too few samples/);
    });
  });

  describe('neutraliseCell', () => {
    it.each(['=HYPERLINK("x")', '+1+1', '-2+3', '@SUM(A1)', '\tTAB'])('puts an apostrophe before a text cell that starts like a formula: %s', (cell) => {
      expect(neutraliseCell(cell)).toBe(`'${cell}`);
    });

    it('leaves numbers, negative ones too, and plain text alone', () => {
      expect([neutraliseCell(-1250.5), neutraliseCell('XR-09-P0001'), neutraliseCell(null)]).toEqual([-1250.5, 'XR-09-P0001', '']);
    });
  });

  describe('pdfText', () => {
    it('replaces what the built-in PDF fonts cannot draw', () => {
      expect(pdfText('net ≥ 0 − 2 → ok ✓ ± 3 %')).toBe('net >= 0 - 2 -> ok ? ± 3 %');
    });
  });

  describe('POST /api/shortlist/report/send', () => {
    it('sends the PDF and the CSV through the system mail, listed in the Outbox', async () => {
      const response = await request(testApp.app).post('/api/shortlist/report/send').set('Authorization', `Bearer ${tokens.manager}`)
        .send({ site: siteId, to: ['owner@example.test'], overrides: { goldPricePerTroyOz: 2300 } });
      expect(response.status).toBe(202);
      const message = await MailMessage.findByPk(response.body.id);
      expect(message?.recipients).toBe('owner@example.test');
      expect(message?.subject).toBe('Heapsight shortlist: XR test camp (XR)');
      expect(message?.textBody).toContain('not a resource statement');
      expect(JSON.parse(message?.attachments ?? '[]').map((attachment: { contentType: string }) => attachment.contentType)).toEqual(['application/pdf', 'text/csv; charset=utf-8']);
    });

    it('refuses a recipient that is not an e-mail address, sending nothing', async () => {
      const before = await MailMessage.count();
      const response = await request(testApp.app).post('/api/shortlist/report/send').set('Authorization', `Bearer ${tokens.manager}`).send({ site: siteId, to: ['not an address'] });
      expect(response.status).toBe(400);
      expect(await MailMessage.count()).toBe(before);
    });
  });
});
