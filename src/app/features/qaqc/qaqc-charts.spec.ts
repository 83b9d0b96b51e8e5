import { hardBounds, standardChart } from './qaqc-charts';

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
  it('draws the expected value and the ±2 and ±3 SD lines', () => {
    const chart = standardChart('S1', [{ itemId: 'a', batchCode: 'JR-LB001', labCode: 'JR-LB001-004', standardCode: 'S1', valueGpt: 2.6, expectedGpt: 2.5, sdGpt: 0.1, zScore: 1, verdict: 'pass' }], 2.5, 0.1);
    const lines = chart.data.datasets.slice(1).map((dataset) => [dataset.label, (dataset.data as number[])[0]]);
    expect(lines.map(([label, value]) => [label, Number((value as number).toFixed(6))])).toEqual([['Expected', 2.5], ['+2 SD', 2.7], ['−2 SD', 2.3], ['+3 SD', 2.8], ['−3 SD', 2.2]]);
  });
});
