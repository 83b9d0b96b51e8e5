// A full phone, in Chromium: the sampler saves a sample, the device then runs out of space, and the
// next sample is refused with the clear "This phone is full" message; the form stays filled in and
// the sample saved before is still on the phone with its photo and outbox entries. Once there is
// room again, the same tap on Save records the sample once: one outbox entry per record, none lost,
// none twice.
//
// How the phone is made full: DevTools' Storage.overrideQuotaForOrigin, set BELOW what is used, is
// not enforced by Chromium 150 for IndexedDB (Cache API and the origin private file system do refuse
// under it, IndexedDB writes of 40 MB still went through under a 1 kB quota). So the browser runs on
// an on-disk profile whose real quota is made small with Chromium's own setting
// (--enable-features=StorageQuotaSettings:PoolSizeBytes/N: the origin gets 3/4 of N), and the test
// fills that quota with a database of its own until IndexedDB refuses even a 1 kB write. Raising
// the quota with the override IS honoured, which is how the test gives the phone room again.
// (A Playwright browser.newContext() is off the record: its quota comes from the memory size and
// ignores the setting, hence launchPersistentContext here.)
import assert from 'node:assert/strict';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { after, before, describe, it } from 'node:test';
import { chromium } from 'playwright-core';
import { CHROMIUM_PATH, PHONE, ROOT, readDeviceRecords, screenshot, signIn, startServer } from './harness.mjs';

const PHOTO = join(ROOT, 'tests/fixtures/pile-photo.jpg');
/** The words the crew sees, from the app's own English strings (core.storageFull.message). */
const FULL_MESSAGE = JSON.parse(readFileSync(join(ROOT, 'src/app/core/i18n/en.json'), 'utf8')).storageFull.message;
/** Storage pool for the whole profile; the origin's quota is 3/4 of it (1.5 MB), a few times what the app uses after sign-in. */
const POOL_BYTES = 2_000_000;
/** The database the test fills the quota with, apart from the app's own. */
const FILLER_DB = 'e2e-filler';
/** Same flags as the harness's launchBrowser (no calls to outside hosts), plus the small quota. */
const CHROMIUM_ARGS = [
  '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking',
  '--disable-component-update', '--disable-sync', '--disable-dev-shm-usage',
  `--enable-features=StorageQuotaSettings:PoolSizeBytes/${POOL_BYTES}`,
];

/**
 * Writes random (incompressible) blobs into the filler database, halving the chunk each time
 * IndexedDB refuses one, until even a 1 kB write is refused. Runs in the page; returns what it wrote
 * and the names of the refusals, so the test can check the browser really said QuotaExceededError.
 */
function fillStorage(databaseName) {
  const open = () => new Promise((resolve, reject) => {
    const opening = indexedDB.open(databaseName, 1);
    opening.onupgradeneeded = () => opening.result.createObjectStore('filler', { autoIncrement: true });
    opening.onsuccess = () => resolve(opening.result);
    opening.onerror = () => reject(opening.error);
  });
  const randomBlob = (bytes) => {
    const data = new Uint8Array(bytes);
    for (let start = 0; start < bytes; start += 65_536) crypto.getRandomValues(data.subarray(start, Math.min(bytes, start + 65_536)));
    return new Blob([data]);
  };
  const write = (db, bytes) => new Promise((resolve) => {
    const transaction = db.transaction('filler', 'readwrite');
    transaction.objectStore('filler').add(randomBlob(bytes));
    transaction.oncomplete = () => resolve(null);
    transaction.onabort = () => resolve(transaction.error?.name ?? 'aborted');
  });
  return open().then(async (db) => {
    let chunk = 256_000;
    let written = 0;
    const refusals = new Set();
    while (chunk >= 1_000) {
      const refusal = await write(db, chunk);
      if (refusal === null) {
        written += chunk;
      } else {
        refusals.add(refusal);
        chunk = Math.floor(chunk / 2);
      }
    }
    db.close();
    return { written, refusals: [...refusals] };
  });
}

