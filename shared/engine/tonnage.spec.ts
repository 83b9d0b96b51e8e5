import { unwrap } from './result';
import { MATERIALS, MATERIAL_DEFAULTS, dryTonnes, sackDryTonnes } from './tonnage';

describe('dryTonnes', () => {
  it('takes moisture off the as-found density', () => {
    // DESIGN §7: dry t = V × ρ × (1 − moisture); 100 m³ × 1.8 t/m³ × 0.9 = 162 t
    const result = unwrap(dryTonnes({ volumeM3: 100, bulkDensityTPerM3: 1.8, moisturePct: 10 }));
    expect(result.dryTonnes).toBeCloseTo(162, 10);
    expect(result.wetTonnes).toBeCloseTo(180, 10);
  });

  it('uses a dry-basis density as it stands', () => {
    // AusIMM Monograph 23 (Lipton): tonnes = volume × dry bulk density
    const result = unwrap(dryTonnes({ volumeM3: 100, bulkDensityTPerM3: 1.5, moisturePct: 10, densityBasis: 'dry' }));
    expect(result.dryTonnes).toBeCloseTo(150, 10);
    expect(result.wetTonnes).toBeCloseTo(150 / 0.9, 10);
  });

  it('warns when the dry density is implausible for the material', () => {
    // Vick 1990 (from memory): sandy tailings 1.4–1.7 t/m³ dry
    const result = unwrap(dryTonnes({ volumeM3: 10, bulkDensityTPerM3: 2.9, moisturePct: 0, material: 'mill-discharge' }));
    expect(result.warnings.map((warning) => warning.code)).toEqual(['density-implausible']);
  });

  it.each([
    ['moisture of 100 %', { volumeM3: 1, bulkDensityTPerM3: 1.5, moisturePct: 100 }, 'out-of-range'],
    ['negative moisture', { volumeM3: 1, bulkDensityTPerM3: 1.5, moisturePct: -1 }, 'out-of-range'],
    ['negative volume', { volumeM3: -1, bulkDensityTPerM3: 1.5, moisturePct: 5 }, 'negative'],
    ['zero density', { volumeM3: 1, bulkDensityTPerM3: 0, moisturePct: 5 }, 'not-positive'],
    ['NaN volume', { volumeM3: Number.NaN, bulkDensityTPerM3: 1.5, moisturePct: 5 }, 'not-a-number'],
    ['an unknown material', { volumeM3: 1, bulkDensityTPerM3: 1.5, moisturePct: 5, material: 'slag' as never }, 'unknown-value'],
  ])('refuses %s', (_label, input, code) => {
    const result = dryTonnes(input);
    expect(!result.ok && result.errors[0].code).toBe(code);
  });
});

describe('MATERIAL_DEFAULTS', () => {
  it.each(MATERIALS)('gives %s a sourced, self-consistent default', (material) => {
    const defaults = MATERIAL_DEFAULTS[material];
    expect(defaults.source.length).toBeGreaterThan(20);
    const [low, high] = defaults.plausibleDryDensityTPerM3;
    expect(defaults.dryBulkDensityTPerM3).toBeGreaterThanOrEqual(low);
    expect(defaults.dryBulkDensityTPerM3).toBeLessThanOrEqual(high);
    // The as-found default gives back the dry default through the DESIGN §7 formula.
    expect(defaults.bulkDensityTPerM3 * (1 - defaults.moisturePct / 100)).toBeCloseTo(defaults.dryBulkDensityTPerM3, 2);
  });

  it('keeps sandy tailings inside the published range', () => {
    // Vick 1990 (from memory): drained sandy tailings 1.4–1.7 t/m³
    expect(MATERIAL_DEFAULTS['mill-discharge'].dryBulkDensityTPerM3).toBeGreaterThanOrEqual(1.4);
    expect(MATERIAL_DEFAULTS['mill-discharge'].dryBulkDensityTPerM3).toBeLessThanOrEqual(1.7);
  });
});

describe('sackDryTonnes', () => {
  it('weighs sacks as bagged and takes moisture off', () => {
    // arithmetic: 200 × 40 kg = 8 t wet; 15 % moisture → 6.8 t dry
    const result = unwrap(sackDryTonnes({ sackCount: 200, sackMassKg: 40, moisturePct: 15 }));
    expect(result.dryTonnes).toBeCloseTo(6.8, 10);
  });

  it('refuses a negative sack mass', () => {
    expect(sackDryTonnes({ sackCount: 200, sackMassKg: -40, moisturePct: 15 }).ok).toBe(false);
  });
});
