// Every screen checked with axe-core in Chromium at phone size, signed in as the role that uses it:
// no serious or critical violation (missing labels, low contrast, unnamed buttons, and so on).
import assert from 'node:assert/strict';
import { randomUUID } from 'node:crypto';
import { after, before, describe, it } from 'node:test';
import AxeBuilder from '@axe-core/playwright';
import { DEMO_PASSWORD, launchBrowser, newContext, screenshot, startServer } from './harness.mjs';

/** Signs in over the API, for the records the test makes itself. */
async function apiLogin(baseUrl, email) {
  const response = await fetch(`${baseUrl}/api/auth/login`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email, password: DEMO_PASSWORD }) });
  assert.equal(response.status, 200);
  return response.json();
}

/** A pile with three pan-tested samples and a lab batch of them, so pile detail and the batch page have content. */
async function seedPileAndBatch(baseUrl) {
  const login = await apiLogin(baseUrl, 'geologist@demo.heapsight.test');
  const siteId = login.user.sites.find((site) => site.code === 'JR').id;
  const headers = { 'content-type': 'application/json', authorization: `Bearer ${login.accessToken}` };
  const pileId = randomUUID();
  const mutations = [{ mutationId: randomUUID(), entity: 'pile', id: pileId, op: 'upsert', baseRevision: null,
    data: { id: pileId, siteId, code: 'JR-66-P0001', material: 'sluice-tailings', footprint: null, heightM: 2, shapeModel: 'cone', angleOfReposeDeg: 35, bulkDensityTPerM3: null, moisturePct: 5, spotHeights: null, sackCount: null, sackMassKg: null, hazards: ['mercury'], notes: 'accessibility e2e' } }];
  const sampleIds = [];
  for (let index = 0; index < 3; index += 1) {
    const id = randomUUID();
    sampleIds.push(id);
    mutations.push({ mutationId: randomUUID(), entity: 'sample', id, op: 'upsert', baseRevision: null,
      data: { id, pileId, code: `JR-66-000${index + 1}`, sampleType: 'routine', duplicateOfId: null, standardId: null, location: { type: 'Point', coordinates: [33.452 + index * 1e-5, -4.0512] },
        gpsAccuracyM: 4, wetMassKg: 2.5, moisturePct: null, increments: 8, position: 'toe', collectedAt: new Date().toISOString(), collectorId: login.user.id, deviceId: 'e2e-a11y' } });
    const panId = randomUUID();
    mutations.push({ mutationId: randomUUID(), entity: 'panTest', id: panId, op: 'upsert', baseRevision: null,
      data: { id: panId, sampleId: id, massPannedKg: 10, colours: [], goldMassMg: 5 + index, panEfficiency: 1, testedAt: new Date().toISOString() } });
  }
  const pushed = await (await fetch(`${baseUrl}/api/sync/push`, { method: 'POST', headers, body: JSON.stringify({ deviceId: 'e2e-a11y', mutations }) })).json();
  assert.deepEqual([...new Set(pushed.results.map((result) => result.status))], ['applied']);
  const batch = await fetch(`${baseUrl}/api/lab-batches`, { method: 'POST', headers, body: JSON.stringify({
    siteId, sampleIds, labName: 'Kestrel Analytical', labContactEmail: 'assays@kestrel.lab.test', method: 'Fire assay, AAS finish', chargeMassG: 30,
    detectionLimitGpt: 0.005, upperLimitGpt: 100, isBlind: true, blankEvery: 0, standardEvery: 0, duplicateEvery: 0, standardCodes: [], seed: 20260601, notes: '',
  }) });
  assert.equal(batch.status, 201, await batch.clone().text());
  return { pileId, batchId: (await batch.json()).id };
}

async function signIn(page, baseUrl, email) {
  await page.goto(`${baseUrl}/sign-in`);
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password', { exact: true }).fill(DEMO_PASSWORD);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL((address) => !address.pathname.startsWith('/sign-in'));
}

/** The serious and critical violations on the page as it stands, one line each with where. */
async function seriousViolations(page) {
  const results = await new AxeBuilder({ page }).analyze();
  // Guards against a check that ran on nothing (a blank page, or axe kept out by the page).
  assert.ok(results.passes.length > 10, `axe checked only ${results.passes.length} rules`);
  return results.violations
    .filter((violation) => violation.impact === 'serious' || violation.impact === 'critical')
    .map((violation) => `${violation.impact} ${violation.id}: ${violation.help} — ${violation.nodes.slice(0, 4).map((node) => node.target.join(' ')).join(' | ')}`);
}

