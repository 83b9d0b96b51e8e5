import 'fake-indexeddb/auto';
import { provideHttpClient } from '@angular/common/http';
import { provideHttpClientTesting } from '@angular/common/http/testing';
import { signal } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';
import { deserialize, serialize } from 'node:v8';
import { heapsightDb, type LocalPanTest, type LocalPile, type LocalSample } from '../../../../core/db/heapsight-db';
import { SyncService } from '../../../../core/sync/sync.service';
import { AppLanguage } from '../../../../i18n/app-language';
import CaptureHome, { SAMPLES_PAGE } from './capture-home';

// jsdom has no structuredClone, which fake-indexeddb uses to store values; Node's serializer is the same algorithm.
globalThis.structuredClone ??= <T>(value: T): T => deserialize(serialize(value)) as T;

const PILE_ID = '6f0e2a53-8c1d-4b7a-9a51-2d3c4e5f6b02';

function sample(index: number, overrides: Partial<LocalSample> = {}): LocalSample {
  return {
    id: `5b000000-0000-4000-8000-${index.toString(16).padStart(12, '0')}`, pileId: PILE_ID, code: `JR-90-${String(index).padStart(6, '0')}`,
    sampleType: 'routine', duplicateOfId: null, standardId: null, location: null, gpsAccuracyM: null, wetMassKg: 10.25, moisturePct: null,
    increments: 10, position: '', collectedAt: new Date(Date.UTC(2025, 0, 1) + index * 60_000).toISOString(),
    collectorId: '6f0e2a53-8c1d-4b7a-9a51-2d3c4e5f6c01', deviceId: 'spec', revision: 1, deletedAt: null, hasPendingChange: false,
    ...overrides,
  } as LocalSample;
}

function pile(code: string, overrides: Partial<LocalPile> = {}): LocalPile {
  return { id: crypto.randomUUID(), siteId: 'site', code, material: 'mill-discharge', deletedAt: null, revision: 1, hasPendingChange: false, ...overrides } as LocalPile;
}

/** Lets Dexie's live queries answer (they run in later tasks), then draws. */
async function settle(fixture: { detectChanges(): void; whenStable(): Promise<unknown> }): Promise<void> {
  for (let turn = 0; turn < 3; turn += 1) {
    await new Promise((resolve) => setTimeout(resolve, 30));
    fixture.detectChanges();
    await fixture.whenStable();
  }
}

async function render() {
  TestBed.configureTestingModule({
    imports: [CaptureHome],
    providers: [provideRouter([]), provideHttpClient(), provideHttpClientTesting(), { provide: SyncService, useValue: { queueSize: signal(3) } }],
  });
  const fixture = TestBed.createComponent(CaptureHome);
  await settle(fixture);
  return { fixture, element: fixture.nativeElement as HTMLElement };
}

describe('the Capture home', () => {
  const db = heapsightDb();

  beforeEach(async () => {
    await db.open();
    await Promise.all([db.piles.clear(), db.samples.clear(), db.panTests.clear(), db.photos.clear()]);
  });

  it('counts every live record but lists only the latest samples, newest first, with a way to show more', async () => {
    const many = Array.from({ length: 45 }, (_, index) => sample(index + 1));
    await db.samples.bulkPut([...many, sample(46, { deletedAt: '2025-03-01T00:00:00.000Z' })]);
    await db.piles.bulkPut([pile('JR-1-P0002'), pile('JR-1-P0001', { hasPendingChange: true }), pile('JR-1-P0003', { deletedAt: '2025-03-01T00:00:00.000Z' })]);
    await db.panTests.bulkPut([{ id: 'pt1', sampleId: many[0].id, deletedAt: null } as unknown as LocalPanTest]);

    const { fixture, element } = await render();
    const headings = [...element.querySelectorAll('h2')].map((heading) => heading.textContent?.trim());
    expect(headings).toEqual(['Piles (2)', 'Samples (45)']);
    expect(element.textContent).toContain('3 changes wait on this phone');
    expect(element.textContent).toContain('Pan tests: 1');
    const sampleItems = () => [...element.querySelectorAll('ul.records')[1].querySelectorAll('li strong')].map((item) => item.textContent);
    expect(sampleItems()).toHaveLength(SAMPLES_PAGE);
    expect(sampleItems()[0]).toBe('JR-90-000045');
    expect(element.textContent).toContain(`The latest ${SAMPLES_PAGE} of 45 samples.`);
    const pileItems = [...element.querySelectorAll('ul.records')[0].querySelectorAll('li')];
    expect(pileItems.map((item) => item.querySelector('strong')?.textContent)).toEqual(['JR-1-P0001', 'JR-1-P0002']);
    expect(pileItems[0].querySelector('[aria-label="waiting to sync"]')).not.toBeNull();
    expect(pileItems[0].textContent).toContain('Mill discharge');

    [...element.querySelectorAll('button')].find((button) => button.textContent?.includes('Show more samples'))!.click();
    await settle(fixture);
    expect(sampleItems()).toHaveLength(SAMPLES_PAGE * 2);

    // A sample saved on the phone appears at the top at once, and the count follows.
    await db.samples.put(sample(100, { code: 'JR-900-0001', hasPendingChange: true }));
    await settle(fixture);
    expect(sampleItems()[0]).toBe('JR-900-0001');
    expect(element.querySelectorAll('h2')[1].textContent?.trim()).toBe('Samples (46)');
  });

  it('speaks Kiswahili and French, with a decimal comma in French', async () => {
    await db.samples.bulkPut([sample(1)]);
    await db.piles.bulkPut([pile('JR-1-P0001')]);
    const { fixture, element } = await render();
    expect(element.textContent).toContain('10.25 kg');

    await TestBed.inject(AppLanguage).use('sw');
    await settle(fixture);
    expect(element.textContent).toContain('Mabadiliko 3 yanasubiri kwenye simu hii');
    expect(element.textContent).toContain('Sampuli (1)');

    await TestBed.inject(AppLanguage).use('fr');
    await settle(fixture);
    expect(element.textContent).toContain('3 modifications attendent sur ce téléphone');
    expect(element.textContent).toContain('Échantillons (1)');
    expect(element.textContent).toContain('10,25 kg');
  });
});
