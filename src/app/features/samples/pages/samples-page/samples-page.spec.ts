import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting, type TestRequest } from '@angular/common/http/testing';
import { signal } from '@angular/core';
import { TestBed, type ComponentFixture } from '@angular/core/testing';
import { By } from '@angular/platform-browser';
import { AuthSession } from '../../../../core/auth/auth-session';
import { AppLanguage } from '../../../../i18n/app-language';
import { SAMPLE_PAGE_SIZE, codePrefixOf, type SampleRow } from '../../samples.store';
import SamplesPage from './samples-page';

const SITES = [{ id: 'site-jr', code: 'JR', name: 'Jackal Ridge camp' }, { id: 'site-if', code: 'IF', name: 'Ironwood Flats' }];

/** A listed sample as the server answers it; the n-th of a page. */
function row(index: number, overrides: Partial<SampleRow> = {}): SampleRow {
  return {
    id: `sample-${index}`, pileId: 'pile-1', pileCode: 'JR-07-P0001', code: `JR-07-${String(index).padStart(4, '0')}`, sampleType: 'routine',
    duplicateOfId: null, standardId: null, location: null, gpsAccuracyM: 3.5, wetMassKg: 12.25, moisturePct: 8, increments: 10, position: 'toe',
    collectedAt: '2026-03-01T08:00:00.000Z', collectorId: 'user-1', deviceId: 'device-a', revision: 1,
    gradeGpt: 1.25, gradeSource: 'pan', ...overrides,
  } as SampleRow;
}

function page(offset: number, count: number, total: number, overrides: (index: number) => Partial<SampleRow> = () => ({})) {
  return { items: Array.from({ length: count }, (_, index) => row(offset + index + 1, overrides(offset + index))), total, limit: SAMPLE_PAGE_SIZE, offset };
}

async function render() {
  TestBed.configureTestingModule({
    providers: [provideHttpClient(), provideHttpClientTesting(), { provide: AuthSession, useValue: { user: signal({ sites: SITES }) } }],
  });
  const fixture = TestBed.createComponent(SamplesPage);
  fixture.autoDetectChanges();
  await fixture.whenStable();
  return { fixture, element: fixture.nativeElement as HTMLElement, http: TestBed.inject(HttpTestingController) };
}

/** The one request for a page of samples now open, with its query. */
function expectPage(http: HttpTestingController): { request: TestRequest; query: Record<string, string> } {
  const request = http.expectOne((candidate) => candidate.url === '/api/samples');
  const params = request.request.params;
  return { request, query: Object.fromEntries(params.keys().map((key) => [key, params.get(key) as string])) };
}

async function settle(fixture: ComponentFixture<SamplesPage>) {
  fixture.detectChanges();
  await fixture.whenStable();
}

const text = (element: HTMLElement, selector: string) => element.querySelector(selector)?.textContent?.replace(/[ \n\t]+/g, ' ').trim();
const cells = (element: HTMLElement) => [...element.querySelectorAll('[role="cell"]')].map((cell) => cell.textContent?.replace(/[ \n\t]+/g, ' ').trim());

async function typeInto(fixture: ComponentFixture<SamplesPage>, selector: string, value: string, event: 'input' | 'change') {
  const field = fixture.nativeElement.querySelector(selector) as HTMLInputElement | HTMLSelectElement;
  field.value = value;
  field.dispatchEvent(new Event(event));
  await settle(fixture);
}

