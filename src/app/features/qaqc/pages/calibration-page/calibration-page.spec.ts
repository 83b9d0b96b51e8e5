import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { Component, input } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { By } from '@angular/platform-browser';
import type { ChartConfiguration } from 'chart.js';
import { AuthSession, type SessionUser } from '../../../../core/auth/auth-session';
import { AppLanguage } from '../../../../i18n/app-language';
import { ChartCanvas } from '../../components/chart/chart-canvas';
import type { SiteCalibration } from '../../qaqc.store';
import CalibrationPage from './calibration-page';

const GEOLOGIST: SessionUser = {
  id: 'u-geo', organizationId: 'o1', email: 'geo@heapsight.test', name: 'Amani', role: 'geologist', labName: null,
  siteIds: ['s1'], sites: [{ id: 's1', code: 'JR', name: 'Jackal Ridge camp' }], deviceId: null, deviceName: null,
};

/** Stands in for the chart canvas (jsdom has no 2D canvas for chart.js): it only holds what the page passes in. */
@Component({ selector: 'hs-chart-canvas', template: '' })
class ChartCanvasStub {
  readonly config = input.required<ChartConfiguration>();
  readonly label = input.required<string>();
}

const points = Array.from({ length: 12 }, (_, index) => ({ sampleId: `x${index}`, code: `JR-${index}`, panGpt: 0.5 + index * 0.2, assayGpt: 0.6 + index * 0.19 }));

describe('CalibrationPage', () => {
  async function render(data: SiteCalibration) {
    TestBed.configureTestingModule({ imports: [CalibrationPage], providers: [provideHttpClient(), provideHttpClientTesting()] });
    TestBed.overrideComponent(CalibrationPage, { remove: { imports: [ChartCanvas] }, add: { imports: [ChartCanvasStub] } });
    TestBed.inject(AuthSession).user.set(GEOLOGIST);
    const fixture = TestBed.createComponent(CalibrationPage);
    fixture.autoDetectChanges();
    TestBed.inject(HttpTestingController).expectOne((request) => request.url === '/api/calibration').flush(data);
    await new Promise((resolve) => setTimeout(resolve, 0));
    await fixture.whenStable();
    const chart = () => fixture.debugElement.query(By.directive(ChartCanvasStub)).componentInstance as ChartCanvasStub;
    return { fixture, element: fixture.nativeElement as HTMLElement, chart };
  }

  const text = (element: HTMLElement, selector: string) => element.querySelector(selector)?.textContent?.replace(/\s+/g, ' ').trim() ?? '';
  const config = (canvas: ChartCanvasStub) => canvas.config() as ChartConfiguration<'scatter'>;

  afterEach(() => localStorage.clear());

  it('shows the fit and its warning, and redraws the chart in Kiswahili and French with French digits', async () => {
    const { fixture, element, chart } = await render({
      siteId: 's1', isApplied: false, refusals: [], points,
      fit: { slope: 0.95, interceptGpt: 0.12, n: 12, r2: 0.42, residualSdGpt: 0.1, panRangeGpt: [0.5, 2.7], warnings: [{ code: 'weak-fit', message: 'R² = 0.42: pan estimates explain little of the assays.' }] },
    });
    expect(text(element, '[data-testid=fit]')).toBe('n = 12 · R² = 0.42 · assay = 0.120 + 0.950 × pan');
    expect(element.textContent).toContain('R² = 0.42: pan estimates explain little of the assays.');
    expect(chart().label()).toBe('Assay against pan estimate, 12 samples, with the fitted line');

    await TestBed.inject(AppLanguage).use('sw');
    await fixture.whenStable();
    expect(text(element, 'h1')).toContain('Urekebishaji wa karai dhidi ya maabara');
    expect(element.textContent).toContain('makadirio ya karai yanaeleza kidogo tu matokeo ya uchambuzi');
    expect(config(chart()).options?.scales?.['x']?.title?.text).toBe('Makadirio ya karai g/t');

    await TestBed.inject(AppLanguage).use('fr');
    await fixture.whenStable();
    expect(text(element, '[data-testid=fit]')).toBe('n = 12 · R² = 0,42 · analyse = 0,120 + 0,950 × batée');
    expect(element.textContent).toContain('R² = 0,42 : les estimations à la batée expliquent peu les analyses.');
    expect(chart().label()).toBe('Analyse contre estimation à la batée, 12 échantillons, avec la droite ajustée');
    expect(config(chart()).data.datasets[1].label).toBe('Droite : analyse = 0,120 + 0,950 × batée');
    expect(config(chart()).options?.locale).toBe('fr');
  });

  it('says in French why there is no line yet, from the refusal’s code and figures', async () => {
    const { fixture, element } = await render({
      siteId: 's1', isApplied: false, fit: null, points: points.slice(0, 4),
      refusals: [{ code: 'too-few', message: 'calibration needs at least 10 samples with both a pan test and an assay (got 4)', details: { minPairs: 10 } }],
    });
    expect(element.textContent).toContain('No line yet: calibration needs at least 10 samples with both a pan test and an assay (got 4)');
    await TestBed.inject(AppLanguage).use('fr');
    await fixture.whenStable();
    expect(element.textContent).toContain('Pas encore de droite : l’étalonnage demande au moins 10 échantillons ayant à la fois une batée et une analyse (il y en a 4)');
  });
});
