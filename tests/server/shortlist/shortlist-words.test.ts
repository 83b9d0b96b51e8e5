import request from 'supertest';
import { assumption, thinDataReason, type ServerTextFormat } from '../../../src/app/features/shortlist/server-text';
import { createTestApp, type TestApp } from '../support/test-app';
import { createMemberSite, pushPiles, signInAll, type SeededPile, type Tokens } from './support/shortlist-site';

/**
 * The Shortlist screen says the server's reasons and assumptions in the crew's language by knowing
 * each sentence's shape (src/app/features/shortlist/server-text.ts). This pins the two together: every
 * sentence the server sends here, for ranked and thin piles, with and without trials, what-if values
 * and built-in defaults, is one the screen recognises, so rewording one on the server fails here
 * instead of showing English to a French or Kiswahili reader.
 */
const PILES: SeededPile[] = [
  { code: 'XW-09-P0001', box: [34.2005, -3.9005, 34.2008, -3.9002], heightM: 2.5, bulkDensityTPerM3: 1.5, moisturePct: 5, goldMassMg: [6, 8, 10, 7, 9], massPannedKg: 2 },
  { code: 'XW-09-P0002', box: [34.201, -3.901, 34.2012, -3.9008], heightM: 2, bulkDensityTPerM3: 1.5, moisturePct: 5, goldMassMg: [5, 6], massPannedKg: 2 },
  { code: 'XW-09-P0003', box: null, heightM: 2, bulkDensityTPerM3: 1.5, moisturePct: 5, goldMassMg: [3, 4, 5], massPannedKg: 2 },
  { code: 'XW-09-P0004', box: [34.202, -3.902, 34.2022, -3.9018], heightM: 2, bulkDensityTPerM3: 1.5, moisturePct: 5, goldMassMg: [], massPannedKg: 2 },
];
const plainFormat: ServerTextFormat = { number: String, percent: (value) => `${value * 100}%`, field: (name) => name };

describe('the Shortlist screen knows every sentence the server sends', () => {
  let testApp: TestApp;
  let tokens: Tokens;
  let siteId: string;

  beforeAll(async () => {
    testApp = await createTestApp();
    tokens = await signInAll(testApp);
    siteId = await createMemberSite(testApp, 'XW', { lat: -3.9, lon: 34.2 });
    await pushPiles(testApp, tokens.geologist, siteId, 'XW', PILES);
  });

  afterAll(() => testApp.close());

  const sentencesOf = async (query: string) => {
    const response = await request(testApp.app).get(`/api/shortlist?site=${siteId}${query}`).set('Authorization', `Bearer ${tokens.manager}`);
    expect(response.status).toBe(200);
    const body = response.body as { assumptions: string[]; rows: { thinDataReasons: string[] }[] };
    return { assumptions: body.assumptions, reasons: body.rows.flatMap((pile) => pile.thinDataReasons) };
  };

  it.each([
    ['the site as set up (built-in defaults, no trial)', ''],
    ['a what-if recovery and price', '&recovery=0.55&goldPricePerTroyOz=1800'],
  ])('%s', async (_, query) => {
    const { assumptions, reasons } = await sentencesOf(query);

    expect(reasons.length).toBeGreaterThan(0);
    expect(assumptions.length).toBeGreaterThan(0);
    expect(reasons.filter((sentence) => 'text' in thinDataReason(sentence, plainFormat))).toEqual([]);
    expect(assumptions.filter((sentence) => 'text' in assumption(sentence, plainFormat))).toEqual([]);
  });
});
