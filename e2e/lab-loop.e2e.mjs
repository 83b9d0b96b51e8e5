// The assay-lab loop end to end in Chromium: a geologist makes a batch with QA/QC inserted, sends
// it to the lab (the e-mail shows in Outbox), imports a results file after its dry-run report, and
// sees the assays on the samples and the batch's QA/QC verdict.
import assert from 'node:assert/strict';
import { after, before, describe, it } from 'node:test';
import { DEMO_PASSWORD, launchBrowser, newContext, screenshot, startServer } from './harness.mjs';

async function signIn(page, baseUrl, email) {
  await page.goto(`${baseUrl}/sign-in`);
  await page.getByRole('heading', { name: 'Sign in' }).waitFor();
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password', { exact: true }).fill(DEMO_PASSWORD);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL((url) => !url.pathname.startsWith('/sign-in'));
}

/** Makes a pile of six samples with pan tests through sync, as the geologist's tablet would. */
async function makeSamples(baseUrl, token) {
  const stamp = String(Date.now()).slice(-4);
  const pileId = crypto.randomUUID();
  const pileCode = `JR-88-P${stamp}`;
  const mutations = [{ mutationId: crypto.randomUUID(), entity: 'pile', id: pileId, op: 'upsert', baseRevision: null,
    data: { id: pileId, siteId: JR_SITE_ID, code: pileCode, material: 'sluice-tailings', footprint: null, heightM: 2, shapeModel: 'cone', angleOfReposeDeg: 35, bulkDensityTPerM3: null, moisturePct: 5, spotHeights: null, sackCount: null, sackMassKg: null, hazards: [], notes: 'e2e lab pile' } }];
  for (let index = 0; index < 6; index += 1) {
    const id = crypto.randomUUID();
    mutations.push({ mutationId: crypto.randomUUID(), entity: 'sample', id, op: 'upsert', baseRevision: null,
      data: { id, pileId, code: `JR-88-${stamp}${index}`, sampleType: 'routine', duplicateOfId: null, standardId: null, location: { type: 'Point', coordinates: [33.452 + index * 1e-5, -4.0512] },
        gpsAccuracyM: 4, wetMassKg: 2.5, moisturePct: null, increments: 8, position: 'toe', collectedAt: new Date().toISOString(), collectorId: GEOLOGIST_ID, deviceId: 'e2e-tablet' } });
    const panId = crypto.randomUUID();
    mutations.push({ mutationId: crypto.randomUUID(), entity: 'panTest', id: panId, op: 'upsert', baseRevision: null,
      data: { id: panId, sampleId: id, massPannedKg: 10, colours: [], goldMassMg: 5 + index, panEfficiency: 1, testedAt: new Date().toISOString() } });
  }
  const response = await fetch(`${baseUrl}/api/sync/push`, { method: 'POST', headers: { 'content-type': 'application/json', authorization: `Bearer ${token}` }, body: JSON.stringify({ deviceId: 'e2e-tablet', mutations }) });
  const { results } = await response.json();
  assert.deepEqual([...new Set(results.map((result) => result.status))], ['applied']);
  return pileCode;
}

/** Calls the API as a demo person, for what the test itself needs to know (the lab's side). */
async function api(baseUrl, email) {
  const login = await fetch(`${baseUrl}/api/auth/login`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email, password: DEMO_PASSWORD }) });
  const { accessToken } = await login.json();
  const call = async (path) => {
    const response = await fetch(`${baseUrl}${path}`, { headers: { authorization: `Bearer ${accessToken}` } });
    assert.equal(response.status, 200, `${path} answered ${response.status}`);
    return (response.headers.get('content-type') ?? '').includes('json') ? response.json() : response.text();
  };
  call.token = accessToken;
  return call;
}

// The demo's Jackal Ridge site and geologist (server/demo/demo-scenario.ts).
const JR_SITE_ID = '6f0e2a53-8c1d-4b7a-9a51-2d3c4e5f6b01';
const GEOLOGIST_ID = '6f0e2a53-8c1d-4b7a-9a51-2d3c4e5f6c02';

