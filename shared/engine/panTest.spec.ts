import { colourMassMg, nominalDiameterUm, panTestGrade } from './panTest';
import { unwrap } from './result';
import { TROY_OUNCE_G } from './units';

describe('panTestGrade from weighed gold', () => {
  it('divides gold by dry mass and pan efficiency', () => {
    // DESIGN §7: 1 mg/kg = 1 g/t; 3 mg from 10 kg wet at 20 % moisture, efficiency 0.75 → 3 / (8 × 0.75) = 0.5 g/t
    const result = unwrap(panTestGrade({ massPannedKg: 10, moisturePct: 20, goldMassMg: 3, panEfficiency: 0.75 }));
    expect(result.gradeGpt).toBeCloseTo(0.5, 12);
    expect(result.method).toBe('weighed');
    expect(result.dryMassPannedKg).toBeCloseTo(8, 12);
  });

  it('prefers weighed gold over colours and says so', () => {
    const result = unwrap(panTestGrade({ massPannedKg: 10, goldMassMg: 1, colours: [{ sizeClass: 'fine', count: 3 }] }));
    expect(result.method).toBe('weighed');
    expect(result.warnings.map((warning) => warning.code)).toEqual(['colours-ignored']);
    expect(result.assumptions[0]).toContain('default');
  });
});

describe('panTestGrade from colours', () => {
  it('models a colour as a gold disc of the class diameter', () => {
    // closed form: disc mass = ρ·(π/4)·d²·(d/r); d = 1 mm, r = 10, ρ = 19.3 g/cm³ → 1.5158 mg
    expect(colourMassMg(1000, 10)).toBeCloseTo(19.3 * (Math.PI / 4) * 0.1 ** 3 / 10 * 1000, 10);
    // geometric mean of the ASTM E11 No. 40 (425 µm) and No. 20 (850 µm) sieves
    expect(nominalDiameterUm('medium')).toBeCloseTo(Math.sqrt(425 * 850), 10);
  });

  it('sums colours by class and shows each step', () => {
    const result = unwrap(panTestGrade({ massPannedKg: 12, colours: [{ sizeClass: 'coarse', count: 2 }, { sizeClass: 'fine', count: 30 }], panEfficiency: 0.8, flakeRatio: 8 }));
    const expectedMg = 2 * colourMassMg(nominalDiameterUm('coarse'), 8) + 30 * colourMassMg(nominalDiameterUm('fine'), 8);
    expect(result.goldMassMg).toBeCloseTo(expectedMg, 12);
    expect(result.gradeGpt).toBeCloseTo(expectedMg / (12 * 0.8), 12);
    expect(result.classes).toHaveLength(2);
    expect(result.classes[0].thicknessUm).toBeCloseTo(result.classes[0].nominalDiameterUm / 8, 10);
  });

  it('shows the grade at both ends of the usual flake ratio, thinner flakes giving less gold', () => {
    const result = unwrap(panTestGrade({ massPannedKg: 10, colours: [{ sizeClass: 'medium', count: 25 }] }));
    const [thick, thin] = result.flakeRatioSensitivity;
    expect(thick.flakeRatio).toBe(5);
    expect(thin.gradeGpt).toBeCloseTo(thick.gradeGpt / 2, 12);
    expect(result.gradeGpt).toBeLessThan(thick.gradeGpt);
    expect(result.gradeGpt).toBeGreaterThan(thin.gradeGpt);
  });

  it('puts a coarse colour in the heaviest mass class of the older bulletins', () => {
    // BLM Technical Bulletin 4 (Wells 1969): colour classes over 4 mg, 1–4 mg, under 1 mg
    expect(colourMassMg(nominalDiameterUm('coarse'), 5)).toBeGreaterThan(4);
    expect(colourMassMg(nominalDiameterUm('very-fine'), 5)).toBeLessThan(1);
  });

  it('lands within a factor of four of the colours-per-ounce tables for fine gold', () => {
    // Huntting 1955 (Washington DMG Bulletin 42), from memory via REFERENCES.md: fine gold 0.015–0.03 in,
    // about 12,000 colours per troy ounce. A flake model is lighter than a grain; the factor shows the spread.
    const diameterUm = Math.sqrt(0.015 * 0.03) * 25400;
    const coloursPerOunce = (TROY_OUNCE_G * 1000) / colourMassMg(diameterUm, 2);
    expect(coloursPerOunce / 12000).toBeGreaterThan(0.25);
    expect(coloursPerOunce / 12000).toBeLessThan(4);
  });

  it('warns when too few colours were seen', () => {
    // Clifton et al. 1969 (USGS PP 625-C): about 20 particles for ±50 %
    const result = unwrap(panTestGrade({ massPannedKg: 10, colours: [{ sizeClass: 'fine', count: 4 }] }));
    expect(result.warnings.map((warning) => warning.code)).toEqual(['few-colours']);
  });
});

describe('panTestGrade refusals', () => {
  it.each([
    ['a negative mass panned', { massPannedKg: -1, goldMassMg: 1 }, 'not-positive'],
    ['moisture of 100 %', { massPannedKg: 10, moisturePct: 100, goldMassMg: 1 }, 'out-of-range'],
    ['an efficiency above 1', { massPannedKg: 10, goldMassMg: 1, panEfficiency: 1.2 }, 'out-of-range'],
    ['negative gold', { massPannedKg: 10, goldMassMg: -1 }, 'negative'],
    ['NaN gold', { massPannedKg: 10, goldMassMg: Number.NaN }, 'not-a-number'],
    ['no gold at all', { massPannedKg: 10 }, 'missing'],
    ['an unknown size class', { massPannedKg: 10, colours: [{ sizeClass: 'huge' as never, count: 1 }] }, 'unknown-value'],
    ['a part colour', { massPannedKg: 10, colours: [{ sizeClass: 'fine' as const, count: 1.5 }] }, 'out-of-range'],
    ['a negative count', { massPannedKg: 10, colours: [{ sizeClass: 'fine' as const, count: -2 }] }, 'negative'],
  ])('refuses %s', (_label, input, code) => {
    const result = panTestGrade(input);
    expect(!result.ok && result.errors[0].code).toBe(code);
  });
});
