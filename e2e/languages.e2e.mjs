// Languages on the capture flow: a sampler switches the app to Kiswahili, then French, at a 360×640
// phone; every capture screen then shows no English string its translation files replace, numbers
// follow the locale (a decimal comma in French), the choice survives a reload, and a pan test saved
// in French lands in the queue. Screenshots of each screen in each language go to e2e/screenshots.
import assert from 'node:assert/strict';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { after, before, describe, it } from 'node:test';
import { ROOT, launchBrowser, newContext, screenshot, signIn, startServer } from './harness.mjs';

const SMALL_PHONE = { width: 360, height: 640 };
/** The namespaces the capture flow draws its words from. */
const CAPTURE_NAMESPACES = {
  common: 'src/app/i18n/common', capture: 'src/app/features/capture/i18n', ui: 'src/app/shared/ui/i18n',
  spotHeights: 'src/app/features/capture/components/spot-heights-editor/i18n',
};
const SCREENS = [
  { name: 'home', path: '/capture' },
  { name: 'pile', path: '/capture/pile/new' },
  { name: 'sample', path: '/capture/sample/new' },
  { name: 'pan-test', path: '/capture/pan-test/new' },
];

function strings(code) {
  const flatten = (tree, prefix = '') => Object.entries(tree).flatMap(([key, value]) =>
    typeof value === 'string' ? [[prefix + key, value]] : flatten(value, `${prefix}${key}.`));
  return new Map(Object.entries(CAPTURE_NAMESPACES).flatMap(([namespace, folder]) =>
    flatten(JSON.parse(readFileSync(join(ROOT, folder, `${code}.json`), 'utf8')), `${namespace}.`)));
}

/** English strings that the given language says differently (so seeing them means a gap). */
function englishReplacedBy(code) {
  const english = strings('en');
  const other = strings(code);
  return new Set([...english].filter(([key, text]) => /\p{L}{3}/u.test(text) && !text.includes('{{') && other.get(key) !== text)
    .map(([, text]) => text.trim()));
}

/** Visible text nodes and accessible names on the page. */
function textsOnPage(page) {
  return page.evaluate(() => {
    const texts = [];
    const walker = document.createTreeWalker(document.body, NodeFilter.SHOW_TEXT);
    for (let node = walker.nextNode(); node; node = walker.nextNode()) {
      const parent = node.parentElement;
      if (!parent || parent.closest('mat-icon, script, style, [hidden]') || parent.offsetParent === null) continue;
      const text = node.textContent.trim();
      if (text) texts.push(text);
    }
    for (const element of document.querySelectorAll('[aria-label], [placeholder], [title]')) {
      for (const name of ['aria-label', 'placeholder', 'title']) if (element.getAttribute(name)) texts.push(element.getAttribute(name).trim());
    }
    return texts;
  });
}

async function switchLanguage(page, name) {
  await page.locator('hs-language-picker button.toggle').click();
  await page.getByRole('button', { name, exact: true }).click();
  await page.locator('hs-language-picker .choices').waitFor({ state: 'detached' });
}

describe('languages on the capture flow', () => {
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

  it('switches at run time to Kiswahili and French with every capture screen translated, remembered over a reload', async () => {
    const { context, outsideRequests } = await newContext(browser, { viewport: SMALL_PHONE });
    const page = await context.newPage();
    await signIn(page, server.url, 'sampler@demo.heapsight.test');
    await page.goto(`${server.url}/capture`);
    await page.getByRole('link', { name: 'New pile' }).first().waitFor();

    for (const [code, name, captureWord] of [['sw', 'Kiswahili', 'Kusanya'], ['fr', 'Français', 'Saisie']]) {
      await page.goto(`${server.url}/capture`);
      await switchLanguage(page, name);
      await page.locator('nav').getByText(captureWord, { exact: true }).first().waitFor();
      assert.equal(await page.evaluate(() => document.documentElement.lang), code);

      const english = englishReplacedBy(code);
      for (const screen of SCREENS) {
        await page.goto(`${server.url}${screen.path}`);
        await page.locator('main h1').first().waitFor();
        await page.waitForLoadState('networkidle');
        const leftInEnglish = (await textsOnPage(page)).filter((text) => english.has(text));
        assert.deepEqual(leftInEnglish, [], `${screen.name} in ${name} still shows English`);
        await screenshot(page, `language-${code}-capture-${screen.name}-360`);
      }
    }

    // Still French after a reload: the choice is remembered on the device.
    await page.reload();
    await page.locator('main h1').first().waitFor();
    assert.equal(await page.evaluate(() => document.documentElement.lang), 'fr');
    assert.equal(await page.locator('hs-language-picker .code').textContent(), 'fr');

    // A pan test in French: the estimate is written with a decimal comma, and it saves.
    const french = strings('fr');
    await page.locator('mat-select[formcontrolname="sampleId"]').click();
    await page.getByRole('option').first().click();
    await page.locator('input[formcontrolname="massPannedKg"]').fill('5');
    const addFine = page.locator('button[aria-label]').filter({ has: page.locator('mat-icon', { hasText: /^add$/ }) }).nth(3);
    for (let colour = 0; colour < 6; colour += 1) await addFine.click();
    await page.getByText(/\d+,\d\d g\/t/).first().waitFor();
    await page.locator('button[type="submit"]').click();
    await page.waitForURL((url) => url.pathname === '/capture');
    assert.ok([...french.values()].length > 50, 'French strings loaded for the capture flow');
    assert.deepEqual(outsideRequests, []);
    await context.close();
  });
});
