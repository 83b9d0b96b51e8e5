import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { randomUUID } from 'node:crypto';
import request from 'supertest';
import { DEMO_PEOPLE, DEMO_SITES } from '../../../server/demo/demo-scenario';
import { LabelRange } from '../../../server/labels/label-range.model';
import { parseHumanCode } from '../../../shared/sync/human-code';
import { signInAll, type Tokens } from '../shortlist/support/shortlist-site';
import { createTestApp, type TestApp } from '../support/test-app';

/** Text of a PDF by poppler's pdftotext (Debian poppler-utils). */
function pdfToText(pdf: Buffer): string {
  const folder = mkdtempSync(join(tmpdir(), 'heapsight-labels-'));
  try {
    writeFileSync(join(folder, 'labels.pdf'), pdf);
    return execFileSync('pdftotext', ['-layout', join(folder, 'labels.pdf'), '-'], { encoding: 'utf8' });
  } finally {
    rmSync(folder, { recursive: true, force: true });
  }
}

/** Every sample code printed on a sheet, in reading order. */
function codesOn(pdf: Buffer): string[] {
  return pdfToText(pdf).match(/\b[A-Z0-9]{1,8}-\d{2,4}-\d{4,6}\b/g) ?? [];
}

/** Number of pages, by pdftotext's form feeds. */
function pageCount(pdf: Buffer): number {
  return pdfToText(pdf).split('\f').filter((page) => page.trim() !== '').length;
}

const JR = DEMO_SITES.find((site) => site.code === 'JR')!;
const IF = DEMO_SITES.find((site) => site.code === 'IF')!;
const SAMPLER_ID = DEMO_PEOPLE.find((person) => person.role === 'sampler')!.id;

function binary(response: request.Response, callback: (error: Error | null, body: Buffer) => void): void {
  const chunks: Buffer[] = [];
  response.on('data', (chunk: Buffer) => chunks.push(chunk));
  response.on('end', () => callback(null, Buffer.concat(chunks)));
}

