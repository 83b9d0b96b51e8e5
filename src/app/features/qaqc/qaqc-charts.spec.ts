import { TestBed } from '@angular/core/testing';
import { TranslocoService } from '@jsverse/transloco';
import { AppLanguage } from '../../i18n/app-language';
import { calibrationChart, hardBounds, standardChart, type ChartWords } from './qaqc-charts';

/** The charts' words from the app's real translations, in the language now active. */
function chartWords(): ChartWords {
  const transloco = TestBed.inject(TranslocoService);
  return { translate: (key, params) => transloco.translate(key, params), locale: TestBed.inject(AppLanguage).locale() };
}

describe('hardBounds', () => {
  // HARD = |a − b| / (a + b) (Abzalov 2008): at b = a(1 + t)/(1 − t), HARD is exactly t.
  it('puts the tolerance lines where HARD equals the tolerance', () => {
    const { upper, lower } = hardBounds(0.3);
    const hard = (a: number, b: number) => Math.abs(a - b) / (a + b);
    expect(hard(1, upper)).toBeCloseTo(0.3, 12);
    expect(hard(1, lower)).toBeCloseTo(0.3, 12);
  });
});

describe('standardChart', () => {
  const entries = [{ itemId: 'a', batchCode: 'JR-LB001', labCode: 'JR-LB001-004', standardCode: 'S1', valueGpt: 2.6, expectedGpt: 2.5, sdGpt: 0.1, zScore: 1, verdict: 'pass' as const }];

  it('draws the expected value and the ±2 and ±3 SD lines', () => {
    const chart = standardChart('S1', entries, 2.5, 0.1, chartWords());
    const lines = chart.data.datasets.slice(1).map((dataset) => [dataset.label, (dataset.data as number[])[0]]);
    expect(lines.map(([label, value]) => [label, Number((value as number).toFixed(6))])).toEqual([['Expected', 2.5], ['+2 SD', 2.7], ['−2 SD', 2.3], ['+3 SD', 2.8], ['−3 SD', 2.2]]);
  });

  it('names its lines and axes in French and formats its numbers in the French locale', async () => {
    await TestBed.inject(AppLanguage).use('fr');
    const chart = standardChart('S1', entries, 2.5, 0.1, chartWords());
    expect(chart.data.datasets.map((dataset) => dataset.label)).toEqual(['Résultat S1', 'Attendu', '+2 ET', '−2 ET', '+3 ET', '−3 ET']);
    expect(chart.options?.locale).toBe('fr');
    expect((chart.options?.scales?.['x'] as { title: { text: string } }).title.text).toBe('Ordre des lots');
  });
});

describe('calibrationChart', () => {
  const calibration = {
    siteId: 's1', isApplied: false, refusals: [], points: [{ sampleId: 'x', code: 'JR-1', panGpt: 1.5, assayGpt: 1.4 }],
    fit: { slope: 0.95, interceptGpt: 0.12, n: 12, r2: 0.81, residualSdGpt: 0.1, panRangeGpt: [0.2, 3] as [number, number], warnings: [] },
  };

  it('writes the fitted line in English, then in Kiswahili with the same figures', async () => {
    expect(calibrationChart(calibration, chartWords()).data.datasets[1].label).toBe('Fitted: assay = 0.120 + 0.950 × pan');
    await TestBed.inject(AppLanguage).use('sw');
    expect(calibrationChart(calibration, chartWords()).data.datasets[1].label).toBe('Mstari: uchambuzi = 0.120 + 0.950 × karai');
  });
});
