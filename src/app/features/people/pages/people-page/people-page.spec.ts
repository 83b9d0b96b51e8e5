import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';
import { AppLanguage } from '../../../../i18n/app-language';
import type { Person } from '../../people.store';
import PeoplePage from './people-page';

const person = (name: string, overrides: Partial<Person> = {}): Person => ({
  id: name, email: `${name.toLowerCase()}@crew.test`, name, role: 'sampler', labName: null, siteIds: ['s1'], status: 'active',
  isDisabled: false, devices: [], createdAt: null, ...overrides,
});

describe('PeoplePage', () => {
  beforeEach(() => {
    TestBed.configureTestingModule({
      imports: [PeoplePage],
      providers: [provideRouter([]), provideHttpClient(), provideHttpClientTesting()],
    });
  });

  it('lists people with role, site codes and status, and filters them as you type', async () => {
    const fixture = TestBed.createComponent(PeoplePage);
    fixture.autoDetectChanges();
    const server = TestBed.inject(HttpTestingController);
    server.expectOne('/api/people').flush({ items: [person('Amani'), person('Baraka', { role: 'lab', labName: 'Kestrel Analytical', siteIds: [], status: 'invited' })] });
    server.expectOne('/api/sites').flush({ items: [{ id: 's1', code: 'JR', name: 'Jackal Ridge camp', processingLat: null, processingLon: null, economics: null }] });
    // The store's awaits resume in later microtasks; one macrotask turn lets them all run.
    await new Promise((resolve) => setTimeout(resolve, 0));
    await fixture.whenStable();
    const rows = () => [...fixture.nativeElement.querySelectorAll('table[aria-label=People] tr[mat-row]')].map((row: HTMLElement) => row.textContent ?? '');
    expect(rows()).toHaveLength(2);
    expect(rows()[0]).toContain('Sampler (field crew)');
    expect(rows()[0]).toContain('JR');
    expect(rows()[1]).toContain('invited');

    const filter = fixture.nativeElement.querySelector('input[placeholder^="Name"]') as HTMLInputElement;
    filter.value = 'kestrel';
    filter.dispatchEvent(new Event('input'));
    await fixture.whenStable();
    expect(rows()).toHaveLength(1);
    expect(rows()[0]).toContain('Baraka');
    server.verify();
  });

  it('speaks Kiswahili and French: headers, role and status words, the filter on them, and coordinates in French digits', async () => {
    const fixture = TestBed.createComponent(PeoplePage);
    fixture.autoDetectChanges();
    const server = TestBed.inject(HttpTestingController);
    server.expectOne('/api/people').flush({ items: [person('Amani'), person('Baraka', { status: 'invited' })] });
    server.expectOne('/api/sites').flush({ items: [{ id: 's1', code: 'JR', name: 'Jackal Ridge camp', processingLat: -3.5, processingLon: 32.25, economics: null }] });
    await new Promise((resolve) => setTimeout(resolve, 0));
    await fixture.whenStable();
    const element = fixture.nativeElement as HTMLElement;
    const rows = () => [...element.querySelectorAll('section[aria-labelledby=people-heading] tr[mat-row]')].map((row) => row.textContent ?? '');
    const headers = () => [...element.querySelectorAll('section[aria-labelledby=people-heading] th')].map((cell) => cell.textContent?.trim());

    await TestBed.inject(AppLanguage).use('sw');
    await fixture.whenStable();
    expect(element.querySelector('h1')?.textContent).toContain('Watu na maeneo');
    expect(headers()).toEqual(expect.arrayContaining(['Jina', 'Jukumu', 'Hali']));
    expect(rows()[1]).toContain('amealikwa');

    await TestBed.inject(AppLanguage).use('fr');
    await fixture.whenStable();
    expect(rows()[0]).toContain('Échantillonneur (équipe de terrain)');
    expect(element.textContent).toContain('-3,5 ; 32,25');
    const filter = element.querySelector('input[matinput]') as HTMLInputElement;
    filter.value = 'invité';
    filter.dispatchEvent(new Event('input'));
    await fixture.whenStable();
    expect(rows()).toHaveLength(1);
    expect(rows()[0]).toContain('Baraka');
  });
});
