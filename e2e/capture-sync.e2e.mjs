// Capture and sync end to end: the demo sampler, offline on a phone, tags a pile by tapping its
// corners on the map, takes two samples with photos and a pan test, reloads (still offline) and
// finds them all; back online, "Sync now" sends them up, the server has them with the photo's
// thumbnail, and a second phone signed in as the geologist pulls them. No request leaves the machine.
import assert from 'node:assert/strict';
import { join } from 'node:path';
import { after, before, describe, it } from 'node:test';
import { DEMO_PASSWORD, ROOT, launchBrowser, newContext, screenshot, startServer, waitForServiceWorker } from './harness.mjs';

const PHOTO = join(ROOT, 'tests/fixtures/pile-photo.jpg');

async function signIn(page, baseUrl, email) {
  await page.goto(`${baseUrl}/sign-in`);
  await page.getByRole('heading', { name: 'Sign in' }).waitFor();
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password', { exact: true }).fill(DEMO_PASSWORD);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL((url) => !url.pathname.startsWith('/sign-in'));
}

async function choose(page, label, option) {
  await page.getByRole('combobox', { name: label }).click();
  await page.getByRole('option', { name: option, exact: true }).click();
}

/** Calls the API as a demo person, the way a script at camp would. */
async function apiAs(baseUrl, email) {
  const login = await fetch(`${baseUrl}/api/auth/login`, {
    method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email, password: DEMO_PASSWORD }),
  });
  assert.equal(login.status, 200);
  const { accessToken } = await login.json();
  return (path) => fetch(`${baseUrl}${path}`, { headers: { authorization: `Bearer ${accessToken}` } });
}

/** Polls `probe` until it returns a value, for at most `timeoutMs`. */
async function eventually(probe, { timeoutMs = 20_000, everyMs = 250, what = 'condition' } = {}) {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const value = await probe();
    if (value) return value;
    if (Date.now() > deadline) throw new Error(`timed out waiting for ${what}`);
    await new Promise((resolve) => setTimeout(resolve, everyMs));
  }
}

/** The smallest box among the visible buttons, links, inputs and selects on the page. */
async function smallestTouchTarget(page) {
  return page.evaluate(() => {
    const targets = [...document.querySelectorAll('main button, main a[href], main mat-select, main input:not([type=file]), main textarea, main mat-checkbox')];
    const boxes = targets
      .map((element) => ({ element, box: (element.closest('mat-form-field') ?? element).getBoundingClientRect() }))
      .filter(({ box }) => box.width > 0 && box.height > 0)
      .filter(({ element }) => !element.closest('.leaflet-container'));
    return boxes.reduce((smallest, { element, box }) => (box.height < smallest.height ? { height: box.height, text: (element.textContent ?? element.getAttribute('aria-label') ?? element.tagName).trim().slice(0, 40) } : smallest), { height: Infinity, text: '' });
  });
}