describe('lab loop', () => {
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

  it('makes a batch, sends it, sees it in Outbox, imports results and sees assays and verdicts', async () => {
    const { context } = await newContext(browser);
    const page = await context.newPage();

    // Make a batch of six samples made here, so the test does not lean on the demo's.
    const pileCode = await makeSamples(server.url, (await api(server.url, 'geologist@demo.heapsight.test')).token);
    await signIn(page, server.url, 'geologist@demo.heapsight.test');
    await page.goto(`${server.url}/lab-batches`);
    await page.getByRole('heading', { name: 'Lab batches' }).waitFor();
    await page.getByRole('link', { name: 'New batch' }).click();
    await page.getByRole('heading', { name: 'New lab batch' }).waitFor();
    await page.getByRole('combobox', { name: 'Site' }).click();
    await page.getByRole('option', { name: 'JR · Jackal Ridge camp' }).click();
    await page.getByLabel('Find sample or pile code').fill(pileCode);
    await page.getByRole('checkbox', { name: /^Select JR-88-/ }).first().waitFor();
    assert.equal(await page.getByRole('checkbox', { name: /^Select JR-/ }).count(), 6);
    const offered = 6;
    await page.getByRole('checkbox', { name: 'Select all shown samples' }).check();
    await page.getByText(`${offered} samples chosen`).waitFor();
    await page.getByLabel('A blank every … samples').fill('3');
    await page.getByLabel('A standard every … samples').fill('6');
    await page.getByLabel('A split duplicate every … samples').fill('6');
    await screenshot(page, 'lab-batch-new-phone');
    await page.getByRole('button', { name: 'Make the batch' }).click();
    await page.getByRole('heading', { name: /^Batch JR-LB\d{3}$/ }).waitFor();
    const code = (await page.getByRole('heading', { name: /^Batch / }).textContent()).replace(/.*Batch /, '').trim();
    const batchId = new URL(page.url()).pathname.split('/').pop();

    // Send it to the lab: the fake SMTP server takes it and the page says so.
    await page.getByRole('button', { name: /Send to assays@kestrel/ }).click();
    await page.getByRole('status').filter({ hasText: 'Sent to assays@kestrel.lab.test' }).waitFor();
    await page.getByTestId('batch-status').filter({ hasText: 'Dispatched' }).waitFor();

    // The admin sees the message, with its attachment, in Outbox.
    const adminContext = (await newContext(browser)).context;
    const adminPage = await adminContext.newPage();
    await signIn(adminPage, server.url, 'admin@demo.heapsight.test');
    await adminPage.goto(`${server.url}/outbox`);
    await adminPage.getByRole('button', { name: new RegExp(`Lab batch ${code}:`) }).click();
    await adminPage.getByText(new RegExp(`${code}-submission\\.csv \\(\\d+ bytes\\)`)).waitFor();
    await screenshot(adminPage, 'lab-batch-outbox-phone');
    await adminContext.close();

    // The lab's results file, written from the submission sheet: every value a plain number or a censored one.
    const asGeologist = await api(server.url, 'geologist@demo.heapsight.test');
    const batch = await asGeologist(`/api/lab-batches/${batchId}`);
    const standards = (await asGeologist('/api/reference-standards')).items;
    const gradeOf = (sampleId) => (0.1 + (parseInt(sampleId.slice(0, 6), 16) % 300) / 100).toFixed(3);
    const valueOf = (item) => item.itemType === 'blank' ? '<0.005'
      : item.itemType === 'standard' ? String(standards.find((standard) => standard.code === item.standardCode)?.expectedGpt ?? 1)
      : gradeOf(item.sampleId);
    const sheet = await (await api(server.url, 'lab@demo.heapsight.test'))(`/api/lab-batches/${batchId}/submission.csv`);
    const codes = sheet.trim().split('\r\n').slice(1).map((line) => line.split(',')[2]);
    assert.deepEqual(codes, batch.items.map((item) => item.labCode));
    const results = ['sample code,Au g/t', ...batch.items.map((item) => `${item.labCode},${valueOf(item)}`)].join('\r\n');

    // Upload: the dry-run report lists every row as matched, then the save.
    await page.getByTestId('results-file').setInputFiles({ name: `${code}-results.csv`, mimeType: 'text/csv', buffer: Buffer.from(results, 'utf8') });
    await page.getByTestId('import-report').getByText(`${batch.items.length} rows · 0 with problems`).waitFor();
    await screenshot(page, 'lab-batch-dry-run-phone');
    await page.getByRole('button', { name: `Save ${batch.items.length} results` }).click();
    await page.getByRole('status').filter({ hasText: 'Saved.' }).waitFor();

    // The assays are on the bags, and the QA/QC verdict is shown in words.
    await page.getByTestId('batch-status').filter({ hasText: 'Results in' }).waitFor();
    const first = batch.items.find((item) => item.itemType === 'routine');
    // The bag list (the rows with an assay cell), not the import report above it, which names the same bag.
    await page.getByRole('row').filter({ has: page.getByTestId('assay') })
      .filter({ hasText: new RegExp(`${first.labCode}.*${gradeOf(first.sampleId).replace('.', '\\.')}`) }).waitFor();
    await page.getByTestId('batch-verdict').filter({ hasText: /Batch verdict: (Pass|Fail|Warn)/ }).waitFor();
    const assays = await page.getByTestId('assay').allTextContents();
    assert.equal(assays.filter((text) => text.trim() === '—').length, 0, 'every bag has its assay');
    await screenshot(page, 'lab-batch-results-phone');

    // The QA/QC view lists the batch.
    await page.goto(`${server.url}/qaqc`);
    await page.getByRole('combobox', { name: 'Site' }).click();
    await page.getByRole('option', { name: 'JR · Jackal Ridge camp' }).click();
    await page.getByRole('listitem').filter({ hasText: code }).waitFor();
    await screenshot(page, 'qaqc-phone');
    await context.close();
  });
});
