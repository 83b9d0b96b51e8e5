import { signal } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';
import { AuthSession, type SessionUser } from '../../../../core/auth/auth-session';
import { AppLanguage } from '../../../../i18n/app-language';
import { SiteMapStore, type SiteReview } from '../../site-map.store';
import SiteMapPage from './site-map-page';

// The heat-map worker is started with import.meta.url, which Jest's CommonJS cannot load; this test draws no heat map.
jest.mock('../../heatmap-client', () => ({ HeatmapClient: class {} }));

const geologist: SessionUser = {
  id: 'g1', organizationId: 'o', email: 'neema@crew.test', name: 'Neema', role: 'geologist', labName: null,
  siteIds: ['s1'], sites: [{ id: 's1', code: 'JR', name: 'Jackal Ridge' }], deviceId: 'd1', deviceName: 'Desk',
};

const square = (lon: number, lat: number, side = 0.0002) => ({
  type: 'Polygon' as const,
  coordinates: [[[lon, lat], [lon + side, lat], [lon + side, lat + side], [lon, lat + side], [lon, lat]]],
});

const review = {
  site: { id: 's1', code: 'JR', name: 'Jackal Ridge' },
  image: null,
  piles: [
    { pile: { id: 'p1', code: 'JR-07-P0001', material: 'sluice-tailings', footprint: square(33.451, -4.052) }, estimate: { dryTonnes: 1234.4, grade: { meanGpt: 1.25, n: 4 }, containedAuG: 1543 } },
    { pile: { id: 'p2', code: 'JR-07-P0002', material: 'mill-discharge', footprint: square(33.4515, -4.0515) }, estimate: null },
  ],
  samples: [
    { id: 'x1', code: 'JR-07-0001', sampleType: 'duplicate', location: { type: 'Point', coordinates: [33.4511, -4.0519] }, gradeGpt: 2.5 },
  ],
} as unknown as SiteReview;

async function render() {
  const shown = signal<SiteReview | null>(null);
  TestBed.configureTestingModule({
    providers: [
      provideRouter([]),
      {
        provide: SiteMapStore,
        useValue: {
          review: shown, problem: signal(null), isLoading: signal(false), shortlist: signal(null),
          fetchReview: async () => review, show: (value: SiteReview) => shown.set(value), load: async () => shown.set(review),
          tileUrl: async () => null, imageObjectUrl: async () => null,
        },
      },
    ],
  });
  TestBed.inject(AuthSession).signIn(geologist, { accessToken: 'a', refreshToken: 'r' });
  const fixture = TestBed.createComponent(SiteMapPage);
  fixture.autoDetectChanges();
  await new Promise((resolve) => setTimeout(resolve, 0));
  await fixture.whenStable();
  const element = fixture.nativeElement as HTMLElement;
  const labels = () => [...element.querySelectorAll('.hs-pile-label')].map((label) => label.textContent);
  return { fixture, element, labels };
}

describe('SiteMapPage', () => {
  it('labels the piles in words and draws the sample letters', async () => {
    const { element, labels } = await render();
    expect(labels()).toEqual(['JR-07-P0001 · 1.25 g/t', 'JR-07-P0002 · no grade yet']);
    expect(element.querySelector('.leaflet-marker-icon.hs-sample-diamond')?.textContent).toBe('D');
    expect(element.querySelector('.hs-north-arrow')?.getAttribute('aria-label')).toBe('North is up');
  });

  it('draws the map\'s own words again in Kiswahili and French, figures in the French way', async () => {
    const { fixture, element, labels } = await render();
    await TestBed.inject(AppLanguage).use('sw');
    await fixture.whenStable();
    expect(labels()).toEqual(['JR-07-P0001 · 1.25 g/t', 'JR-07-P0002 · bado hakuna kiwango']);
    expect(element.querySelector('.leaflet-marker-icon.hs-sample-diamond')?.textContent).toBe('P');
    expect(element.querySelector('.hs-north-arrow')?.getAttribute('aria-label')).toBe('Kaskazini iko juu');
    expect(element.querySelector('h1')?.textContent).toBe('Ramani ya eneo');

    await TestBed.inject(AppLanguage).use('fr');
    await fixture.whenStable();
    expect(labels()).toEqual(['JR-07-P0001 · 1,25 g/t', 'JR-07-P0002 · pas encore de teneur']);
    expect(element.querySelector('.sample-key')?.textContent).toContain('Duplicata de terrain');
    expect(element.querySelector('.hs-north-arrow')?.getAttribute('aria-label')).toBe('Le nord est en haut');
  });
});