/** Every pending record has exactly one outbox entry, every entry its record, and each sample its one photo with bytes. */
function assertOneEntryPerRecord(device, when) {
  const entries = device.outbox.map((entry) => `${entry.entity}:${entry.id}`);
  const records = [...device.samples.map((row) => `sample:${row.id}`), ...device.photos.map((row) => `photo:${row.id}`)];
  assert.deepEqual([...entries].sort(), [...records].sort(), `${when}: outbox entries and records on the phone differ`);
  assert.equal(new Set(entries).size, entries.length, `${when}: a record is queued twice`);
  for (const sample of device.samples) {
    const photos = device.photos.filter((photo) => photo.ownerId === sample.id);
    assert.equal(photos.length, 1, `${when}: sample ${sample.code} has ${photos.length} photos, saved with one`);
    assert.ok(photos[0].bytes > 0, `${when}: the photo of ${sample.code} has lost its bytes`);
  }
}

/** From Capture home, opens New sample the way the crew does (no page load, so no sync starts) and fills it with a photo. */
async function fillSample(page, { pileCode, wetMass, position }) {
  await page.getByRole('link', { name: 'New sample' }).click();
  await page.getByRole('heading', { name: 'New sample' }).waitFor();
  await page.getByRole('combobox', { name: 'Pile' }).click();
  await page.getByRole('option', { name: pileCode, exact: true }).click();
  await page.getByLabel('Wet mass (kg)').fill(wetMass);
  await page.getByLabel('Position on pile').fill(position);
  await page.getByLabel('Add photo').setInputFiles(PHOTO);
  await page.getByText('1 photo(s)').waitFor();
}

/** A phone of its own: an on-disk profile with the small quota, service workers blocked (the page loads from the server, and no worker's caches share the quota). */
async function launchPhone() {
  const profileDir = mkdtempSync(join(tmpdir(), 'heapsight-e2e-profile-'));
  const context = await chromium.launchPersistentContext(profileDir, {
    executablePath: CHROMIUM_PATH, headless: true, args: CHROMIUM_ARGS, serviceWorkers: 'block',
    viewport: PHONE, deviceScaleFactor: 1, hasTouch: true,
  });
  return {
    context,
    async close() {
      await context.close();
      rmSync(profileDir, { recursive: true, force: true });
    },
  };
}

/**
 * The whole story on one phone. `labelCode`: the second sample's code typed from the bag's label,
 * or null to let the device make it (the form then writes the next sequence number first).
 */
