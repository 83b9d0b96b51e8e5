// The review desk: a geologist signs in, opens the site map, shows the heat map with its legend,
// switches the piles to net-value shading with its money legend, opens a pile and reads its estimate;
// an admin uploads a site picture and sees it under the piles; at desktop and phone sizes, with no
// request leaving this machine.
import assert from 'node:assert/strict';
import { randomUUID } from 'node:crypto';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Jimp } from 'jimp';
import { after, before, describe, it } from 'node:test';
import { DEMO_PASSWORD, PHONE, launchBrowser, newContext, screenshot, startServer } from './harness.mjs';

const DESKTOP = { width: 1280, height: 860 };
const CENTRE = { lon: 33.4518, lat: -4.0512 };

/** A square footprint of about `side` metres around a point (local degrees per metre near the equator). */
function square(lon, lat, side) {
  const halfLat = side / 2 / 110_580;
  const halfLon = side / 2 / 111_050;
  return { type: 'Polygon', coordinates: [[[lon - halfLon, lat - halfLat], [lon + halfLon, lat - halfLat], [lon + halfLon, lat + halfLat], [lon - halfLon, lat + halfLat], [lon - halfLon, lat - halfLat]]] };
}

/** Two piles with pan-tested samples at the demo camp, pushed through sync as the geologist. */
async function seedPiles(url) {
  const login = await (await fetch(`${url}/api/auth/login`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email: 'geologist@demo.heapsight.test', password: DEMO_PASSWORD }) })).json();
  const siteId = login.user.sites.find((site) => site.code === 'JR').id;
  const mutations = [];
  const add = (entity, data) => mutations.push({ mutationId: randomUUID(), entity, id: data.id, op: 'upsert', baseRevision: null, data });
  const piles = [];
  [[-0.0006, 0, 24, 'mercury'], [0.0006, 0.0003, 18, 'silica-dust']].forEach(([dLon, dLat, side, hazard], pileIndex) => {
    const pile = {
      id: randomUUID(), siteId, code: `JR-77-P${String(pileIndex + 1).padStart(4, '0')}`, material: 'sluice-tailings', footprint: square(CENTRE.lon + dLon, CENTRE.lat + dLat, side),
      heightM: 2.5, shapeModel: 'flat-topped', angleOfReposeDeg: 35, bulkDensityTPerM3: 1.7, moisturePct: 8, spotHeights: null, sackCount: null, sackMassKg: null,
      hazards: [hazard], notes: 'seeded by the review-desk e2e',
    };
    piles.push(pile);
    add('pile', pile);
    for (let index = 0; index < 8; index += 1) {
      const sample = {
        id: randomUUID(), pileId: pile.id, code: `JR-77-${String(pileIndex * 100 + index + 1).padStart(4, '0')}`, sampleType: index === 7 ? 'duplicate' : 'routine',
        duplicateOfId: null, standardId: null,
        location: { type: 'Point', coordinates: [CENTRE.lon + dLon + ((index % 3) - 1) * 0.00006, CENTRE.lat + dLat + (Math.floor(index / 3) - 1) * 0.00006] },
        gpsAccuracyM: 3, wetMassKg: 10, moisturePct: 5, increments: 6, position: 'flank', collectedAt: '2026-03-01T08:00:00Z', collectorId: login.user.id, deviceId: 'e2e-device',
      };
      if (sample.sampleType === 'duplicate') sample.duplicateOfId = mutations.at(-2).data.id;
      add('sample', sample);
      add('panTest', { id: randomUUID(), sampleId: sample.id, massPannedKg: 10, colours: [], goldMassMg: 5 + index * 3 + pileIndex * 20, panEfficiency: 0.8, testedAt: '2026-03-01T09:00:00Z' });
    }
  });
  const pushed = await (await fetch(`${url}/api/sync/push`, { method: 'POST', headers: { 'content-type': 'application/json', authorization: `Bearer ${login.accessToken}` }, body: JSON.stringify({ deviceId: 'e2e-device', mutations }) })).json();
  assert.deepEqual([...new Set(pushed.results.map((result) => result.status))], ['applied'], JSON.stringify(pushed.results.filter((result) => result.status !== 'applied')));
  return piles;
}

