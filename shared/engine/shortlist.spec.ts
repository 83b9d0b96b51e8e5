import { Geodesic } from 'geographiclib-geodesic';
import { unwrap } from './result';
import { Economics, ShortlistPile, buildShortlist } from './shortlist';

const ECONOMICS: Economics = {
  goldPricePerTroyOz: 2000,
  payableFraction: 0.95,
  haulCostPerTKm: 0.5,
  roadFactor: 1.3,
  processingPoint: { lon: 30.06, lat: -1.95 },
  processingCostPerT: 8,
  fixedCostPerPile: 300,
  ownerShareOfGross: 0.2,
  recovery: 0.6,
  confidenceLevel: 0.9,
};

const PILES: ShortlistPile[] = [
  { pileId: 'p1', code: 'DEMO-A', dryTonnes: 400, centroid: { lon: 30.05, lat: -1.95 }, gradeGpt: 2.0, gradeLowGpt: 1.4 },
  { pileId: 'p2', code: 'DEMO-B', dryTonnes: 1200, centroid: { lon: 30.08, lat: -1.96 }, gradeGpt: 0.9, gradeLowGpt: 0.5 },
  { pileId: 'p3', code: 'DEMO-C', dryTonnes: 150, centroid: { lon: 30.061, lat: -1.951 }, gradeGpt: 0.4, gradeLowGpt: 0.3 },
];

describe('buildShortlist', () => {
  it('works a pile through from contained gold to net value', () => {
    // DESIGN §7 economics by hand; troy ounce = 31.1034768 g (NIST SP 811); distance by GeographicLib (Karney 2013)
    const shortlist = unwrap(buildShortlist(PILES, ECONOMICS));
    const entry = shortlist.entries.find((candidate) => candidate.pileId === 'p1');
    const distanceKm = (Geodesic.WGS84.Inverse(-1.95, 30.05, -1.95, 30.06).s12 as number) / 1000;
    const contained = 400 * 2;
    const gross = ((contained * 0.6) / 31.1034768) * 2000 * 0.95;
    const haul = 400 * distanceKm * 1.3 * 0.5;
    const net = gross * 0.8 - haul - 400 * 8 - 300;
    expect(entry).toMatchObject({ containedAuG: contained, recoverableAuG: contained * 0.6 });
    expect(entry?.grossValue).toBeCloseTo(gross, 6);
    expect(entry?.haulDistanceKm).toBeCloseTo(distanceKm * 1.3, 6);
    expect(entry?.haulCost).toBeCloseTo(haul, 4);
    expect(entry?.ownerShare).toBeCloseTo(gross * 0.2, 6);
    expect(entry?.netValue).toBeCloseTo(net, 4);
    expect(entry?.valuePerTonne).toBeCloseTo(net / 400, 6);
  });

  it('gives a break-even grade at which the net value is zero', () => {
    const shortlist = unwrap(buildShortlist(PILES, ECONOMICS));
    for (const entry of shortlist.entries) {
      const pile = PILES.find((candidate) => candidate.pileId === entry.pileId) as ShortlistPile;
      const atBreakEven = unwrap(buildShortlist([{ ...pile, gradeGpt: entry.breakEvenGradeGpt, gradeLowGpt: 0 }], ECONOMICS));
      expect(atBreakEven.entries[0].netValue).toBeCloseTo(0, 6);
    }
  });

  it('ranks by net value, and gives the conservative value at the lower bound', () => {
    const shortlist = unwrap(buildShortlist(PILES, ECONOMICS));
    expect(shortlist.entries.map((entry) => entry.rank)).toEqual([1, 2, 3]);
    const nets = shortlist.entries.map((entry) => entry.netValue);
    expect([...nets].sort((a, b) => b - a)).toEqual(nets);
    for (const entry of shortlist.entries) {
      expect(entry.conservativeNetValue).toBeLessThanOrEqual(entry.netValue);
    }
  });

  it('ranks again with price and recovery moved by ±20 %, capping recovery at 1', () => {
    const shortlist = unwrap(buildShortlist(PILES, { ...ECONOMICS, recovery: 0.9 }));
    const entry = shortlist.entries[0];
    expect(Object.keys(entry.ranks)).toEqual(['base', 'priceDown', 'priceUp', 'recoveryDown', 'recoveryUp']);
    expect(entry.netValueByScenario.priceUp).toBeGreaterThan(entry.netValueByScenario.base);
    expect(entry.netValueByScenario.priceDown).toBeLessThan(entry.netValueByScenario.base);
    const costs = entry.haulCost + entry.processingCost + entry.fixedCost;
    const grossAtFullRecovery = (entry.containedAuG / 31.1034768) * 2000 * 0.95;
    expect(entry.netValueByScenario.recoveryUp).toBeCloseTo(grossAtFullRecovery * 0.8 - costs, 6);
  });

  it('lets a cheap, near pile overtake a richer far one when the price falls', () => {
    const piles: ShortlistPile[] = [
      { pileId: 'near', code: 'N', dryTonnes: 100, centroid: { lon: 30.06, lat: -1.95 }, gradeGpt: 3, gradeLowGpt: 2 },
      { pileId: 'far', code: 'F', dryTonnes: 2000, centroid: { lon: 30.3, lat: -1.95 }, gradeGpt: 0.7, gradeLowGpt: 0.4 },
    ];
    const shortlist = unwrap(buildShortlist(piles, { ...ECONOMICS, haulCostPerTKm: 0.2 }));
    const far = shortlist.entries.find((entry) => entry.pileId === 'far');
    expect(far?.ranks.base).toBe(1);
    expect(far?.ranks.priceDown).toBe(2);
  });

  it('carries every assumption it used', () => {
    const shortlist = unwrap(buildShortlist(PILES, ECONOMICS));
    expect(shortlist.assumptions).toMatchObject({ ...ECONOMICS, sensitivityStep: 0.2 });
    expect(shortlist.assumptions.notes.join(' ')).toContain('31.1034768');
  });

  it('gives an unbounded break-even grade for a pile with no tonnes', () => {
    const shortlist = unwrap(buildShortlist([{ ...PILES[0], dryTonnes: 0 }], ECONOMICS));
    expect(shortlist.entries[0].breakEvenGradeGpt).toBe(Infinity);
    expect(shortlist.entries[0].valuePerTonne).toBe(0);
  });

  it.each([
    ['no piles', [], ECONOMICS, 'empty'],
    ['a negative tonnage', [{ ...PILES[0], dryTonnes: -5 }], ECONOMICS, 'negative'],
    ['a lower bound above the estimate', [{ ...PILES[0], gradeLowGpt: 3 }], ECONOMICS, 'out-of-range'],
    ['a NaN price', PILES, { ...ECONOMICS, goldPricePerTroyOz: Number.NaN }, 'not-a-number'],
    ['a road factor below 1', PILES, { ...ECONOMICS, roadFactor: 0.8 }, 'out-of-range'],
    ['an owner share of 100 %', PILES, { ...ECONOMICS, ownerShareOfGross: 1 }, 'out-of-range'],
    ['a recovery above 1', PILES, { ...ECONOMICS, recovery: 1.2 }, 'out-of-range'],
    ['a pile with no centroid', [{ ...PILES[0], centroid: undefined as never }], ECONOMICS, 'not-a-number'],
  ])('refuses %s', (_label, piles, economics, code) => {
    const result = buildShortlist(piles, economics);
    expect(!result.ok && result.errors[0].code).toBe(code);
  });
});