/** Screens by the role that uses them; `path` may use the seeded ids. */
const SCREENS = [
  { name: 'capture', role: 'sampler', path: () => '/capture' },
  { name: 'new pile', role: 'sampler', path: () => '/capture/pile/new' },
  { name: 'new sample', role: 'sampler', path: () => '/capture/sample/new' },
  { name: 'new pan test', role: 'sampler', path: () => '/capture/pan-test/new' },
  { name: 'sync', role: 'sampler', path: () => '/sync' },
  { name: 'safety', role: 'sampler', path: () => '/safety' },
  { name: 'labels', role: 'sampler', path: () => '/labels' },
  { name: 'sample mass', role: 'sampler', path: () => '/sample-mass' },
  { name: 'profile', role: 'sampler', path: () => '/profile' },
  { name: 'piles', role: 'geologist', path: () => '/piles' },
  { name: 'pile detail', role: 'geologist', path: (seeded) => `/piles/${seeded.pileId}` },
  { name: 'samples', role: 'geologist', path: () => '/samples' },
  { name: 'site map', role: 'geologist', path: () => '/site-map' },
  { name: 'lab batches', role: 'geologist', path: () => '/lab-batches' },
  { name: 'new lab batch', role: 'geologist', path: () => '/lab-batches/new' },
  { name: 'batch page', role: 'geologist', path: (seeded) => `/lab-batches/${seeded.batchId}` },
  { name: 'qaqc', role: 'geologist', path: () => '/qaqc' },
  { name: 'calibration', role: 'geologist', path: () => '/qaqc/calibration' },
  { name: 'trials', role: 'manager', path: () => '/trials' },
  { name: 'shortlist', role: 'manager', path: () => '/shortlist' },
  { name: 'people & sites', role: 'admin', path: () => '/people' },
  { name: 'outbox', role: 'admin', path: () => '/outbox' },
];

describe('accessibility of every screen (axe-core)', () => {
  let server;
  let browser;
  let seeded;
  const pages = new Map();

  before(async () => {
    server = await startServer();
    browser = await launchBrowser();
    seeded = await seedPileAndBatch(server.url);
  });

  after(async () => {
    await browser?.close();
    await server?.stop();
  });

  /** One signed-in page per role, reused across that role's screens. */
  async function pageFor(role) {
    if (!pages.has(role)) {
      const { context } = await newContext(browser);
      const page = await context.newPage();
      await signIn(page, server.url, `${role}@demo.heapsight.test`);
      pages.set(role, page);
    }
    return pages.get(role);
  }

  it('the check itself finds an icon button with no name', async () => {
    const { context } = await newContext(browser);
    const page = await context.newPage();
    await page.goto(`${server.url}/sign-in`);
    await page.getByRole('heading', { name: 'Sign in' }).waitFor();
    await page.evaluate(() => {
      const button = document.createElement('button');
      button.innerHTML = '<span class="material-icons" aria-hidden="true">close</span>';
      document.querySelector('main, body')?.appendChild(button);
    });

    assert.ok((await seriousViolations(page)).some((line) => line.includes('button-name')));
    await context.close();
  });

  it('sign-in has no serious or critical violation', async () => {
    const { context } = await newContext(browser);
    const page = await context.newPage();
    await page.goto(`${server.url}/sign-in`);
    await page.getByRole('heading', { name: 'Sign in' }).waitFor();

    assert.deepEqual(await seriousViolations(page), []);
    await context.close();
  });

  for (const screen of SCREENS) {
    it(`${screen.name} (as ${screen.role}) has no serious or critical violation`, async () => {
      const page = await pageFor(screen.role);
      await page.goto(`${server.url}${screen.path(seeded)}`);
      await page.getByRole('heading', { level: 1 }).first().waitFor();
      await page.waitForLoadState('networkidle');

      const violations = await seriousViolations(page);
      // The sunlight theme (high contrast for glare) must hold too.
      await page.evaluate(() => document.documentElement.classList.add('sunlight'));
      const sunlightViolations = (await seriousViolations(page)).map((line) => `sunlight: ${line}`);
      await page.evaluate(() => document.documentElement.classList.remove('sunlight'));
      await screenshot(page, `a11y-${screen.name.replace(/\W+/g, '-')}`);
      assert.deepEqual([...violations, ...sunlightViolations], []);
    });
  }
});
