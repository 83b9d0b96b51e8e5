// Sample labels end to end, on a phone: the sampler prints sheets of pre-numbered labels (A4 PDF,
// read back with Debian poppler-utils' pdfinfo and pdftotext), then in Capture scans a label with
// the camera. The camera is Chromium's fake capture device playing a YUV4MPEG2 file the test makes
// from the QR fixture, so the scan goes through getUserMedia, the video element and the QR decoder.
import assert from 'node:assert/strict';
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { after, before, describe, it } from 'node:test';
import { Jimp } from 'jimp';
import jsQR from 'jsqr';
import { chromium } from 'playwright-core';
import { CHROMIUM_ARGS, CHROMIUM_PATH, ROOT, launchBrowser, newContext, screenshot, signIn, startServer } from './harness.mjs';

const SAMPLER = 'sampler@demo.heapsight.test';
/** The demo sampler works at one site only, JR; the fixture's label is of that site. */
const SITE_CODE = 'JR';
const FIXTURE_CODE = 'JR-03-0042';
const FIXTURE = join(ROOT, `tests/fixtures/label-qr-${FIXTURE_CODE}.png`);
const FRAME = { width: 640, height: 480 };
const SAMPLE_CODE_PATTERN = /^([A-Z0-9]{1,8})-(\d{2,4})-(\d{4,6})$/;

/**
 * A YUV4MPEG2 video (I420, BT.601) of a few identical frames: the PNG centred on a white 640×480
 * picture. Chromium's fake camera plays it in a loop.
 */
async function writeY4m(pngPath, y4mPath) {
  const image = await Jimp.read(pngPath);
  const { width, height, data } = image.bitmap;
  assert.ok(width <= FRAME.width && height <= FRAME.height, `the fixture (${width}×${height}) fits the frame`);
  const rgb = Buffer.alloc(FRAME.width * FRAME.height * 3, 255);
  const left = Math.floor((FRAME.width - width) / 2);
  const top = Math.floor((FRAME.height - height) / 2);
  for (let y = 0; y < height; y += 1) {
    for (let x = 0; x < width; x += 1) {
      const source = (y * width + x) * 4;
      const alpha = data[source + 3] / 255;
      const target = ((top + y) * FRAME.width + left + x) * 3;
      // Over white, as the printed label is.
      for (let channel = 0; channel < 3; channel += 1) rgb[target + channel] = Math.round(data[source + channel] * alpha + 255 * (1 - alpha));
    }
  }
  const luma = Buffer.alloc(FRAME.width * FRAME.height);
  const chromaWidth = FRAME.width / 2;
  const chromaU = Buffer.alloc(chromaWidth * (FRAME.height / 2));
  const chromaV = Buffer.alloc(chromaU.length);
  const clamp = (value) => Math.max(0, Math.min(255, Math.round(value)));
  for (let y = 0; y < FRAME.height; y += 1) {
    for (let x = 0; x < FRAME.width; x += 1) {
      const at = (y * FRAME.width + x) * 3;
      luma[y * FRAME.width + x] = clamp(16 + 0.257 * rgb[at] + 0.504 * rgb[at + 1] + 0.098 * rgb[at + 2]);
    }
  }
  for (let y = 0; y < FRAME.height / 2; y += 1) {
    for (let x = 0; x < chromaWidth; x += 1) {
      // Each chroma sample is the mean of its 2×2 block.
      let [r, g, b] = [0, 0, 0];
      for (const [dx, dy] of [[0, 0], [1, 0], [0, 1], [1, 1]]) {
        const at = ((2 * y + dy) * FRAME.width + 2 * x + dx) * 3;
        r += rgb[at] / 4;
        g += rgb[at + 1] / 4;
        b += rgb[at + 2] / 4;
      }
      chromaU[y * chromaWidth + x] = clamp(128 - 0.148 * r - 0.291 * g + 0.439 * b);
      chromaV[y * chromaWidth + x] = clamp(128 + 0.439 * r - 0.368 * g - 0.071 * b);
    }
  }
  const frame = Buffer.concat([Buffer.from('FRAME\n'), luma, chromaU, chromaV]);
  const header = Buffer.from(`YUV4MPEG2 W${FRAME.width} H${FRAME.height} F30:1 Ip A1:1 C420jpeg\n`);
  writeFileSync(y4mPath, Buffer.concat([header, frame, frame, frame, frame, frame]));
  return luma;
}

/** The luma plane as grey RGBA, for checking that the video the camera plays holds a readable QR code. */
function lumaAsRgba(luma) {
  const rgba = new Uint8ClampedArray(luma.length * 4);
  for (let index = 0; index < luma.length; index += 1) {
    rgba.fill(luma[index], index * 4, index * 4 + 3);
    rgba[index * 4 + 3] = 255;
  }
  return rgba;
}

