import { fitCalibration } from './calibration';
import { localPlane } from './geodesy';
import { estimatePile } from './estimate';
import { measureFootprint } from './footprint';
import { unwrap } from './result';
import { MATERIAL_DEFAULTS } from './tonnage';

const plane = localPlane({ lon: 30.05, lat: -1.95 });
const square = (() => {
  const ring = [[-10, -10], [10, -10], [10, 10], [-10, 10], [-10, -10]].map(([x, y]) => {
    const { lon, lat } = plane.toLonLat({ x, y });
    return [lon, lat];
  });
  return { type: 'Polygon' as const, coordinates: [ring] };
})();

const SAMPLES = [
  { sampleId: 's1', assayGpt: 1.2 },
  { sampleId: 's2', assayGpt: 0.8 },
  { sampleId: 's3', assayGpt: 1.6 },
  { sampleId: 's4', assayGpt: 0.9 },
  { sampleId: 'b1', assayGpt: 0.004, sampleType: 'blank' as const },
];

describe('estimatePile', () => {
  it('composes footprint, volume, tonnes, grade and contained gold', () => {
    // composition of the modules; cone V = A·h/3, dry t = V·ρ·(1 − m), contained = t × mean
    const estimate = unwrap(estimatePile({ material: 'mill-discharge', footprint: square, heightM: 3, shapeModel: 'cone', bulkDensityTPerM3: 1.7, moisturePct: 10 }, SAMPLES));
    const areaM2 = unwrap(measureFootprint(square)).areaM2;
    expect(estimate.areaM2).toBeCloseTo(areaM2, 9);
    expect(estimate.volumeM3).toBeCloseTo((areaM2 * 3) / 3, 9);
    expect(estimate.dryTonnes).toBeCloseTo(areaM2 * 1.7 * 0.9, 9);
    expect(estimate.grade).toMatchObject({ n: 4, meanGpt: 1.125, source: 'assay' });
    expect(estimate.containedAuG).toBeCloseTo(estimate.dryTonnes * 1.125, 9);
    expect(estimate.samplesNeeded).toBeGreaterThan(0);
    expect(estimate.assumptions.join(' ')).toContain('blank or standard');
  });

  it('fills in material defaults and records them as assumptions', () => {
    const estimate = unwrap(estimatePile({ material: 'waste-rock', footprint: square, heightM: 2, shapeModel: 'flat-topped' }, SAMPLES));
    const defaults = MATERIAL_DEFAULTS['waste-rock'];
    expect(estimate.assumptions.filter((line) => line.includes('default for waste-rock'))).toHaveLength(3);
    expect(estimate.dryTonnes).toBeCloseTo(estimate.volumeM3 * defaults.bulkDensityTPerM3 * (1 - defaults.moisturePct / 100), 9);
  });

  it('weighs sacks directly and needs no footprint', () => {
    const estimate = unwrap(estimatePile({ material: 'pit-spoil', shapeModel: 'sacks', sackCount: 100, sackMassKg: 50, moisturePct: 10, bulkDensityTPerM3: 1.6 }, SAMPLES));
    expect(estimate.dryTonnes).toBeCloseTo(4.5, 12);
    expect(estimate.areaM2).toBeNull();
  });

  it('uses calibrated pan estimates where there is no assay, and says when the grade is mixed', () => {
    const pairs = Array.from({ length: 10 }, (_, index) => ({ panGpt: index, assayGpt: 0.1 + 1.2 * index }));
    const calibration = unwrap(fitCalibration(pairs));
    const estimate = unwrap(estimatePile({ material: 'sluice-tailings', footprint: square, heightM: 2, shapeModel: 'cone' }, [...SAMPLES, { sampleId: 'p1', panGpt: 1 }], { calibration }));
    expect(estimate.grade?.source).toBe('mixed');
    expect(estimate.grade?.n).toBe(5);
    const uncalibrated = unwrap(estimatePile({ material: 'sluice-tailings', footprint: square, heightM: 2, shapeModel: 'cone' }, [{ sampleId: 'p1', panGpt: 1 }, { sampleId: 'p2', panGpt: 2 }]));
    expect(uncalibrated.warnings.map((warning) => warning.code)).toContain('uncalibrated-pan');
  });

  it('gives tonnes but no grade for a pile with no samples yet', () => {
    const estimate = unwrap(estimatePile({ material: 'mill-discharge', footprint: square, heightM: 3, shapeModel: 'cone' }, []));
    expect(estimate.grade).toBeNull();
    expect(estimate.containedAuG).toBeNull();
    expect(estimate.warnings.map((warning) => warning.code)).toEqual(['no-samples']);
  });

  it.each([
    ['an unknown material', { material: 'slag' as never, footprint: square, heightM: 3, shapeModel: 'cone' as const }, [], 'unknown-value'],
    ['an empty footprint', { material: 'mill-discharge' as const, footprint: { type: 'Polygon', coordinates: [] }, heightM: 3, shapeModel: 'cone' as const }, [], 'empty'],
    ['moisture of 100 %', { material: 'mill-discharge' as const, footprint: square, heightM: 3, shapeModel: 'cone' as const, moisturePct: 100 }, [], 'out-of-range'],
    ['a NaN height', { material: 'mill-discharge' as const, footprint: square, heightM: Number.NaN, shapeModel: 'cone' as const }, [], 'not-a-number'],
    ['sacks of negative mass', { material: 'mill-discharge' as const, shapeModel: 'sacks' as const, sackCount: 3, sackMassKg: -1 }, [], 'not-positive'],
    ['a negative assay', { material: 'mill-discharge' as const, footprint: square, heightM: 3, shapeModel: 'cone' as const }, [{ sampleId: 'x', assayGpt: -1 }], 'negative'],
  ])('refuses %s', (_label, pile, samples, code) => {
    const result = estimatePile(pile, samples);
    expect(!result.ok && result.errors[0].code).toBe(code);
  });
});