describe('sample label sheets', () => {
  let testApp: TestApp;
  let tokens: Tokens;

  beforeAll(async () => {
    testApp = await createTestApp();
    tokens = await signInAll(testApp);
  });

  afterAll(() => testApp.close());

  function getLabels(token: string, query: string) {
    return request(testApp.app).get(`/api/labels.pdf?${query}`).set('Authorization', `Bearer ${token}`).buffer(true).parse(binary);
  }

  describe('GET /api/labels.pdf', () => {
    it('when a sampler asks for 24 labels, prints one A4 page of 24 distinct codes of their site', async () => {
      const response = await getLabels(tokens.sampler, `site=${JR.id}&count=24`);

      expect(response.status).toBe(200);
      expect(response.headers['content-type']).toBe('application/pdf');
      expect(response.headers['content-disposition']).toMatch(/^attachment; filename="heapsight-labels-JR-\d{2,4}-\d{4,6}-to-JR-\d{2,4}-\d{4,6}\.pdf"$/);
      const codes = codesOn(response.body as Buffer);
      expect(codes).toHaveLength(24);
      expect(new Set(codes).size).toBe(24);
      expect(codes.every((code) => parseHumanCode(code)?.siteCode === 'JR')).toBe(true);
      expect(pageCount(response.body as Buffer)).toBe(1);
      expect(pdfToText(response.body as Buffer)).toContain('Jackal Ridge camp (JR)');
    });

    it('when two sheets are printed for one site, by different people, no code appears on both', async () => {
      const first = codesOn((await getLabels(tokens.sampler, `site=${JR.id}&count=30`)).body as Buffer);
      const second = codesOn((await getLabels(tokens.geologist, `site=${JR.id}&count=30`)).body as Buffer);

      expect(first).toHaveLength(30);
      expect(second).toHaveLength(30);
      expect(first.filter((code) => second.includes(code))).toEqual([]);
      // The second sheet carries on where the first stopped.
      const lastOfFirst = parseHumanCode(first[first.length - 1])!;
      expect(parseHumanCode(second[0])!.sequence).toBe(lastOfFirst.sequence + 1);
    });

    it('when sheets are asked for at once, every code is reserved once and recorded as a range', async () => {
      const sheets = await Promise.all([1, 2, 3, 4].map(() => getLabels(tokens.geologist, `site=${IF.id}&count=5`)));

      const codes = sheets.flatMap((sheet) => codesOn(sheet.body as Buffer));
      expect(codes).toHaveLength(20);
      expect(new Set(codes).size).toBe(20);
      const ranges = await LabelRange.findAll({ where: { siteId: IF.id }, order: [['firstSequence', 'ASC']] });
      expect(ranges.map((range) => [range.firstSequence, range.lastSequence])).toEqual([[1, 5], [6, 10], [11, 15], [16, 20]]);
    });

    it('prints labels under a device number no phone has, so printed codes never meet a phone-made code', async () => {
      const phone = await request(testApp.app).post('/api/sync/device').set('Authorization', `Bearer ${tokens.sampler}`).send({ deviceId: `phone-${randomUUID()}` });
      const codes = codesOn((await getLabels(tokens.sampler, `site=${JR.id}&count=3`)).body as Buffer);

      expect(phone.status).toBe(200);
      expect(codes.map((code) => parseHumanCode(code)!.deviceNumber)).not.toContain(phone.body.deviceNumber);
    });

    it('when 25 labels are asked for, starts a second page', async () => {
      const response = await getLabels(tokens.geologist, `site=${JR.id}&count=25`);

      expect(codesOn(response.body as Buffer)).toHaveLength(25);
      expect(pageCount(response.body as Buffer)).toBe(2);
    });

    it('when a printed code is given to a sample on one phone, the server refuses the same code from another phone', async () => {
      // Arrange: one label, and a pile to sample.
      const [code] = codesOn((await getLabels(tokens.sampler, `site=${JR.id}&count=1`)).body as Buffer);
      const pileId = randomUUID();
      const push = (deviceId: string, mutations: unknown[]) =>
        request(testApp.app).post('/api/sync/push').set('Authorization', `Bearer ${tokens.sampler}`).send({ deviceId, mutations });
      const sample = (id: string, deviceId: string) => ({ mutationId: randomUUID(), entity: 'sample', id, op: 'upsert', baseRevision: null, data: {
        id, pileId, code, sampleType: 'routine', duplicateOfId: null, standardId: null, location: null, gpsAccuracyM: null, wetMassKg: 9, moisturePct: null,
        increments: 6, position: 'toe', collectedAt: '2026-06-01T08:00:00Z', collectorId: SAMPLER_ID, deviceId } });
      await push('phone-a', [{ mutationId: randomUUID(), entity: 'pile', id: pileId, op: 'upsert', baseRevision: null, data: {
        id: pileId, siteId: JR.id, code: 'JR-98-P0001', material: 'sluice-tailings', footprint: null, heightM: 2, shapeModel: 'cone', angleOfReposeDeg: 35,
        bulkDensityTPerM3: null, moisturePct: 5, spotHeights: null, sackCount: null, sackMassKg: null, hazards: [], notes: '' } }]);

      // Act
      const first = await push('phone-a', [sample(randomUUID(), 'phone-a')]);
      const second = await push('phone-b', [sample(randomUUID(), 'phone-b')]);

      // Assert
      expect(first.body.results).toEqual([expect.objectContaining({ status: 'applied' })]);
      expect(second.body.results[0].status).toBe('rejected');
      expect(JSON.stringify(second.body.results[0].errors)).toContain(`The code ${code} is already used at this site`);
    });

    describe('refusals', () => {
      it.each([
        ['count 0', 'count=0', /at least one/],
        ['a count over 240', 'count=241', /at most 240/],
        ['a count that is not a whole number', 'count=2.5', /whole number/],
        ['no count', '', /count/],
      ])('refuses %s with 400 and reserves nothing', async (_name, countQuery, message) => {
        const before = await LabelRange.count();

        const response = await request(testApp.app).get(`/api/labels.pdf?site=${JR.id}&${countQuery}`).set('Authorization', `Bearer ${tokens.sampler}`);

        expect(response.status).toBe(400);
        expect(response.body.error.code).toBe('validation_failed');
        expect(JSON.stringify(response.body.error.details)).toMatch(message);
        expect(await LabelRange.count()).toBe(before);
      });

      it('refuses a site the sampler is not a member of with 403 and reserves nothing', async () => {
        const before = await LabelRange.count();

        const response = await request(testApp.app).get(`/api/labels.pdf?site=${IF.id}&count=5`).set('Authorization', `Bearer ${tokens.sampler}`);

        expect(response.status).toBe(403);
        expect(await LabelRange.count()).toBe(before);
      });

      it('refuses a site that is not an id with 400', async () => {
        const response = await request(testApp.app).get('/api/labels.pdf?site=JR&count=5').set('Authorization', `Bearer ${tokens.sampler}`);

        expect(response.status).toBe(400);
      });

      it('refuses roles that do not take samples (manager, lab) with 403', async () => {
        for (const role of ['manager', 'lab'] as const) {
          const response = await request(testApp.app).get(`/api/labels.pdf?site=${JR.id}&count=5`).set('Authorization', `Bearer ${tokens[role]}`);
          expect(response.status).toBe(403);
        }
      });

      it('refuses a stranger with 401', async () => {
        const response = await request(testApp.app).get(`/api/labels.pdf?site=${JR.id}&count=5`);

        expect(response.status).toBe(401);
      });
    });
  });
});
