/**
 * The Samples screen at scale (issue 9): in Chromium at phone size, a geologist opens the synthetic
 * site's samples (full: 20,000; paged from the server into a CDK virtual scroll) and flings the list
 * down screen by screen until a set number of rows has gone by. Reported: time from choosing the site
 * to its first rows shown, the longest main-thread long task during the scrolling, and the rows kept
 * in the DOM at the end (virtual scroll keeps that small however long the list). Baseline, same run,
 * same page: the demo site's few samples. Goal: no long task over 100 ms.
 */
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { SYNTHETIC_SITE, SYNTHETIC_SIZES, seedSyntheticDataDir } from '../scripts/make-synthetic-site';
import { BENCH_SIZE, reportFigure } from './report';
import { PHONE, launchChromium, readLongTasks, recordLongTasks, signIn } from './support/browser';
import { startHeapsight } from './support/servers';

const isFull = BENCH_SIZE === 'full';
const size = SYNTHETIC_SIZES[BENCH_SIZE];
/** Screens flung through; each fling waits for the rows of the new place to be drawn. */
const FLINGS = isFull ? 60 : 15;
const SCREENS_PER_FLING = 4;

interface Visit {
  readonly firstRowsMs: number;
  readonly longestTaskMs: number;
  readonly rowsPassed: number;
  readonly rowsInDom: number;
  readonly total: string;
}

/** Chooses the site in the page's own site picker and flings down the list. */
async function visit(page: Page, siteId: string, expectedTotal: number): Promise<Visit> {
  await page.goto('/samples');
  await page.getByRole('heading', { name: 'Samples' }).waitFor();
  // The picker's accessible name holds the chosen site too ("Site IF · …"), so find it by its label's first word.
  const picker = page.locator('label').filter({ hasText: /^\s*Site\b/ }).locator('select');
  await picker.waitFor();
  const started = Date.now();
  await picker.selectOption(siteId);
  // The count line names this site's total once its first page has come and been drawn.
  await page.getByTestId('sample-count').filter({ hasText: `of ${expectedTotal.toLocaleString('en')} samples` }).waitFor({ timeout: 30_000 });
  await page.locator('cdk-virtual-scroll-viewport [role="row"]').first().waitFor();
  const firstRowsMs = Date.now() - started;
  await recordLongTasks(page);
  const viewport = page.locator('cdk-virtual-scroll-viewport');
  // Rows fetched so far, from the count line ("1,200 of 20,000 samples").
  const loadedRows = () => page.getByTestId('sample-count').evaluate((element) => Number(((element.textContent ?? '').match(/[\d,]+/) ?? ['0'])[0].replace(/,/g, '')));
  for (let fling = 0; fling < FLINGS; fling += 1) {
    const [before, loaded] = [await viewport.evaluate((element) => element.scrollTop), await loadedRows()];
    const isAtEnd = await viewport.evaluate((element) => element.scrollTop + element.clientHeight >= element.scrollHeight - 1);
    // The whole list is here and in view to its end (a short list): nothing more to fling through.
    if (isAtEnd && loaded >= expectedTotal) break;
    await viewport.evaluate((element, screens) => element.scrollBy(0, element.clientHeight * screens), SCREENS_PER_FLING);
    // Either the list moved and rows are drawn where it now stands, or it stood at the end of the rows
    // fetched so far and the next page came (the next fling goes on from there).
    await page.waitForFunction(({ top, rows }) => {
      const element = document.querySelector('cdk-virtual-scroll-viewport');
      const count = document.querySelector('[data-testid="sample-count"]')?.textContent ?? '';
      if (!element) return false;
      if (Number((count.match(/[\d,]+/) ?? ['0'])[0].replace(/,/g, '')) > rows) return true;
      const box = element.getBoundingClientRect();
      const row = document.elementFromPoint(box.left + 20, box.top + box.height / 2);
      return element.scrollTop > top && row?.closest('[role="row"]') != null;
    }, { top: before, rows: loaded }, { timeout: 15_000 });
  }
  const rowsPassed = await page.locator('cdk-virtual-scroll-viewport [role="row"]').last().getAttribute('aria-rowindex');
  const rowsInDom = await page.locator('cdk-virtual-scroll-viewport [role="row"]').count();
  const total = (await page.getByTestId('sample-count').textContent())?.trim() ?? '';
  const tasks = await readLongTasks(page);
  return { firstRowsMs, longestTaskMs: Math.max(0, ...tasks), rowsPassed: Number(rowsPassed ?? 0) - 1, rowsInDom, total };
}

async function main(): Promise<void> {
  const dataDir = mkdtempSync(join(tmpdir(), 'heapsight-bench-scroll-'));
  const seeded = await seedSyntheticDataDir(dataDir, size);
  process.stdout.write(`synthetic site: ${size.samples} samples (${seeded.applied} records) in ${(seeded.ms / 1000).toFixed(1)} s\n`);
  const server = await startHeapsight({}, dataDir);
  const browser = await launchChromium();
  try {
    const context = await browser.newContext({ viewport: PHONE, baseURL: server.url, serviceWorkers: 'block' });
    const page = await context.newPage();
    await signIn(page, server.url, 'geologist@demo.heapsight.test');
    const token = await page.evaluate(() => (JSON.parse(localStorage.getItem('heapsight.tokens') ?? '{}') as { accessToken?: string }).accessToken ?? '');
    const totalOf = async (siteId: string) => {
      const response = await fetch(`${server.url}/api/samples?siteId=${siteId}&limit=1`, { headers: { authorization: `Bearer ${token}` } });
      if (!response.ok) throw new Error(`GET /api/samples of ${siteId}: ${response.status}`);
      return ((await response.json()) as { total: number }).total;
    };
    const sites = await page.evaluate(() => (JSON.parse(localStorage.getItem('heapsight.profile') ?? '{}') as { sites?: { id: string; code: string }[] }).sites ?? []);
    process.stdout.write(`   sites of the geologist: ${sites.map((site) => site.code).join(', ')}\n`);
    const demoSiteId = sites.find((site) => site.id !== SYNTHETIC_SITE.id)?.id ?? '';
    const demo = await visit(page, demoSiteId, await totalOf(demoSiteId));
    const large = await visit(page, SYNTHETIC_SITE.id, await totalOf(SYNTHETIC_SITE.id));
    process.stdout.write(`   demo site: ${JSON.stringify(demo)}\n   synthetic site: ${JSON.stringify(large)}\n`);
    reportFigure({
      group: 'samples screen', name: `site chosen to first rows shown, ${size.samples.toLocaleString('en')} samples on the server`, value: large.firstRowsMs, unit: 'ms',
      baselineName: `same, demo site (${demo.total})`, baselineValue: demo.firstRowsMs, higherIsBetter: false,
    });
    reportFigure({
      group: 'samples screen', name: `longest main-thread long task while flinging through ${large.rowsPassed.toLocaleString('en')} rows`, value: large.longestTaskMs, unit: 'ms',
      baselineName: 'same flings on the demo site', baselineValue: demo.longestTaskMs, higherIsBetter: false, goal: 'none over 100 ms',
    });
    reportFigure({
      group: 'samples screen', name: `rows in the DOM after ${large.rowsPassed.toLocaleString('en')} rows scrolled by`, value: large.rowsInDom, unit: 'rows',
      baselineName: 'rows scrolled by (what a plain table would hold)', baselineValue: large.rowsPassed, higherIsBetter: false,
    });
    await context.close();
  } finally {
    await browser.close();
    await server.stop();
  }
}

void main().catch((error: unknown) => {
  console.error(error);
  process.exit(1);
});
