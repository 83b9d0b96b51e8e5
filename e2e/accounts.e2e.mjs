// Accounts end to end: a crew member signs in once and keeps the app offline as themselves; an
// admin invites someone whose e-mail shows in Outbox, and the invited person follows the link,
// chooses a password and signs in. No page may break the content security policy.
import assert from 'node:assert/strict';
import { after, before, describe, it } from 'node:test';
import { DEMO_PASSWORD, launchBrowser, newContext, reloadOffline, screenshot, startServer, waitForServiceWorker } from './harness.mjs';

/** Collects what the browser reports as content-security-policy violations on the page. */
function watchCsp(page) {
  const violations = [];
  page.on('console', (message) => {
    if (/Content Security Policy/i.test(message.text())) violations.push(message.text());
  });
  return violations;
}

async function signIn(page, baseUrl, email, { deviceName } = {}) {
  await page.goto(`${baseUrl}/sign-in`);
  await page.getByRole('heading', { name: 'Sign in' }).waitFor();
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password', { exact: true }).fill(DEMO_PASSWORD);
  if (deviceName) await page.getByLabel('Name of this device (optional)').fill(deviceName);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL((url) => !url.pathname.startsWith('/sign-in'));
}

describe('accounts', () => {
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

  it('signs in as the demo sampler, reloads offline and is still that sampler', async () => {
    const { context, outsideRequests } = await newContext(browser);
    const page = await context.newPage();
    const violations = watchCsp(page);

    await signIn(page, server.url, 'sampler@demo.heapsight.test', { deviceName: 'Crew phone 7' });
    await waitForServiceWorker(page);
    await page.goto(`${server.url}/profile`);
    await page.getByRole('heading', { name: 'Neema Field' }).waitFor();
    await page.getByText('JR · Jackal Ridge camp').waitFor();
    assert.equal(await page.getByLabel('Device name').inputValue(), 'Crew phone 7');

    await context.setOffline(true);
    await reloadOffline(context, page);
    await page.getByRole('heading', { name: 'Neema Field' }).waitFor();
    await page.getByRole('status').filter({ hasText: 'Offline' }).waitFor();
    assert.equal(await page.getByRole('link', { name: 'People & sites' }).count(), 0, 'a sampler has no admin screens');
    // An admin-only address sends the sampler home rather than opening it.
    await page.goto(`${server.url}/people`).catch(() => undefined);
    await page.waitForURL((url) => !url.pathname.startsWith('/people'));
    await screenshot(page, 'accounts-offline-profile-phone');

    assert.deepEqual(violations, []);
    assert.deepEqual(outsideRequests, []);
    await context.close();
  });

  it('signs in as admin, invites a person whose e-mail appears in Outbox, and the person signs in through the link', async () => {
    const { context } = await newContext(browser);
    const page = await context.newPage();
    const violations = watchCsp(page);
    const email = `new-sampler-${Date.now()}@crew.test`;

    // The admin invites a sampler for Jackal Ridge.
    await signIn(page, server.url, 'admin@demo.heapsight.test');
    await page.goto(`${server.url}/people`);
    await page.getByRole('heading', { name: 'People & sites' }).waitFor();
    await page.getByRole('cell', { name: /^Neema Field sampler@/ }).waitFor();
    await page.getByRole('button', { name: 'Invite someone' }).click();
    const dialog = page.getByRole('dialog');
    await dialog.getByLabel('E-mail').fill(email);
    await dialog.getByLabel('Name').fill('Zawadi Riffle');
    await dialog.getByText('JR · Jackal Ridge camp').click();
    await dialog.getByRole('button', { name: 'Send invitation' }).click();
    await page.getByText('Invitation sent; it is listed in Outbox').waitFor();
    await page.getByRole('cell', { name: /^Zawadi Riffle / }).waitFor();
    await screenshot(page, 'accounts-people-phone');

    // Outbox lists the message; opening it shows the link.
    await page.goto(`${server.url}/outbox`);
    await page.getByRole('heading', { name: 'Outbox' }).waitFor();
    const message = page.getByRole('button', { name: new RegExp(`You are invited to Heapsight.*${email.replace(/[.]/g, '\\.')}`) });
    await message.click();
    const link = page.getByRole('link', { name: /\/set-password\?token=/ });
    const href = await link.getAttribute('href');
    assert.ok(href?.startsWith(server.url), `the link points at this server (${href})`);
    await screenshot(page, 'accounts-outbox-phone');

    // The invited person, on their own device, follows the link and signs in.
    const { context: theirs } = await newContext(browser);
    const invited = await theirs.newPage();
    const theirViolations = watchCsp(invited);
    await invited.goto(href);
    await invited.getByText(`Welcome, Zawadi Riffle`).waitFor();
    await invited.getByLabel('New password').fill('a-pile-worth-hauling');
    await invited.getByLabel('The same password again').fill('a-pile-worth-hauling');
    await invited.getByRole('button', { name: 'Save password' }).click();
    await invited.waitForURL((url) => url.pathname === '/sign-in');
    assert.equal(await invited.getByLabel('E-mail').inputValue(), email);
    await invited.getByLabel('Password', { exact: true }).fill('a-pile-worth-hauling');
    await invited.getByRole('button', { name: 'Sign in' }).click();
    await invited.waitForURL((url) => !url.pathname.startsWith('/sign-in'));
    await invited.goto(`${server.url}/profile`);
    await invited.getByRole('heading', { name: 'Zawadi Riffle' }).waitFor();

    assert.deepEqual([...violations, ...theirViolations], []);
    await theirs.close();
    await context.close();
  });
});