describe('SamplesPage', () => {
  afterEach(() => TestBed.inject(HttpTestingController).verify());

  it('asks the server for the first page of the first site and says how many of how many are here', async () => {
    const { fixture, element, http } = await render();
    const { request, query } = expectPage(http);
    expect(query).toEqual({ siteId: 'site-jr', limit: String(SAMPLE_PAGE_SIZE), offset: '0' });

    request.flush(page(0, SAMPLE_PAGE_SIZE, 450));
    await settle(fixture);

    expect(text(element, '[data-testid="sample-count"]')).toBe('200 of 450 samples');
    expect(cells(element)).toContain('JR-07-0001');
    expect(element.querySelector('[role="table"]')?.getAttribute('aria-rowcount')).toBe('451');
    expect(text(element, '[role="columnheader"]')).toBe('Sample');
  });

  it('fetches the next page when the rows in view come near the end, and only once while it is on its way', async () => {
    const { fixture, element, http } = await render();
    expectPage(http).request.flush(page(0, SAMPLE_PAGE_SIZE, 450));
    await settle(fixture);
    const viewport = fixture.debugElement.query(By.css('cdk-virtual-scroll-viewport'));

    // Far from the end: nothing asked.
    viewport.triggerEventHandler('scrolledIndexChange', 20);
    http.expectNone('/api/samples');

    viewport.triggerEventHandler('scrolledIndexChange', 150);
    viewport.triggerEventHandler('scrolledIndexChange', 151);
    const next = expectPage(http);
    expect(next.query).toMatchObject({ siteId: 'site-jr', offset: '200', limit: '200' });
    next.request.flush(page(200, SAMPLE_PAGE_SIZE, 450));
    await settle(fixture);
    expect(text(element, '[data-testid="sample-count"]')).toBe('400 of 450 samples');

    // The button asks for the rest; once everything is here it is gone and nothing more is asked.
    (element.querySelector('button.more') as HTMLButtonElement).click();
    const last = expectPage(http);
    expect(last.query['offset']).toBe('400');
    last.request.flush(page(400, 50, 450));
    await settle(fixture);
    expect(text(element, '[data-testid="sample-count"]')).toBe('450 of 450 samples');
    expect(element.querySelector('button.more')).toBeNull();
    viewport.triggerEventHandler('scrolledIndexChange', 440);
    http.expectNone('/api/samples');
  });

  it('sends the site, the type and the typed start of a code to the server, starting again from the first page', async () => {
    const { fixture, element, http } = await render();
    expectPage(http).request.flush(page(0, SAMPLE_PAGE_SIZE, 450));
    await settle(fixture);

    await typeInto(fixture, 'label:nth-of-type(1) select', 'site-if', 'change');
    const bySite = expectPage(http);
    expect(bySite.query).toEqual({ siteId: 'site-if', limit: '200', offset: '0' });
    bySite.request.flush(page(0, 3, 3));
    await settle(fixture);

    await typeInto(fixture, 'label:nth-of-type(2) select', 'blank', 'change');
    const byType = expectPage(http);
    expect(byType.query).toEqual({ siteId: 'site-if', sampleType: 'blank', limit: '200', offset: '0' });

    // Typed in small letters: sent as the code is written. The page still on its way is dropped.
    await typeInto(fixture, 'input[matInput]', ' jr-07-00 ', 'input');
    expect(byType.request.cancelled).toBe(true);
    const byPrefix = expectPage(http);
    expect(byPrefix.query).toEqual({ siteId: 'site-if', sampleType: 'blank', codePrefix: 'JR-07-00', limit: '200', offset: '0' });
    byPrefix.request.flush(page(0, 2, 2, () => ({ sampleType: 'blank' })));
    await settle(fixture);
    expect(text(element, '[data-testid="sample-count"]')).toBe('2 of 2 samples');

    // Text that cannot start a code: said so, nothing sent, the list stays.
    await typeInto(fixture, 'input[matInput]', 'toe of pile', 'input');
    http.expectNone('/api/samples');
    expect(element.textContent).toContain('A sample code holds only letters, digits and dashes (up to 24).');
    expect(cells(element)).toContain('JR-07-0001');
  });

  it('sorts on the server when a column header is chosen, ascending then descending', async () => {
    const { fixture, http } = await render();
    expectPage(http).request.flush(page(0, 5, 5));
    await settle(fixture);
    const header = () => fixture.nativeElement.querySelector('[role="columnheader"] .mat-sort-header-container') as HTMLElement;

    header().click();
    await settle(fixture);
    const ascending = expectPage(http);
    expect(ascending.query).toMatchObject({ sort: 'code', direction: 'asc', offset: '0' });
    ascending.request.flush(page(0, 5, 5));
    await settle(fixture);

    header().click();
    await settle(fixture);
    expect(expectPage(http).query).toMatchObject({ sort: 'code', direction: 'desc', offset: '0' });
  });

  it('shows a refusal with a retry that asks for the same page again', async () => {
    const { fixture, element, http } = await render();
    expectPage(http).request.flush({ error: { code: 'internal', message: 'boom' } }, { status: 500, statusText: 'Server Error' });
    await settle(fixture);
    expect(text(element, '[role="alert"]')).toContain('The samples could not be loaded.');

    (element.querySelector('[role="alert"] button') as HTMLButtonElement).click();
    const again = expectPage(http);
    expect(again.query).toEqual({ siteId: 'site-jr', limit: '200', offset: '0' });
    again.request.flush(page(0, 1, 1));
  });

  it('speaks French, with decimal commas, grouped thousands and the types and sources in words', async () => {
    const { fixture, element, http } = await render();
    expectPage(http).request.flush(page(0, SAMPLE_PAGE_SIZE, 1250, (index) => (index === 0 ? { sampleType: 'blank', gradeSource: 'calibrated-pan' } : {})));
    await settle(fixture);

    await TestBed.inject(AppLanguage).use('fr');
    await settle(fixture);

    expect(text(element, 'h1')).toBe('Échantillons');
    expect(text(element, '[data-testid="sample-count"]')).toBe('200 sur 1\u202f250 échantillons');
    const firstRow = [...element.querySelectorAll('[role="row"]')][1];
    const shown = [...firstRow.querySelectorAll('[role="cell"]')].map((cell) => cell.textContent?.replace(/[ \n\t]+/g, ' ').trim());
    // The type's letter (hidden from screen readers) sits right before its word.
    expect(shown.slice(0, 6)).toEqual(['JR-07-0001', 'JR-07-P0001', 'BBlanc', '12,25', '1,25', 'Test à la batée, calibré']);
    expect(shown[6]).toMatch(/^2026-0[23]-\d\d \d\d:\d\d$/);
    expect([...element.querySelectorAll('[role="columnheader"]')].map((header) => header.textContent?.trim())).toContain('Teneur g/t');
    expect(element.textContent).toContain('Filtrer les échantillons');
  });
});

describe('codePrefixOf', () => {
  it('gives the start of a code in capitals, null for nothing typed, undefined for text no code starts with', () => {
    expect(codePrefixOf('  jr-07- ')).toBe('JR-07-');
    expect(codePrefixOf('')).toBeNull();
    expect(codePrefixOf('JR 07')).toBeUndefined();
    expect(codePrefixOf('é')).toBeUndefined();
    expect(codePrefixOf('A'.repeat(25))).toBeUndefined();
  });
});
