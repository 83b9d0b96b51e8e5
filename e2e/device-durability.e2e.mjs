// What the phone keeps when things go wrong on it. Offline in Chromium, the sampler saves samples
// and the page is closed at once, at several moments in the middle of the save: reopened, every
// record on the device has its outbox entry and every outbox entry its record (a record with no
// entry would never sync; an entry with no record would sync something the crew cannot see).
// A full phone is e2e/full-phone.e2e.mjs (and capture.store.spec.ts). Chromium's DevTools quota
// override set below the usage is not enforced for IndexedDB, with or without a service worker; that
// test uses a small real quota instead.
import assert from 'node:assert/strict';
import { join } from 'node:path';
import { after, before, describe, it } from 'node:test';
import { ROOT, launchBrowser, newContext, readDeviceRecords, signIn, startServer, waitForServiceWorker } from './harness.mjs';

const PHOTO = join(ROOT, 'tests/fixtures/pile-photo.jpg');
/** How long after the tap on Save the page is closed: before, during and after the device write. */
const CLOSE_AFTER_MS = [0, 5, 15, 30, 60, 120, 250, 500];

/** Opens New sample and fills it for the first pile, with a photo. */
async function fillSample(page, baseUrl, { pileCode, wetMass }) {
  await page.goto(`${baseUrl}/capture/sample/new`);
  await page.getByRole('heading', { name: 'New sample' }).waitFor();
  await page.getByRole('combobox', { name: 'Pile' }).click();
  await page.getByRole('option', { name: pileCode, exact: true }).click();
  await page.getByLabel('Wet mass (kg)').fill(wetMass);
  await page.getByLabel('Position on pile').fill('toe');
  await page.getByLabel('Add photo').setInputFiles(PHOTO);
}

/** Every pending record has its outbox entry and every entry its record. */
function assertRecordsMatchOutbox(device, when) {
  const queued = new Set(device.outbox.map((entry) => `${entry.entity}:${entry.id}`));
  const kept = new Set([...device.samples.map((row) => `sample:${row.id}`), ...device.photos.map((row) => `photo:${row.id}`)]);
  for (const record of kept) assert.ok(queued.has(record), `${when}: ${record} is on the phone with no outbox entry`);
  for (const entry of queued) assert.ok(kept.has(entry), `${when}: outbox entry ${entry} has no record`);
  const sampleIds = new Set(device.samples.map((row) => row.id));
  for (const photo of device.photos) {
    assert.ok(sampleIds.has(photo.ownerId), `${when}: photo ${photo.id} kept without its sample`);
    assert.ok(photo.bytes > 0, `${when}: photo ${photo.id} kept without its bytes`);
  }
  // Each sample was saved with one photo: both or neither.
  for (const sample of device.samples) {
    assert.equal(device.photos.filter((photo) => photo.ownerId === sample.id).length, 1, `${when}: sample ${sample.code} kept without its photo`);
  }
}

describe('device durability', () => {
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

  it('closing the page in the middle of saves never leaves a record without its outbox entry, nor the other way round', async (t) => {
    // Arrange: the sampler has opened Capture once at camp, then goes offline.
    const { context } = await newContext(browser);
    let page = await context.newPage();
    await signIn(page, server.url, 'sampler@demo.heapsight.test');
    await page.goto(`${server.url}/capture`);
    await page.getByRole('heading', { name: 'Piles (6)' }).waitFor();
    await waitForServiceWorker(page);
    const pileCode = (await page.getByRole('listitem').filter({ hasText: /JR-\d+-P\d+/ }).first().locator('strong').textContent()).trim();
    await context.setOffline(true);

    // Act: save, and close the page that many milliseconds after the tap; reopen each time.
    const outcomes = [];
    for (const [index, delay] of CLOSE_AFTER_MS.entries()) {
      await fillSample(page, server.url, { pileCode, wetMass: String(10 + index) });
      await page.getByRole('button', { name: 'Save sample' }).click({ noWaitAfter: true });
      if (delay > 0) await new Promise((resolve) => setTimeout(resolve, delay));
      await page.close({ runBeforeUnload: false });
      page = await context.newPage();
      await page.goto(`${server.url}/capture`);
      await page.getByRole('heading', { name: 'Capture', exact: true }).waitFor();
      const device = await page.evaluate(readDeviceRecords);
      assertRecordsMatchOutbox(device, `closed ${delay} ms after Save`);
      outcomes.push(`${delay} ms: ${device.samples.length} samples, ${device.photos.length} photos`);
    }

    // Assert: the last save (closed half a second later) had time to finish; all saves agree with the outbox.
    t.diagnostic(`after each close: ${outcomes.join('; ')}`);
    const device = await page.evaluate(readDeviceRecords);
    assert.ok(device.samples.some((row) => row.wetMassKg === 10 + CLOSE_AFTER_MS.length - 1), 'the save given half a second was kept');
    assert.equal(new Set(device.samples.map((row) => row.code)).size, device.samples.length, 'no code given twice');
    await context.close();
  });

});
