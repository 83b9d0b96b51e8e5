import { unwrap } from './result';
import {
  ASTM_E11_SIEVES,
  GRADE_UNIT_IN_GPT,
  SHORT_TON_KG,
  TROY_OUNCE_G,
  apertureUmToMesh,
  convertGrade,
  convertLength,
  gramsToTroyOunces,
  meshToApertureUm,
  troyOuncesToGrams,
} from './units';

describe('sieves', () => {
  // ASTM E11 Table 1, standard sieve designations, as listed in REFERENCES.md
  it.each([
    [4, 4750], [10, 2000], [16, 1180], [18, 1000], [20, 850], [30, 600], [40, 425], [50, 300],
    [60, 250], [80, 180], [100, 150], [140, 106], [200, 75], [270, 53], [325, 45], [400, 38],
  ])('gives No. %i an aperture of %i µm', (mesh, apertureUm) => {
    expect(unwrap(meshToApertureUm(mesh)).apertureUm).toBe(apertureUm);
    expect(unwrap(apertureUmToMesh(apertureUm)).mesh).toBe(mesh);
  });

  it('lists the whole series No. 4 to No. 400, coarse to fine', () => {
    // ASTM E11 Table 1: 29 designations from No. 4 to No. 400
    expect(ASTM_E11_SIEVES).toHaveLength(29);
    const apertures = ASTM_E11_SIEVES.map(([, apertureUm]) => apertureUm);
    expect([...apertures].sort((a, b) => b - a)).toEqual(apertures);
  });

  // Pre-1970 series as quoted in REFERENCES.md: 20 mesh = 840 µm, 80 = 177, 100 = 149, 200 = 74
  it.each([[20, 840], [80, 177], [100, 149], [200, 74]])('labels old-series No. %i as %i µm', (mesh, apertureUm) => {
    expect(unwrap(meshToApertureUm(mesh, 'pre-1970'))).toEqual({ mesh, apertureUm, series: 'pre-1970' });
  });

  it('refuses a mesh number that is not in the table rather than interpolating', () => {
    const result = meshToApertureUm(90);
    expect(result.ok).toBe(false);
    expect(!result.ok && result.errors[0].code).toBe('unknown-value');
  });

  it('refuses an aperture that is no sieve and names the nearest', () => {
    const result = apertureUmToMesh(800);
    expect(!result.ok && result.errors[0].details).toEqual({ nearestMesh: 20, nearestApertureUm: 850 });
  });

  it('refuses NaN and negative sizes with typed errors', () => {
    expect(!meshToApertureUm(Number.NaN).ok && 'typed').toBe('typed');
    const negative = apertureUmToMesh(-5);
    expect(!negative.ok && negative.errors[0].code).toBe('not-positive');
  });
});

describe('lengths', () => {
  it('converts millimetres to micrometres and back', () => {
    expect(unwrap(convertLength(0.85, 'mm', 'um'))).toBeCloseTo(850, 10);
    expect(unwrap(convertLength(75, 'um', 'mm'))).toBeCloseTo(0.075, 12);
    expect(unwrap(convertLength(3, 'mm', 'mm'))).toBe(3);
  });

  it('refuses a length that is not a number', () => {
    expect(convertLength(Number.NaN, 'mm', 'um').ok).toBe(false);
  });
});

describe('grades', () => {
  it('uses the troy ounce and short ton definitions', () => {
    // NIST SP 811 Appendix B: troy ounce = 31.1034768 g, short ton = 907.18474 kg (exact)
    expect(TROY_OUNCE_G).toBe(31.1034768);
    expect(SHORT_TON_KG).toBe(907.18474);
    expect(unwrap(troyOuncesToGrams(1))).toBe(31.1034768);
    expect(unwrap(gramsToTroyOunces(31.1034768))).toBe(1);
  });

  it('makes one troy ounce per short ton 240/7 g/t', () => {
    // NIST SP 811 Appendix B: 1 oz t/short ton = 34.2857 g/t = 240/7 g/t
    expect(unwrap(convertGrade(1, 'ozPerShortTon', 'gpt'))).toBeCloseTo(240 / 7, 12);
    expect(unwrap(convertGrade(240 / 7, 'gpt', 'ozPerShortTon'))).toBeCloseTo(1, 12);
  });

  it('treats g/t, ppm and mg/kg as the same number', () => {
    // NIST SP 811: 1 g/t = 1 ppm (by mass) = 1 mg/kg
    expect(unwrap(convertGrade(2.5, 'gpt', 'ppm'))).toBe(2.5);
    expect(unwrap(convertGrade(2.5, 'mgPerKg', 'gpt'))).toBe(2.5);
  });

  it('converts troy ounces per tonne to grams per tonne', () => {
    // troy ounce definition: 1 oz/t = 31.1034768 g/t
    expect(unwrap(convertGrade(2, 'ozPerTonne', 'gpt'))).toBeCloseTo(62.2069536, 10);
    expect(GRADE_UNIT_IN_GPT.ozPerTonne).toBe(TROY_OUNCE_G);
  });

  it('refuses negative grades, NaN and unknown units with every problem named', () => {
    const result = convertGrade(Number.NaN, 'gpt', 'furlongs' as never);
    expect(!result.ok && result.errors.map((error) => error.field)).toEqual(['value', 'to']);
    expect(!convertGrade(-1, 'gpt', 'ppm').ok).toBe(true);
    expect(troyOuncesToGrams(-1).ok).toBe(false);
    expect(gramsToTroyOunces(Number.NaN).ok).toBe(false);
  });
});
