import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { SiteMapStore, decodeSiteMap, type SiteMapAnswer } from './site-map.store';

const answer: SiteMapAnswer = {
  site: { id: 's1', code: 'JR', name: 'Jackal Ridge' },
  image: null,
  piles: [{
    pile: { id: 'p1', code: 'JR-01-P0001', material: 'sluice-tailings', footprint: null },
    estimate: { dryTonnes: 120, containedAuG: 180, grade: { n: 3, meanGpt: 1.5, medianGpt: 1.4, sdGpt: 0.3, cv: 0.2, lognormalMeanGpt: 1.52, ciLowGpt: 1.2, ciHighGpt: 1.8, confidenceLevel: 0.9, source: 'pan' } },
  }],
  sampleFields: ['code', 'sampleType', 'lon', 'lat', 'gradeGpt'],
  samples: [['JR-01-0001', 'routine', 33.45, -4.05, 1.25], ['JR-01-0002', 'blank', null, null, null]],
};

describe('SiteMapStore', () => {
  it('asks for the compact map view and turns its sample rows back into samples with a point', async () => {
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting()] });
    const store = TestBed.inject(SiteMapStore);
    const server = TestBed.inject(HttpTestingController);

    const loading = store.load('s1');
    const request = server.expectOne((candidate) => candidate.url === '/api/review/sites/s1');
    expect(request.request.params.get('view')).toBe('map');
    request.flush(answer);
    await loading;

    expect(store.problem()).toBeNull();
    expect(store.review()?.samples).toEqual([
      { code: 'JR-01-0001', sampleType: 'routine', location: { type: 'Point', coordinates: [33.45, -4.05] }, gradeGpt: 1.25 },
      { code: 'JR-01-0002', sampleType: 'blank', location: null, gradeGpt: null },
    ]);
    expect(store.review()?.piles).toEqual(answer.piles);
    server.verify();
  });

  it('refuses an answer whose sample columns are not the ones it reads', () => {
    expect(() => decodeSiteMap({ ...answer, sampleFields: ['code', 'lat', 'lon', 'sampleType', 'gradeGpt'] })).toThrow(/unexpected sample columns/);
  });
});
