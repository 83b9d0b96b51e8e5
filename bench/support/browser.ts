import { chromium, type Browser, type Page } from 'playwright-core';

/** Debian's Chromium, as the e2e tests use it (no downloaded browser). */
export const CHROMIUM_PATH = process.env['CHROMIUM_PATH'] ?? process.env['CHROME_PATH'] ?? '/usr/bin/chromium';

/** The flags of e2e/harness.mjs: keep Chromium from calling outside hosts, which this machine refuses. */
export const CHROMIUM_ARGS = [
  '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking',
  '--disable-component-update', '--disable-sync', '--disable-dev-shm-usage',
];

/** A phone in portrait, as the e2e tests use. */
export const PHONE = { width: 390, height: 844 };

/** Launches headless Debian Chromium. */
export function launchChromium(): Promise<Browser> {
  return chromium.launch({ executablePath: CHROMIUM_PATH, headless: true, args: CHROMIUM_ARGS });
}

/** Signs in through the app's own form, as a person would. */
export async function signIn(page: Page, url: string, email: string): Promise<void> {
  await page.goto(`${url}/sign-in`);
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password', { exact: true }).fill('heapsight-demo');
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL((address) => !address.pathname.startsWith('/sign-in'));
}

/**
 * Starts recording main-thread long tasks (over 50 ms, the browser's own definition) in the page;
 * `readLongTasks` returns their durations in ms. Injected before the action being measured.
 */
export async function recordLongTasks(page: Page): Promise<void> {
  await page.evaluate(() => {
    const durations: number[] = [];
    (window as unknown as { __longTasks: number[] }).__longTasks = durations;
    new PerformanceObserver((list) => {
      for (const entry of list.getEntries()) durations.push(entry.duration);
    }).observe({ type: 'longtask', buffered: false });
  });
}

/** The long tasks recorded since `recordLongTasks`. */
export function readLongTasks(page: Page): Promise<number[]> {
  return page.evaluate(() => [...(window as unknown as { __longTasks: number[] }).__longTasks]);
}

/** The median of some numbers. */
export function median(values: readonly number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.floor(sorted.length / 2)];
}