/** Asks for a sheet on the labels screen; returns the saved PDF, the server's range header and the screen's own words. */
async function downloadSheet(page, folder) {
  const [download, response] = await Promise.all([
    page.waitForEvent('download'),
    page.waitForResponse((candidate) => new URL(candidate.url()).pathname === '/api/labels.pdf'),
    page.getByTestId('labels-download').click(),
  ]);
  assert.equal(response.status(), 200, 'the server printed the sheet');
  const path = join(folder, download.suggestedFilename());
  await download.saveAs(path);
  const printed = page.getByTestId('labels-printed');
  await printed.waitFor();
  // The status line is replaced on the next download; wait until it names this sheet's range.
  const [headerFirst, headerLast] = response.headers()['x-label-codes'].split('..');
  await page.waitForFunction(([first, last]) => {
    const text = document.querySelector('[data-testid="labels-printed"]')?.textContent ?? '';
    return text.includes(first) && text.includes(last);
  }, [headerFirst, headerLast]);
  const status = /(\d+) labels reserved: (\S+) to ([^\s.]+)\./.exec(await printed.textContent());
  assert.ok(status, 'the screen says which codes were reserved');
  return { path, filename: download.suggestedFilename(), count: Number(status[1]), first: status[2], last: status[3], headerFirst, headerLast };
}

/** Every code from `first` to `last` (same site and device number), in order. */
function codesBetween(first, last) {
  const [, site, device, firstSequence] = SAMPLE_CODE_PATTERN.exec(first) ?? [];
  const [, lastSite, lastDevice, lastSequence] = SAMPLE_CODE_PATTERN.exec(last) ?? [];
  assert.ok(site && lastSite, `${first} and ${last} are sample codes (SITE-DEVICE-SEQ)`);
  assert.equal(lastSite, site);
  assert.equal(lastDevice, device, 'one sheet is printed under one device number');
  return Array.from({ length: Number(lastSequence) - Number(firstSequence) + 1 },
    (_, index) => `${site}-${device}-${String(Number(firstSequence) + index).padStart(4, '0')}`);
}

/** The sample codes in the PDF's text (pages `from` to `to`), in reading order. */
function codesInPdf(path, from, to) {
  const text = execFileSync('pdftotext', ['-f', String(from), '-l', String(to), path, '-'], { encoding: 'utf8' });
  return text.split(/\s+/).filter((word) => SAMPLE_CODE_PATTERN.test(word));
}

