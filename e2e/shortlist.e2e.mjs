// The manager's decision: a site with two piles that swap places when the gold price falls. The
// manager changes the price, sees the ranking change, downloads the decision report and the test
// renders its first page to PNG (pdftoppm, Debian poppler-utils) for a person to look at.
import assert from 'node:assert/strict';
import { execFileSync } from 'node:child_process';
import { randomUUID } from 'node:crypto';
import { mkdirSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { createRequire } from 'node:module';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { after, before, describe, it } from 'node:test';
import { DEMO_PASSWORD, ROOT, SCREENSHOT_DIR, launchBrowser, newContext, screenshot, startServer } from './harness.mjs';

const { DEMO_PEOPLE, DEMO_SITES } = createRequire(import.meta.url)(join(ROOT, 'dist/node/server/demo/demo-scenario.js'));
const person = (role) => DEMO_PEOPLE.find((candidate) => candidate.role === role);
const SITE_NAME = 'Eastern Edge test camp';

async function api(baseUrl, method, path, token, body) {
  const response = await fetch(`${baseUrl}${path}`, {
    method, headers: { 'content-type': 'application/json', ...(token ? { authorization: `Bearer ${token}` } : {}) },
    body: body === undefined ? undefined : JSON.stringify(body),
  });
  const text = await response.text();
  assert.ok(response.ok, `${method} ${path}: ${response.status} ${text.slice(0, 400)}`);
  return text ? JSON.parse(text) : null;
}

async function login(baseUrl, role) {
  const signedIn = await api(baseUrl, 'POST', '/api/auth/login', null, { email: person(role).email, password: DEMO_PASSWORD, deviceId: randomUUID(), deviceName: `e2e ${role}` });
  return signedIn.accessToken;
}

/** A new site the geologist and manager belong to, with a near rich pile and a far lean one. */
async function seedSite(baseUrl) {
  const admin = await login(baseUrl, 'admin');
  const site = await api(baseUrl, 'POST', '/api/sites', admin, { code: 'EE', name: SITE_NAME, processingLat: -3.9, processingLon: 34.2 });
  for (const role of ['geologist', 'manager']) {
    await api(baseUrl, 'PATCH', `/api/people/${person(role).id}`, admin, { siteIds: [...DEMO_SITES.map((demo) => demo.id), site.id] });
  }
  const geologist = await login(baseUrl, 'geologist');
  const piles = [
    { code: 'EE-09-P0001', box: [34.2005, -3.9005, 34.2008, -3.9002], heightM: 2.5, moisturePct: 5, goldMassMg: [6, 8, 10, 7, 9] },
    { code: 'EE-09-P0002', box: [34.215, -3.912, 34.216, -3.9112], heightM: 3, moisturePct: 8, goldMassMg: [2.4, 2.8, 1.8, 2.6, 1.94] },
  ];
  const mutations = [];
  let sequence = 0;
  for (const pile of piles) {
    const pileId = randomUUID();
    const [west, south, east, north] = pile.box;
    mutations.push({ mutationId: randomUUID(), entity: 'pile', id: pileId, op: 'upsert', baseRevision: null, data: {
      id: pileId, siteId: site.id, code: pile.code, material: 'mill-discharge', heightM: pile.heightM, shapeModel: 'cone', angleOfReposeDeg: 34,
      footprint: { type: 'Polygon', coordinates: [[[west, south], [east, south], [east, north], [west, north], [west, south]]] },
      bulkDensityTPerM3: 1.5, moisturePct: pile.moisturePct, spotHeights: null, sackCount: null, sackMassKg: null, hazards: ['mercury'], notes: '',
    } });
    for (const goldMassMg of pile.goldMassMg) {
      sequence += 1;
      const sampleId = randomUUID();
      const panTestId = randomUUID();
      mutations.push({ mutationId: randomUUID(), entity: 'sample', id: sampleId, op: 'upsert', baseRevision: null, data: {
        id: sampleId, pileId, code: `EE-09-${String(sequence).padStart(4, '0')}`, sampleType: 'routine', duplicateOfId: null, standardId: null,
        location: { type: 'Point', coordinates: [(west + east) / 2, (south + north) / 2] }, gpsAccuracyM: 4, wetMassKg: 10, moisturePct: 0, increments: 8,
        position: 'mid-slope', collectedAt: '2025-05-02T08:00:00.000Z', collectorId: person('geologist').id, deviceId: 'e2e',
      } });
      mutations.push({ mutationId: randomUUID(), entity: 'panTest', id: panTestId, op: 'upsert', baseRevision: null, data: {
        id: panTestId, sampleId, massPannedKg: 2, colours: [], goldMassMg, panEfficiency: 1, testedAt: '2025-05-02T10:00:00.000Z',
      } });
    }
  }
  const pushed = await api(baseUrl, 'POST', '/api/sync/push', geologist, { deviceId: 'e2e', mutations });
  assert.deepEqual([...new Set(pushed.results.map((result) => result.status))], ['applied']);
  const manager = await login(baseUrl, 'manager');
  await api(baseUrl, 'PATCH', `/api/economics/${site.id}`, manager, {
    goldPricePerTroyOz: 2000, payableFraction: 0.95, haulCostPerTKm: 0.5, roadFactor: 1.3, processingCostPerT: 20, fixedCostPerPile: 200,
    ownerShareOfGross: 0.25, defaultRecovery: 0.6, minSamplesToRank: 3,
  });
  return site;
}

async function signIn(page, baseUrl, email) {
  await page.goto(`${baseUrl}/sign-in`);
  await page.getByRole('heading', { name: 'Sign in' }).waitFor();
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password', { exact: true }).fill(DEMO_PASSWORD);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL((url) => !url.pathname.startsWith('/sign-in'));
}

/** The pile codes on screen, best first. */
const pileOrder = (page) => page.locator('ol.piles > li.pile').evaluateAll((items) => items.map((item) => item.getAttribute('data-pile')));

describe('the shortlist', () => {
  let server;
  let browser;
  let folder;

  before(async () => {
    server = await startServer();
    browser = await launchBrowser();
    folder = mkdtempSync(join(tmpdir(), 'heapsight-e2e-report-'));
  });

  after(async () => {
    await browser?.close();
    await server?.stop();
    if (folder) rmSync(folder, { recursive: true, force: true });
  });

  it('re-ranks when the manager changes the gold price, and gives a PDF report naming the site', async () => {
    await seedSite(server.url);
    const { context } = await newContext(browser, { acceptDownloads: true });
    const page = await context.newPage();
    await signIn(page, server.url, person('manager').email);
    await page.goto(`${server.url}/shortlist`);
    await page.getByRole('heading', { name: 'Shortlist' }).waitFor();
    await page.getByRole('combobox', { name: 'Site' }).first().click();
    await page.getByRole('option', { name: `EE · ${SITE_NAME}` }).click();
    await page.locator('li.pile[data-pile="EE-09-P0002"]').waitFor();
    await page.waitForFunction(() => document.querySelectorAll('ol.piles > li.pile').length === 2);
    assert.deepEqual(await pileOrder(page), ['EE-09-P0002', 'EE-09-P0001'], 'the large lean pile leads at 2,000 per ounce');
    await screenshot(page, 'shortlist-phone');

    const price = page.getByLabel('Gold price per troy ounce');
    await price.fill('1600');
    await page.getByRole('button', { name: 'Save parameters' }).click();
    await page.waitForFunction(() => document.querySelector('ol.piles > li.pile')?.getAttribute('data-pile') === 'EE-09-P0001');
    assert.deepEqual(await pileOrder(page), ['EE-09-P0001', 'EE-09-P0002'], 'the near rich pile leads at 1,600 per ounce');
    await page.getByText(/Gold price per troy ounce 2000 → 1600/).waitFor();
    await page.getByText('not a resource statement').first().waitFor();

    const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: 'Download PDF' }).click()]);
    const pdfPath = join(folder, download.suggestedFilename());
    await download.saveAs(pdfPath);
    assert.match(download.suggestedFilename(), /^heapsight-shortlist-EE-\d{4}-\d{2}-\d{2}\.pdf$/);
    assert.equal(readFileSync(pdfPath).subarray(0, 5).toString('latin1'), '%PDF-');
    const text = execFileSync('pdftotext', ['-layout', pdfPath, '-'], { encoding: 'utf8' }).replace(/\s+/g, ' ');
    assert.ok(text.includes(SITE_NAME), 'the report names the site');
    assert.ok(text.includes('1,600.00 USD per troy oz'), 'the report carries the new price');
    mkdirSync(SCREENSHOT_DIR, { recursive: true });
    execFileSync('pdftoppm', ['-png', '-r', '80', '-f', '1', '-l', '1', '-singlefile', pdfPath, join(SCREENSHOT_DIR, 'shortlist-report-page-1')]);
    assert.ok(readFileSync(join(SCREENSHOT_DIR, 'shortlist-report-page-1.png')).length > 10_000, 'the first page rendered to PNG');

    await page.locator('hs-sensitivity-chart').scrollIntoViewIfNeeded();
    await screenshot(page, 'shortlist-sensitivity-phone');
    await page.goto(`${server.url}/trials`);
    await page.getByRole('heading', { name: 'Trials' }).waitFor();
    await page.locator('p.working').filter({ hasText: 'Working recovery' }).waitFor();
    await screenshot(page, 'trials-phone');
    await context.close();
  });
});
