/**
 * Offline start (issue 9): time from navigation to the `Capture` screen showing its device list
 * (heading "Samples (N)" with every local sample counted, "New pile" ready) with the network off,
 * served by the service worker, with 20,000 samples in IndexedDB (full size), beside the same
 * offline start holding only the demo's few pulled samples, in the same run. The samples are
 * written into the app's own Dexie database in the page (its `samples` store), shaped as a pull
 * leaves them. Long tasks are observed from the first script of each navigation.
 * Goal: under 1.5 s here.
 */
import type { Page } from 'playwright-core';
import { BENCH_SIZE, reportFigure } from './report';
import { launchChromium, median, PHONE, readLongTasks, signIn } from './support/browser';
import { startHeapsight } from './support/servers';

const isFull = BENCH_SIZE === 'full';
const LOCAL_SAMPLES = isFull ? 20_000 : 2_000;
const RUNS = isFull ? 3 : 1;

/** Observes long tasks from the very start of every document of the context. */
const OBSERVE_FROM_START = `
  window.__longTasks = [];
  new PerformanceObserver((list) => { for (const entry of list.getEntries()) window.__longTasks.push(entry.duration); }).observe({ type: 'longtask', buffered: true });
`;

/** Writes `count` samples into the app's IndexedDB (Dexie database "heapsight", store "samples"). */
const FILL_SAMPLES = `async (count) => {
  const database = await new Promise((resolve, reject) => { const request = indexedDB.open('heapsight'); request.onsuccess = () => resolve(request.result); request.onerror = () => reject(request.error); });
  const pileId = await new Promise((resolve) => { const request = database.transaction('piles').objectStore('piles').openCursor(); request.onsuccess = () => resolve(request.result ? request.result.value.id : '00000000-0000-4000-8000-000000000000'); });
  await new Promise((resolve, reject) => {
    const transaction = database.transaction('samples', 'readwrite');
    const store = transaction.objectStore('samples');
    for (let index = 0; index < count; index += 1) {
      const hex = index.toString(16).padStart(12, '0');
      store.put({ id: '5b000000-0000-4000-8000-' + hex, pileId, code: 'JR-90-' + String(index + 1).padStart(6, '0'), sampleType: 'routine', duplicateOfId: null, standardId: null,
        location: { type: 'Point', coordinates: [33.45 + index * 1e-7, -4.05] }, gpsAccuracyM: 4, wetMassKg: 10, moisturePct: 8, increments: 10, position: 'toe, 0.3 m',
        collectedAt: new Date(Date.UTC(2025, 0, 1) + index * 60000).toISOString(), collectorId: '6f0e2a53-8c1d-4b7a-9a51-2d3c4e5f6c01', deviceId: 'bench-device',
        revision: 1000 + index, deletedAt: null, hasPendingChange: false });
    }
    transaction.oncomplete = resolve;
    transaction.onerror = () => reject(transaction.error);
  });
  database.close();
}`;

async function waitForServiceWorker(page: Page): Promise<void> {
  await page.evaluate(`(async () => {
    const registration = await navigator.serviceWorker.ready;
    if (registration.active && registration.active.state !== 'activated') {
      await new Promise((resolve) => registration.active.addEventListener('statechange', resolve));
    }
  })()`);
  await page.waitForFunction(`caches.keys().then((names) => names.some((name) => name.includes(':assets:') || name.includes('ngsw')))`);
  // The worker caches the app group on install; give its prefetch time to finish.
  await page.waitForTimeout(1500);
}

async function offlineStart(page: Page, url: string): Promise<{ ms: number; longestTaskMs: number; count: number }> {
  await page.goto(`${url}/capture`);
  const heading = page.locator('h2', { hasText: /^Samples \(\d+\)/ });
  await page.getByRole('link', { name: /New pile/ }).waitFor({ timeout: 60_000 });
  // The count settles once the store's first read of the device database has arrived.
  await page.waitForFunction(`(() => { const h = [...document.querySelectorAll('h2')].find((e) => /^Samples \\((\\d+)\\)/.test(e.textContent.trim())); return h && Number(/\\((\\d+)\\)/.exec(h.textContent)[1]) > 0; })()`, undefined, { timeout: 60_000 });
  const ms = Number(await page.evaluate('performance.now()'));
  const count = Number(/\((\d+)\)/.exec((await heading.textContent()) ?? '')?.[1]);
  const tasks = await readLongTasks(page);
  return { ms, longestTaskMs: Math.max(0, ...tasks), count };
}

async function main(): Promise<void> {
  const server = await startHeapsight();
  const browser = await launchChromium();
  try {
    // The app's CSP forbids eval, which playwright's polling of a string predicate needs.
    const context = await browser.newContext({ viewport: PHONE, deviceScaleFactor: 1, hasTouch: true, bypassCSP: true });
    await context.addInitScript(OBSERVE_FROM_START);
    const page = await context.newPage();
    await signIn(page, server.url, 'sampler@demo.heapsight.test');
    await page.goto(`${server.url}/capture`);
    await waitForServiceWorker(page);
    // The first visit pulls the demo's samples of the sampler's site into the device database.
    await page.waitForFunction(`(() => { const h = [...document.querySelectorAll('h2')].find((e) => /^Samples \\((\\d+)\\)/.test(e.textContent.trim())); return h && Number(/\\((\\d+)\\)/.exec(h.textContent)[1]) > 0; })()`, undefined, { timeout: 60_000 });
    await context.setOffline(true);
    const few: Awaited<ReturnType<typeof offlineStart>>[] = [];
    for (let run = 0; run < RUNS; run += 1) few.push(await offlineStart(page, server.url));
    await page.evaluate(`(${FILL_SAMPLES})(${LOCAL_SAMPLES})`);
    const many: Awaited<ReturnType<typeof offlineStart>>[] = [];
    for (let run = 0; run < RUNS; run += 1) many.push(await offlineStart(page, server.url));
    process.stdout.write(`offline start, demo samples: ${JSON.stringify(few)}\noffline start, +${LOCAL_SAMPLES}: ${JSON.stringify(many)}\n`);
    const common = { group: 'offline start', baselineName: `same, demo only (${few[0].count} samples on the device)`, note: `network off, service worker, Chromium headless, phone viewport, median of ${RUNS}` };
    reportFigure({ ...common, name: `navigation to Capture list shown, ${many[0].count.toLocaleString('en')} samples in IndexedDB`, value: median(many.map((run) => run.ms)), unit: 'ms', baselineValue: median(few.map((run) => run.ms)), higherIsBetter: false, goal: '< 1500 ms (full size)' });
    reportFigure({ ...common, name: 'longest main-thread long task during that start', value: Math.max(1, median(many.map((run) => run.longestTaskMs))), unit: 'ms', baselineValue: Math.max(1, median(few.map((run) => run.longestTaskMs))), higherIsBetter: false, goal: 'none over 100 ms' });
  } finally {
    await browser.close();
    await server.stop();
  }
}

main().catch((error: unknown) => {
  process.stderr.write(`${error instanceof Error ? error.stack : String(error)}\n`);
  process.exit(1);
});
