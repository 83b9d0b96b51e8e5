// Walking skeleton: the installed app opens with no network at all after the first visit,
// with its own fonts and icons, and never asks a host outside this machine for anything.
import assert from 'node:assert/strict';
import { after, before, describe, it } from 'node:test';
import { launchBrowser, newContext, reloadOffline, screenshot, startServer, waitForServiceWorker } from './harness.mjs';

describe('the app shell offline', () => {
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

  it('renders from the service worker after going offline, with local fonts and no outside request', async () => {
    const { context, outsideRequests } = await newContext(browser);
    const page = await context.newPage();
    await page.goto(server.url);
    await page.getByRole('heading', { name: 'Capture' }).waitFor();
    await waitForServiceWorker(page);
    await page.reload();
    assert.equal(await page.evaluate(() => navigator.serviceWorker.controller !== null), true, 'page is controlled by the worker');

    await context.setOffline(true);
    await reloadOffline(context, page);
    await page.getByRole('heading', { name: 'Capture' }).waitFor();
    assert.equal(await page.evaluate(() => navigator.onLine), false);
    await page.getByRole('status').filter({ hasText: 'Offline' }).waitFor();

    // Navigating to a lazy route offline proves its chunk was cached too.
    await page.getByRole('link', { name: 'Safety' }).first().click();
    await page.getByRole('heading', { name: 'Safety at the piles' }).waitFor();

    const fonts = await page.evaluate(async () => {
      await document.fonts.ready;
      return [...document.fonts].filter((font) => font.status === 'loaded').map((font) => font.family.replace(/"/g, ''));
    });
    assert.ok(fonts.includes('Roboto'), `Roboto loaded (got ${fonts.join(', ')})`);
    assert.ok(fonts.includes('Material Icons'), `Material Icons loaded (got ${fonts.join(', ')})`);
    await screenshot(page, 'offline-shell-phone');
    assert.deepEqual(outsideRequests, []);
    await context.close();
  });

  it('serves index.html without a remote link and with a content security policy', async () => {
    const response = await fetch(server.url);
    const html = await response.text();
    assert.doesNotMatch(html, /https?:\/\//, 'index.html links no remote URL');
    assert.match(response.headers.get('content-security-policy') ?? '', /script-src 'self'/);
    assert.equal(response.headers.get('cache-control'), 'no-cache');
  });

  it('sends its hashed files compressed with long-lived caching', async () => {
    const html = await (await fetch(server.url)).text();
    const script = /src="(main-[A-Z0-9]+\.js)"/.exec(html)?.[1];
    assert.ok(script, 'index.html names a hashed main script');
    const response = await fetch(`${server.url}/${script}`, { headers: { 'accept-encoding': 'gzip' } });
    assert.equal(response.headers.get('content-encoding'), 'gzip');
    assert.match(response.headers.get('cache-control') ?? '', /immutable/);
  });
});