/** A small north-up site picture: pale ground with a darker 20 px grid, so it shows under the piles. */
async function makeSitePicture() {
  const picture = new Jimp({ width: 240, height: 180, color: 0xe4dcc8ff });
  picture.scan(0, 0, 240, 180, (x, y, index) => {
    if (x % 20 === 0 || y % 20 === 0) {
      picture.bitmap.data.set([0x8a, 0x7a, 0x5c, 0xff], index);
    }
  });
  const path = join(mkdtempSync(join(tmpdir(), 'heapsight-e2e-')), 'camp.png');
  writeFileSync(path, await picture.getBuffer('image/png'));
  return path;
}

async function signIn(page, url, email = 'geologist@demo.heapsight.test') {
  await page.goto(`${url}/sign-in`);
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password', { exact: true }).fill(DEMO_PASSWORD);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL((address) => !address.pathname.startsWith('/sign-in'));
}

describe('the review desk', () => {
  let server;
  let browser;
  let piles;

  before(async () => {
    server = await startServer();
    browser = await launchBrowser();
    piles = await seedPiles(server.url);
  });

  after(async () => {
    await browser?.close();
    await server?.stop();
  });

  for (const [size, viewport] of [['desktop', DESKTOP], ['phone', PHONE]]) {
    it(`shows the heat map with its legend and a pile's estimate (${size}), with no outside request`, async () => {
      const { context, outsideRequests } = await newContext(browser, { viewport });
      const page = await context.newPage();
      await signIn(page, server.url);

      await page.goto(`${server.url}/site-map`);
      await page.getByRole('heading', { name: 'Site map' }).waitFor();
      await page.locator('label:has-text("Site") select').first().selectOption({ label: 'JR · Jackal Ridge camp' });
      await page.locator('.hs-pile-label', { hasText: piles[0].code }).waitFor();
      await page.getByTestId('heatmap-toggle').click();
      await page.getByTestId('heatmap-legend').waitFor();
      await page.locator('img.hs-heatmap').waitFor();
      const legend = await page.getByTestId('heatmap-legend').textContent();
      assert.match(legend, /g\/t/);
      assert.match(legend, /\d\.\d/);
      await page.locator('.leaflet-control-scale-line').waitFor();
      await page.locator('.hs-north-arrow').waitFor();
      await screenshot(page, `review-desk-site-map-${size}`);

      await page.getByTestId('shading-toggle').getByText('Net value').click();
      const moneyLegend = page.getByTestId('net-value-legend');
      await moneyLegend.waitFor();
      const currency = (await moneyLegend.locator('figcaption').textContent()).match(/\(([A-Z]{3})\)/)?.[1];
      assert.ok(currency, 'the legend names the currency');
      assert.match(await moneyLegend.textContent(), new RegExp(`\\d[\\d,]* ${currency}`));
      // Every pile's label says its rank and money, or that it is not ranked: never colour alone.
      // The grade labels fade out for 200 ms after the redraw; wait until only the money labels are left.
      await page.waitForFunction((code) => {
        const shown = [...document.querySelectorAll('.hs-pile-label')].map((label) => label.textContent ?? '');
        return shown.length > 0 && shown.every((text) => text.includes(code) || text.includes('not ranked'));
      }, currency);
      const labels = await page.locator('.hs-pile-label').allTextContents();
      assert.ok(labels.length > 0);
      for (const label of labels) assert.match(label, new RegExp(`#\\d+ · -?[\\d,]+ ${currency}|not ranked`));
      await screenshot(page, `review-desk-net-value-${size}`);

      await page.goto(`${server.url}/piles/${piles[0].id}`);
      await page.getByTestId('pile-estimate').getByTestId('dry-tonnes').waitFor();
      await page.getByTestId('mean-grade').waitFor();
      await page.getByText('Samples needed for ±20 % at 90 %', { exact: true }).waitFor();
      assert.match(await page.getByTestId('mean-grade').textContent(), /\d\.\d\d g\/t/);
      await page.getByRole('heading', { name: /mercury/i }).first().waitFor();
      await screenshot(page, `review-desk-pile-${size}`);

      await page.goto(`${server.url}/piles`);
      await page.locator('label:has-text("Site") select').first().selectOption({ label: 'JR · Jackal Ridge camp' });
      await page.getByRole('link', { name: piles[1].code }).waitFor();
      await page.goto(`${server.url}/samples`);
      await page.locator('label:has-text("Site") select').first().selectOption({ label: 'JR · Jackal Ridge camp' });
      // The demo site holds many samples: find the seeded one by the table's filter.
      await page.getByLabel('Filter samples').fill('JR-77-0001');
      await page.getByRole('cell', { name: 'JR-77-0001' }).waitFor();
      await screenshot(page, `review-desk-samples-${size}`);

      assert.deepEqual(outsideRequests, []);
      await context.close();
    });
  }

  for (const [size, viewport] of [['desktop', DESKTOP], ['phone', PHONE]]) {
    it(`lets an admin upload a site picture, refusing corners the wrong way round, and shows it under the piles (${size})`, async () => {
      const { context, outsideRequests } = await newContext(browser, { viewport });
      const page = await context.newPage();
      await signIn(page, server.url, 'admin@demo.heapsight.test');
      const siteId = piles[0].siteId;
      await page.goto(`${server.url}/site-map?site=${siteId}`);
      await page.locator('.hs-pile-label', { hasText: piles[0].code }).waitFor();
      await page.locator('#site-image-file').setInputFiles(await makeSitePicture());

      // Corners typed the wrong way round: refused in the form, nothing sent.
      const picturesBefore = await page.locator('img.hs-site-image').count();
      const box = { west: CENTRE.lon - 0.0012, east: CENTRE.lon + 0.0014, south: CENTRE.lat - 0.0006, north: CENTRE.lat + 0.0008 };
      await page.locator('#corner-north').fill(String(box.south));
      await page.locator('#corner-south').fill(String(box.north));
      await page.locator('#corner-west').fill(String(box.east));
      await page.locator('#corner-east').fill('33,45');
      await page.getByTestId('site-image-send').click();
      await page.getByText('The north edge must be greater than the south edge').waitFor();
      await page.getByText('Longitude in decimal degrees, with a point').waitFor();
      assert.equal(await page.locator('img.hs-site-image').count(), picturesBefore);
      assert.equal(await page.getByText('Site picture saved').count(), 0);

      for (const [field, value] of Object.entries(box)) await page.locator(`#corner-${field}`).fill(String(value));
      await page.getByTestId('site-image-send').click();
      await page.getByText('Site picture saved').waitFor();
      await page.locator('img.hs-site-image').waitFor();
      // Under the piles: the picture is the first thing in the overlay pane, the pile shapes come after it.
      const isUnderPiles = await page.evaluate(() => {
        const pane = document.querySelector('.leaflet-overlay-pane');
        const picture = pane?.querySelector('img.hs-site-image');
        const shapes = pane?.querySelector('svg');
        return Boolean(picture && shapes && pane.firstElementChild === picture && (picture.compareDocumentPosition(shapes) & Node.DOCUMENT_POSITION_FOLLOWING));
      });
      assert.equal(isUnderPiles, true);
      await page.locator('.leaflet-container').scrollIntoViewIfNeeded();
      await screenshot(page, `review-desk-site-picture-${size}`);
      await page.locator('hs-site-image-form').scrollIntoViewIfNeeded();
      await screenshot(page, `review-desk-site-picture-form-${size}`);

      // The server has it, with the corners typed.
      const stored = await page.evaluate(async (id) => {
        const tokens = JSON.parse(localStorage.getItem('heapsight.tokens') ?? 'null');
        const response = await fetch(`/api/sites/${id}/image-info`, { headers: { authorization: `Bearer ${tokens?.accessToken}` } });
        return response.json();
      }, siteId);
      assert.deepEqual([stored.west, stored.south, stored.east, stored.north, stored.widthPx], [box.west, box.south, box.east, box.north, 240]);
      assert.deepEqual(outsideRequests, []);
      await context.close();
    });
  }
});