describe('capture and sync', () => {
  let server;
  let browser;

  before(async () => {
    server = await startServer();
    browser = await launchBrowser();
  });

  after(async () => {
    await browser?.close();
    await server?.stop();
  });

  it('captures a pile, two samples with photos and a pan test offline, keeps them through a reload, syncs them and another device pulls them', async () => {
    // Arrange: the sampler signs in at camp and opens Capture while online (the demo piles arrive).
    const { context, outsideRequests } = await newContext(browser);
    const page = await context.newPage();
    await signIn(page, server.url, 'sampler@demo.heapsight.test');
    await page.goto(`${server.url}/capture`);
    await page.getByRole('heading', { name: 'Capture', exact: true }).waitFor();
    await waitForServiceWorker(page);
    await page.getByRole('heading', { name: 'Piles (6)' }).waitFor();

    // Act 1: off into the field with no signal.
    await context.setOffline(true);
    await page.getByRole('link', { name: 'New pile' }).click();
    await page.getByRole('heading', { name: 'New pile' }).waitFor();
    await screenshot(page, 'capture-pile-form-phone');
    await choose(page, 'Material', 'Mill discharge');
    await choose(page, 'Shape model', 'Flat-topped');
    await page.getByLabel('Height (m)').fill('2.5');
    await page.getByLabel('Moisture (%)').fill('9');
    await page.getByRole('checkbox', { name: /mercury/i }).check();
    await page.getByLabel('Owner or crew note').fill('Shed owner agrees to a trial');
    const map = page.getByLabel('Tap the corners of the pile toe');
    await map.scrollIntoViewIfNeeded();
    for (const position of [{ x: 120, y: 70 }, { x: 230, y: 80 }, { x: 250, y: 180 }, { x: 110, y: 190 }]) {
      await map.click({ position });
    }
    await page.getByText(/4 corners/).waitFor();
    await page.getByText(/area [\d,]+ m²/).waitFor();
    await screenshot(page, 'capture-pile-footprint-phone');
    await page.getByLabel('Add photo').setInputFiles(PHOTO);
    await page.getByText('1 photo', { exact: false }).waitFor();
    await page.getByRole('button', { name: 'Save pile' }).click();
    await page.waitForURL((url) => url.pathname === '/capture');
    await page.getByRole('heading', { name: 'Piles (7)' }).waitFor();
    const pileCode = (await page.getByRole('listitem').filter({ has: page.getByLabel('waiting to sync') }).first().locator('strong').textContent()).trim();
    assert.match(pileCode, /^JR-\d{2,4}-P0001$/);

    const sampleCodes = [];
    for (const [index, wetMass] of ['11.4', '9.8'].entries()) {
      await page.getByRole('link', { name: 'New sample' }).click();
      await page.getByRole('heading', { name: 'New sample' }).waitFor();
      await choose(page, 'Pile', pileCode);
      await page.getByLabel('Wet mass (kg)').fill(wetMass);
      await page.getByLabel('Moisture (%)').fill('8');
      await page.getByLabel('Position on pile').fill(index === 0 ? 'toe, 0.3 m' : 'crest, 0.4 m');
      await page.getByLabel('Add photo').setInputFiles(PHOTO);
      if (index === 0) await screenshot(page, 'capture-sample-form-phone');
      await page.getByRole('button', { name: 'Save sample' }).click();
      await page.waitForURL((url) => url.pathname === '/capture');
      const pending = page.getByRole('listitem').filter({ has: page.getByLabel('waiting to sync') }).filter({ hasText: ' kg' });
      await eventually(async () => (await pending.count()) === index + 1, { what: `sample ${index + 1} in the list` });
      // The list is newest first: the sample just saved is the one not yet counted.
      const shown = (await pending.locator('strong').allTextContents()).map((code) => code.trim());
      sampleCodes.push(shown.find((code) => !sampleCodes.includes(code)));
    }
    assert.equal(new Set(sampleCodes).size, 2);

    await page.getByRole('link', { name: 'Pan test' }).click();
    await page.getByRole('heading', { name: 'Pan test' }).waitFor();
    await choose(page, 'Sample', sampleCodes[0]);
    await page.getByLabel('Mass panned (kg)').fill('5');
    for (let colour = 0; colour < 6; colour += 1) await page.getByRole('button', { name: 'more fine' }).click();
    await page.getByRole('button', { name: 'more medium' }).click();
    await page.getByText(/Estimated grade \d+\.\d\d g\/t/).waitFor();
    await screenshot(page, 'capture-pan-test-form-phone');
    await page.getByRole('button', { name: 'Save pan test' }).click();
    await page.waitForURL((url) => url.pathname === '/capture');

    // Assert 1: a reload with no network shows everything captured.
    await page.reload();
    await page.getByRole('heading', { name: 'Piles (7)' }).waitFor();
    for (const code of [pileCode, ...sampleCodes]) await page.getByText(code, { exact: true }).waitFor();
    await page.getByRole('status').filter({ hasText: /[1-9]\d* changes wait on this phone/ }).waitFor();
    await screenshot(page, 'capture-home-offline-phone');
    const smallest = await smallestTouchTarget(page);
    assert.ok(smallest.height >= 48, `touch target "${smallest.text}" is ${smallest.height} px high`);

    // Act 2: back at camp, sync.
    await context.setOffline(false);
    await page.getByRole('link', { name: 'Sync' }).first().click();
    await page.getByRole('heading', { name: 'Sync', exact: true }).waitFor();
    await page.getByRole('button', { name: 'Sync now' }).click();
    await page.getByRole('status').filter({ hasText: /^\s*0 changes waiting/ }).waitFor({ timeout: 30_000 });
    await page.getByText(/Up to date · /).waitFor({ timeout: 30_000 });
    await screenshot(page, 'capture-sync-done-phone');

    // Assert 2: the server holds the pile, both samples, the pan test and the photos (with thumbnails).
    const api = await apiAs(server.url, 'geologist@demo.heapsight.test');
    const piles = await (await api('/api/piles?limit=500')).json();
    const pile = piles.items.find((item) => item.code === pileCode);
    assert.ok(pile, `pile ${pileCode} on the server`);
    assert.equal(pile.material, 'mill-discharge');
    assert.equal(pile.footprint.coordinates[0].length, 5);
    const samples = await (await api(`/api/samples?pileId=${pile.id}`)).json();
    assert.deepEqual(samples.items.map((sample) => sample.code).sort(), [...sampleCodes].sort());
    const pulled = await (await api('/api/sync/pull?since=0&limit=1000')).json();
    const sampleIds = samples.items.map((sample) => sample.id);
    const firstSampleId = samples.items.find((sample) => sample.code === sampleCodes[0]).id;
    const panTests = pulled.changes.filter((change) => change.entity === 'panTest' && sampleIds.includes(change.data.sampleId));
    assert.deepEqual(panTests.map((change) => [change.data.sampleId, change.data.colours]), [[firstSampleId, [{ sizeClass: 'medium', count: 1 }, { sizeClass: 'fine', count: 6 }]]]);
    const photos = pulled.changes.filter((change) => change.entity === 'photo' && [pile.id, ...sampleIds].includes(change.data.ownerId));
    assert.equal(photos.length, 3, 'one photo of the pile and one of each sample');
    for (const photo of photos) {
      const thumbnail = await eventually(async () => {
        const response = await api(`/api/photos/${photo.id}?size=thumb`);
        return response.status === 200 && response.headers.get('x-photo-size') === 'thumb' ? response : null;
      }, { what: `the thumbnail of photo ${photo.id}` });
      assert.equal(thumbnail.headers.get('content-type'), 'image/jpeg');
      assert.ok((await thumbnail.arrayBuffer()).byteLength > 500);
    }

    // Act 3 and Assert 3: another phone, signed in as the geologist, pulls the sampler's work.
    const other = await newContext(browser);
    const geologistPage = await other.context.newPage();
    await signIn(geologistPage, server.url, 'geologist@demo.heapsight.test');
    await geologistPage.goto(`${server.url}/sync`);
    await geologistPage.getByRole('button', { name: 'Sync now' }).click();
    await geologistPage.getByText(/Up to date · /).waitFor({ timeout: 30_000 });
    await geologistPage.goto(`${server.url}/capture`);
    for (const code of [pileCode, ...sampleCodes]) await geologistPage.getByText(code, { exact: true }).waitFor();
    // The pile's photo came from the other phone: its thumbnail is fetched from the server with the sign-in.
    await geologistPage.getByRole('listitem').filter({ hasText: pileCode }).getByRole('img', { name: 'Photo' }).waitFor();
    await screenshot(geologistPage, 'capture-second-device-phone');

    assert.deepEqual(outsideRequests, []);
    assert.deepEqual(other.outsideRequests, []);
    await other.context.close();
    await context.close();
  });
});