describe('sample labels', () => {
  let server;
  let folder;

  before(async () => {
    server = await startServer();
    folder = mkdtempSync(join(tmpdir(), 'heapsight-e2e-labels-'));
  });

  after(async () => {
    await server?.stop();
    if (folder) rmSync(folder, { recursive: true, force: true });
  });

  it('the sampler prints A4 sheets of new labels whose text holds exactly the reserved codes, and the next sheet carries on', async () => {
    const browser = await launchBrowser();
    try {
      const { context, outsideRequests } = await newContext(browser, { acceptDownloads: true });
      const page = await context.newPage();
      await signIn(page, server.url, SAMPLER);
      await page.goto(`${server.url}/labels`);
      await page.getByRole('heading', { name: 'Sample labels' }).waitFor();
      await page.getByTestId('labels-site').getByText(`(${SITE_CODE})`).waitFor();

      // 30 labels: a full sheet of 24 and a second sheet of 6.
      await page.getByLabel('Number of labels').fill('30');
      await page.getByText('2 A4 sheets of 24 (3 × 8)').waitFor();
      const sheet = await downloadSheet(page, folder);
      await screenshot(page, 'labels-printed-phone');

      assert.equal(sheet.count, 30);
      assert.equal(sheet.first, sheet.headerFirst, 'the screen names the first code the server reserved');
      assert.equal(sheet.last, sheet.headerLast, 'the screen names the last code the server reserved');
      assert.equal(sheet.filename, `heapsight-labels-${sheet.first}-to-${sheet.last}.pdf`);
      const expected = codesBetween(sheet.first, sheet.last);
      assert.equal(expected.length, 30, `${sheet.first} to ${sheet.last} is 30 codes`);
      assert.ok(expected.every((code) => code.startsWith(`${SITE_CODE}-`)), 'the codes are of the chosen site');

      assert.equal(readFileSync(sheet.path).subarray(0, 5).toString('latin1'), '%PDF-');
      const info = execFileSync('pdfinfo', ['-f', '1', '-l', '2', sheet.path], { encoding: 'utf8' });
      assert.match(info, /^Pages:\s+2$/m, '30 labels take two sheets');
      const pageSizes = [...info.matchAll(/^Page\s+\d+ size:\s+(.+)$/gm)].map((match) => match[1].trim());
      assert.deepEqual(pageSizes, ['595.28 x 841.89 pts (A4)', '595.28 x 841.89 pts (A4)'], 'both pages are A4');
      assert.deepEqual(codesInPdf(sheet.path, 1, 1), expected.slice(0, 24), 'the first page holds the first 24 codes, in order');
      assert.deepEqual(codesInPdf(sheet.path, 2, 2), expected.slice(24), 'the second page holds the other 6');

      // A second sheet never repeats a code: it starts right after the first one.
      await page.getByRole('button', { name: '24', exact: true }).click();
      await page.getByText('1 A4 sheet of 24 (3 × 8)').waitFor();
      const next = await downloadSheet(page, folder);
      assert.equal(next.count, 24);
      const nextExpected = codesBetween(next.first, next.last);
      assert.equal(nextExpected.length, 24);
      const [, site, device, lastSequence] = SAMPLE_CODE_PATTERN.exec(sheet.last);
      assert.equal(next.first, `${site}-${device}-${String(Number(lastSequence) + 1).padStart(4, '0')}`, 'the site\'s label number carries on');
      assert.match(execFileSync('pdfinfo', [next.path], { encoding: 'utf8' }), /^Page size:\s+595\.28 x 841\.89 pts \(A4\)$/m);
      assert.deepEqual(codesInPdf(next.path, 1, 1), nextExpected);
      assert.ok(nextExpected.every((code) => !expected.includes(code)), 'no code is on both sheets');
      assert.deepEqual(outsideRequests, []);
      await context.close();
    } finally {
      await browser.close();
    }
  });

  it('a label held to the camera fills the label code of a new sample, which is saved under that code', async () => {
    const y4mPath = join(folder, 'label-camera.y4m');
    const luma = await writeY4m(FIXTURE, y4mPath);
    assert.equal(jsQR(lumaAsRgba(luma), FRAME.width, FRAME.height)?.data, FIXTURE_CODE, 'the camera video holds the fixture label');

    const browser = await chromium.launch({
      executablePath: CHROMIUM_PATH, headless: true,
      args: [...CHROMIUM_ARGS, '--use-fake-ui-for-media-stream', '--use-fake-device-for-media-stream', `--use-file-for-fake-video-capture=${y4mPath}`],
    });
    try {
      const { context, outsideRequests } = await newContext(browser);
      await context.grantPermissions(['camera'], { origin: server.url });
      const page = await context.newPage();
      await signIn(page, server.url, SAMPLER);
      await page.goto(`${server.url}/capture`);
      const pileItem = page.getByRole('listitem').filter({ hasText: new RegExp(`${SITE_CODE}-\\d+-P\\d+`) }).first();
      await pileItem.waitFor();
      const pileCode = (await pileItem.locator('strong').textContent()).trim();
      await page.getByRole('listitem').filter({ hasText: FIXTURE_CODE }).waitFor({ state: 'detached' });

      await page.getByRole('link', { name: 'New sample' }).click();
      await page.getByRole('heading', { name: 'New sample' }).waitFor();
      await page.getByRole('combobox', { name: 'Pile' }).click();
      await page.getByRole('option', { name: pileCode, exact: true }).click();
      const labelCode = page.getByTestId('label-code');
      assert.equal(await labelCode.inputValue(), '', 'the label code starts empty');

      await page.getByTestId('scan-label').click();
      await page.waitForFunction((code) => document.querySelector('[data-testid="label-code"]')?.value === code, FIXTURE_CODE);
      assert.equal(await labelCode.inputValue(), FIXTURE_CODE);
      assert.equal(await page.getByTestId('label-problem').count(), 0, 'the scanned label is accepted');
      await page.getByRole('region', { name: 'Label scanner' }).waitFor({ state: 'detached' });
      assert.equal(await page.evaluate(() => [...document.querySelectorAll('video')].length), 0, 'the camera preview is gone after the read');
      await page.getByTestId('scan-label').waitFor();
      await screenshot(page, 'labels-scanned-phone');

      await page.getByLabel('Wet mass (kg)').fill('9.5');
      await page.getByLabel('Moisture (%)').fill('6');
      await page.getByLabel('Position on pile').fill('crest');
      await page.getByRole('button', { name: 'Save sample' }).click();
      await page.waitForURL((url) => url.pathname === '/capture');
      const saved = page.getByRole('listitem').filter({ hasText: FIXTURE_CODE });
      await saved.waitFor();
      assert.equal(await saved.count(), 1, 'the sample is listed once, under the scanned code');
      assert.deepEqual(outsideRequests, []);
      await context.close();
    } finally {
      await browser.close();
    }
  });
});
