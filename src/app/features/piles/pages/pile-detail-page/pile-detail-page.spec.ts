import { Component, input } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';
import { estimatePile, unwrap } from '../../../../../../shared/engine';
import { AppLanguage } from '../../../../i18n/app-language';
import { FootprintPreview } from '../../components/footprint-preview';
import { PilesStore, type PileEstimateView, type PileView } from '../../piles.store';
import PileDetailPage from './pile-detail-page';

const pile: PileView = {
  id: 'p1', siteId: 's1', code: 'JR-07-P0001', material: 'sluice-tailings', footprint: null, heightM: 2, shapeModel: 'sacks',
  angleOfReposeDeg: null, bulkDensityTPerM3: null, moisturePct: null, spotHeights: null, sackCount: 40, sackMassKg: 50,
  hazards: ['mercury'], notes: '', revision: 3, updatedAt: '2026-03-01T08:00:00.000Z',
};

/** The engine's own estimate of the pile from three pan grades: it warns that three grades are few and pan-only. */
const estimate: PileEstimateView = {
  ...unwrap(estimatePile({ material: 'sluice-tailings', shapeModel: 'sacks', sackCount: 40, sackMassKg: 50 },
    [1.25, 2.5, 3.75].map((panGpt, index) => ({ sampleId: `s${index}`, sampleType: 'routine' as const, assayGpt: null, panGpt })))),
  sampleGrades: [],
};

// Leaflet needs a laid-out page; the footprint is not what this test is about.
@Component({ selector: 'hs-footprint-preview', template: '' })
class NoFootprint {
  readonly footprint = input<unknown>(null);
  readonly points = input<unknown>([]);
  readonly label = input('');
}

async function render() {
  TestBed.configureTestingModule({
    providers: [
      provideRouter([]),
      {
        provide: PilesStore,
        useValue: {
          pile: async () => pile, estimate: async () => estimate, samples: async () => ({ items: [] }), photos: async () => ({ items: [] }),
        },
      },
    ],
  });
  TestBed.overrideComponent(PileDetailPage, { remove: { imports: [FootprintPreview] }, add: { imports: [NoFootprint] } });
  const fixture = TestBed.createComponent(PileDetailPage);
  fixture.componentRef.setInput('id', pile.id);
  fixture.autoDetectChanges();
  // ngOnInit awaits the store's answers; a macrotask turn lets them all land.
  await new Promise((resolve) => setTimeout(resolve, 0));
  await fixture.whenStable();
  return { fixture, element: fixture.nativeElement as HTMLElement };
}

describe('PileDetailPage', () => {
  it('shows the estimate and the engine\'s warnings in English', async () => {
    const { element } = await render();
    expect(element.querySelector('[data-testid="mean-grade"]')?.textContent).toBe('2.50 g/t');
    expect(element.textContent).toContain('Samples needed for ±20 % at 90 %');
    expect(element.textContent).toContain('Only 3 grades: the confidence interval is likely too narrow.');
    expect(element.textContent).toContain('Some grades are pan estimates with no calibration against assays.');
  });

  it('follows a switch to Kiswahili and to French, with French number formats', async () => {
    const { fixture, element } = await render();
    await TestBed.inject(AppLanguage).use('sw');
    fixture.detectChanges();
    await fixture.whenStable();
    expect(element.textContent).toContain('Kiwango cha wastani');
    expect(element.textContent).toContain('Viwango 3 tu: kipindi cha uhakika huenda ni chembamba mno.');
    expect(element.querySelector('h1')?.textContent).toContain('magunia');

    await TestBed.inject(AppLanguage).use('fr');
    fixture.detectChanges();
    await fixture.whenStable();
    expect(element.textContent).toContain('Teneur moyenne');
    expect(element.textContent).toContain('Seulement 3 teneurs\u00a0: l’intervalle de confiance est sans doute trop étroit.');
    expect(element.querySelector('[data-testid="mean-grade"]')?.textContent).toBe('2,50 g/t');
    expect(element.querySelector('[data-testid="dry-tonnes"]')?.textContent).toMatch(/^\d+,\d t$/);
  });
});