async function saveOnAFullPhone(t, server, { labelCode, screenshotName }) {
  const phone = await launchPhone();
  try {
    // Arrange: the sampler signs in and opens Capture; the first sync has finished.
    const { context } = phone;
    const page = context.pages()[0] ?? await context.newPage();
    const origin = new URL(server.url).origin;
    const cdp = await context.newCDPSession(page);
    const pushes = [];
    page.on('request', (request) => { if (new URL(request.url()).pathname.startsWith('/api/sync/push')) pushes.push(request.url()); });
    await signIn(page, server.url, 'sampler@demo.heapsight.test');
    await page.goto(`${server.url}/capture`);
    await page.getByRole('heading', { name: 'Piles (6)' }).waitFor();
    await page.waitForFunction(() => new Promise((resolve) => {
      const opening = indexedDB.open('heapsight');
      opening.onsuccess = () => {
        const request = opening.result.transaction('syncState').objectStore('syncState').get('lastSyncAt');
        request.onsuccess = () => { opening.result.close(); resolve(Boolean(request.result)); };
      };
    }));
    const { quota } = await cdp.send('Storage.getUsageAndQuota', { origin });
    assert.ok(quota <= POOL_BYTES, `the small quota is in force (quota ${quota} bytes)`);
    const pileCode = (await page.getByRole('listitem').filter({ hasText: /JR-\d+-P\d+/ }).first().locator('strong').textContent()).trim();
    const samplesHeading = page.getByRole('heading', { name: /^Samples \(\d+\)$/ });
    const samplesBefore = Number(/\d+/.exec(await samplesHeading.textContent())[0]);

    // A sample saved while there is room (its code made on the device).
    await fillSample(page, { pileCode, wetMass: '12.5', position: 'toe' });
    await page.getByRole('button', { name: 'Save sample' }).click();
    await page.getByRole('heading', { name: `Samples (${samplesBefore + 1})` }).waitFor();
    const saved = await page.evaluate(readDeviceRecords);
    assert.equal(saved.samples.length, 1);
    assertOneEntryPerRecord(saved, 'after the first save');

    // The next sample is filled in, and meanwhile the phone fills up.
    await fillSample(page, { pileCode, wetMass: '23.75', position: 'crest' });
    if (labelCode) await page.getByTestId('label-code').fill(labelCode);
    const filled = await page.evaluate(fillStorage, FILLER_DB);
    t.diagnostic(`quota ${quota} bytes; filler wrote ${filled.written} bytes until refused with ${filled.refusals.join(', ')}`);
    assert.deepEqual(filled.refusals, ['QuotaExceededError'], 'the browser itself refuses writes for lack of space');
    const notice = page.locator('.storage-full-notice');
    assert.equal(await notice.count(), 0, 'no notice before Save is tapped');

    // Act: Save on a full phone.
    const save = page.getByRole('button', { name: 'Save sample' });
    await save.click();

    // Assert: the clear message, the form still open and filled in, the earlier sample untouched.
    await notice.getByText(FULL_MESSAGE, { exact: true }).waitFor({ timeout: 10_000 });
    await notice.getByRole('button', { name: 'OK' }).waitFor();
    t.diagnostic(`screenshot: ${await screenshot(page, screenshotName)}`);
    assert.equal(new URL(page.url()).pathname, '/capture/sample/new', 'the form stays open');
    assert.equal(await page.getByLabel('Wet mass (kg)').inputValue(), '23.75');
    assert.equal(await page.getByLabel('Position on pile').inputValue(), 'crest');
    if (labelCode) assert.equal(await page.getByTestId('label-code').inputValue(), labelCode);
    await page.getByText('1 photo(s)').waitFor();
    const refused = await page.evaluate(readDeviceRecords);
    assert.deepEqual(refused, saved, 'the refused save changed nothing on the phone, and the first sample is kept');

    // Act: room again (the quota raised), and Save tapped again. The notice (which stays until
    // dismissed) sits at the top of the screen, clear of the Save button it asks the crew to tap.
    await cdp.send('Storage.overrideQuotaForOrigin', { origin, quotaSize: 100_000_000 });
    await save.scrollIntoViewIfNeeded();
    const [saveBox, noticeBox] = [await save.boundingBox(), await notice.boundingBox()];
    assert.ok(noticeBox.y + noticeBox.height <= saveBox.y || noticeBox.y >= saveBox.y + saveBox.height,
      `the notice (${noticeBox.y}-${noticeBox.y + noticeBox.height} px) leaves Save (${saveBox.y}-${saveBox.y + saveBox.height} px) uncovered`);
    await save.click();

    // Assert: saved once, next to the first; one outbox entry per record, nothing pushed meanwhile.
    await page.getByRole('heading', { name: `Samples (${samplesBefore + 2})` }).waitFor();
    const after = await page.evaluate(readDeviceRecords);
    assertOneEntryPerRecord(after, 'after the save with room');
    assert.equal(after.samples.length, 2);
    assert.deepEqual(after.samples.find((row) => row.id === saved.samples[0].id), saved.samples[0], 'the first sample is as it was saved');
    const second = after.samples.find((row) => row.id !== saved.samples[0].id);
    assert.equal(second.wetMassKg, 23.75);
    assert.equal(second.position, 'crest');
    if (labelCode) assert.equal(second.code, labelCode);
    assert.notEqual(second.code, saved.samples[0].code, 'the second sample has its own code');
    assert.deepEqual(pushes, [], 'nothing was synced meanwhile, so the outbox is what the phone recorded');
  } finally {
    await phone.close();
  }
}

describe('full phone', () => {
  let server;

  before(async () => {
    server = await startServer();
  });

  after(async () => {
    await server?.stop();
  });

  it('a sample with a code from its label: refused with a clear message, the form and what was saved kept, saved once when there is room', async (t) => {
    await saveOnAFullPhone(t, server, { labelCode: 'JR-77-0001', screenshotName: 'full-phone-message' });
  });

  it('a sample with a code made on the device: the same (the code counter is refused like the record)', async (t) => {
    await saveOnAFullPhone(t, server, { labelCode: null, screenshotName: 'full-phone-message-device-code' });
  });
});
