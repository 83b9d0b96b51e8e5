// Shared pieces for the end-to-end tests: a real server on a free port with its own temporary
// data folder, and Debian's Chromium driven by playwright-core (no downloaded browser).
import { spawn } from 'node:child_process';
import { mkdirSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { chromium } from 'playwright-core';

export const ROOT = new URL('..', import.meta.url).pathname;
export const SCREENSHOT_DIR = join(ROOT, 'e2e/screenshots');
export const CHROMIUM_PATH = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';
/** A phone in portrait, as in the foundation issue. */
export const PHONE = { width: 390, height: 844 };
export const DEMO_PASSWORD = 'heapsight-demo';

/** Flags that keep Chromium from calling outside hosts, which this machine refuses. */
export const CHROMIUM_ARGS = [
  '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking',
  '--disable-component-update', '--disable-sync', '--disable-dev-shm-usage',
];

/**
 * Starts the built server (dist/node) on a free port with a fresh data folder and the demo
 * scenario. Resolves once it prints its URL.
 */
export async function startServer({ env = {}, dataDir } = {}) {
  const folder = dataDir ?? mkdtempSync(join(tmpdir(), 'heapsight-e2e-'));
  const child = spawn(process.execPath, [join(ROOT, 'dist/node/server/main.js')], {
    cwd: ROOT,
    env: {
      ...process.env, NODE_ENV: 'production', DEMO: '1', PORT: '0', HOST: '127.0.0.1', DATA_DIR: folder,
      LOG_LEVEL: 'warn', ...env,
    },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let output = '';
  const url = await new Promise((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error(`server did not start:\n${output}`)), 30_000);
    const onData = (chunk) => {
      output += chunk;
      const match = /running at (http:\/\/\S+)/.exec(output);
      if (match) {
        clearTimeout(timer);
        resolve(match[1]);
      }
    };
    child.stdout.on('data', onData);
    child.stderr.on('data', (chunk) => { output += chunk; });
    child.on('exit', (code) => { clearTimeout(timer); reject(new Error(`server exited ${code}:\n${output}`)); });
  });
  return {
    url,
    dataDir: folder,
    process: child,
    output: () => output,
    async stop({ keepData = false } = {}) {
      if (child.exitCode === null) {
        const exited = new Promise((resolve) => child.once('exit', resolve));
        child.kill('SIGTERM');
        await exited;
      }
      if (!keepData && !dataDir) rmSync(folder, { recursive: true, force: true });
    },
  };
}

/** Launches headless Debian Chromium. */
export function launchBrowser() {
  return chromium.launch({ executablePath: CHROMIUM_PATH, headless: true, args: CHROMIUM_ARGS });
}

/**
 * A browser context at phone size that records every request to a host other than this machine,
 * so a test can assert the app never reaches outside.
 */
export async function newContext(browser, { viewport = PHONE, ...options } = {}) {
  const context = await browser.newContext({ viewport, deviceScaleFactor: 1, hasTouch: true, ...options });
  const outsideRequests = [];
  context.on('request', (request) => {
    const { protocol, hostname } = new URL(request.url());
    const isLocal = hostname === '127.0.0.1' || hostname === 'localhost' || hostname === '[::1]';
    if ((protocol === 'http:' || protocol === 'https:' || protocol === 'ws:' || protocol === 'wss:') && !isLocal) {
      outsideRequests.push(request.url());
    }
  });
  return { context, outsideRequests };
}

/** Waits until the Angular service worker controls the page and has finished caching. */
export async function waitForServiceWorker(page) {
  await page.evaluate(async () => {
    const registration = await navigator.serviceWorker.ready;
    if (registration.active?.state !== 'activated') {
      await new Promise((resolve) => registration.active?.addEventListener('statechange', resolve));
    }
  });
  // The worker prefetches every asset group before it serves offline; its cache table lists them.
  await page.waitForFunction(async () => {
    const names = await caches.keys();
    return names.some((name) => name.includes(':assets:') || name.includes('ngsw'));
  });
}

/** Saves a screenshot into the git-ignored e2e/screenshots folder and returns its path. */
export async function screenshot(page, name) {
  mkdirSync(SCREENSHOT_DIR, { recursive: true });
  const path = join(SCREENSHOT_DIR, `${name}.png`);
  await page.screenshot({ path, fullPage: false });
  return path;
}

/**
 * Reloads a page while the context is offline. Chromium 150 serves the reload from the service worker
 * but leaves the new document's navigator.onLine at true; setting the emulation again after the
 * reload gives the page the state a phone with no signal has (`offline` event, onLine false).
 */
export async function reloadOffline(context, page) {
  await page.reload();
  await context.setOffline(false);
  await context.setOffline(true);
}

/** Signs in through the sign-in screen as a demo person and waits to leave it. */
export async function signIn(page, baseUrl, email) {
  await page.goto(`${baseUrl}/sign-in`);
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password', { exact: true }).fill(DEMO_PASSWORD);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL((url) => !url.pathname.startsWith('/sign-in'));
}

/**
 * Runs in the page (`page.evaluate(readDeviceRecords)`): the records waiting to sync and the outbox,
 * read from the app's IndexedDB with IndexedDB itself, not through the app's code.
 */
export function readDeviceRecords() {
  return new Promise((resolve, reject) => {
    const opening = indexedDB.open('heapsight');
    opening.onerror = () => reject(opening.error);
    opening.onsuccess = () => {
      const db = opening.result;
      const transaction = db.transaction(['samples', 'photos', 'outbox'], 'readonly');
      const all = (name) => new Promise((done) => { const request = transaction.objectStore(name).getAll(); request.onsuccess = () => done(request.result); });
      Promise.all([all('samples'), all('photos'), all('outbox')]).then(([samples, photos, outbox]) => {
        db.close();
        resolve({
          samples: samples.filter((row) => row.hasPendingChange).map((row) => ({ id: row.id, code: row.code, wetMassKg: row.wetMassKg, position: row.position })),
          photos: photos.filter((row) => row.hasPendingChange).map((row) => ({ id: row.id, ownerId: row.ownerId, bytes: row.blob?.size ?? 0 })),
          outbox: outbox.map((entry) => ({ entity: entry.entity, id: entry.id })),
        });
      }, reject);
    };
  });
}
