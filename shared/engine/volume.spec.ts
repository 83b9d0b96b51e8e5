import fc from 'fast-check';
import { unwrap } from './result';
import { coneVolume, flatToppedVolume, pileVolume, placeSpotHeights, sacksVolume, surveyedVolume } from './volume';
import { parseFootprint } from './footprint';
import { localPlane } from './geodesy';

const ORIGIN = { lon: 30.05, lat: -1.95 };
const plane = localPlane(ORIGIN);

/** A GeoJSON polygon from corners given in metres east/north of a fixed origin. */
function polygonM(corners: readonly (readonly [number, number])[]): { type: 'Polygon'; coordinates: number[][][] } {
  const ring = corners.map(([x, y]) => {
    const { lon, lat } = plane.toLonLat({ x, y });
    return [lon, lat];
  });
  return { type: 'Polygon', coordinates: [[...ring, ring[0]]] };
}

function square(sideM: number): { type: 'Polygon'; coordinates: number[][][] } {
  const half = sideM / 2;
  return polygonM([[-half, -half], [half, -half], [half, half], [-half, half]]);
}

function disc(radiusM: number, corners: number): { type: 'Polygon'; coordinates: number[][][] } {
  return polygonM(Array.from({ length: corners }, (_, index) => {
    const angle = (2 * Math.PI * index) / corners;
    return [radiusM * Math.cos(angle), radiusM * Math.sin(angle)] as const;
  }));
}

function at(x: number, y: number, heightM: number): { lon: number; lat: number; heightM: number } {
  return { ...plane.toLonLat({ x, y }), heightM };
}

describe('coneVolume', () => {
  it('gives A·h/3 for a cone', () => {
    // closed form: cone V = πr²h/3
    expect(unwrap(coneVolume({ areaM2: Math.PI * 25, heightM: 3 })).volumeM3).toBeCloseTo((Math.PI * 25 * 3) / 3, 10);
  });

  it('grows with height', () => {
    fc.assert(
      fc.property(fc.double({ min: 1, max: 1e4, noNaN: true }), fc.double({ min: 0.1, max: 20, noNaN: true }), fc.double({ min: 0.01, max: 5, noNaN: true }), (areaM2, heightM, extraM) => {
        expect(unwrap(coneVolume({ areaM2, heightM: heightM + extraM })).volumeM3).toBeGreaterThan(unwrap(coneVolume({ areaM2, heightM })).volumeM3);
      }),
    );
  });

  it('refuses a negative height and a NaN area with typed errors', () => {
    const result = coneVolume({ areaM2: Number.NaN, heightM: -1 });
    expect(!result.ok && result.errors.map((error) => error.code)).toEqual(['not-a-number', 'not-positive']);
  });
});

describe('flatToppedVolume', () => {
  it('matches the frustum of a square pyramid', () => {
    // closed form: frustum V = h(A₁ + A₂ + √(A₁A₂))/3; side 20 m, 45°, height 4 m → crest side 12 m
    const result = unwrap(flatToppedVolume({ footprint: square(20), heightM: 4, angleOfReposeDeg: 45 }));
    const base = 400;
    const top = 144;
    expect(result.sectionsM2?.top).toBeCloseTo(top, 1);
    expect(Math.abs(result.volumeM3 - (4 * (base + top + Math.sqrt(base * top))) / 3) / result.volumeM3).toBeLessThan(1e-4);
    expect(result.warnings).toEqual([]);
  });

  it('matches a cone frustum on a round footprint', () => {
    // closed form: cone frustum V = πh(R² + Rr + r²)/3, R = 10 m, 35°, h = 3 m
    const tan = Math.tan((35 * Math.PI) / 180);
    const radiusM = 10;
    const crestM = radiusM - 3 / tan;
    // 720 corners: the polygon's area is within 1.3e-5 of the circle's.
    const result = unwrap(flatToppedVolume({ footprint: disc(radiusM, 720), heightM: 3, angleOfReposeDeg: 35 }));
    const exact = (Math.PI * 3 * (radiusM ** 2 + radiusM * crestM + crestM ** 2)) / 3;
    expect(Math.abs(result.volumeM3 - exact) / exact).toBeLessThan(2e-4);
  });

  it('falls back to the square pyramid the slope allows when the crest vanishes, and says so', () => {
    // closed form: square pyramid V = s²h/3 with h = (s/2)·tanθ; side 10 m at 40° reaches 4.195 m
    const tan = Math.tan((40 * Math.PI) / 180);
    const result = unwrap(flatToppedVolume({ footprint: square(10), heightM: 8, angleOfReposeDeg: 40 }));
    const heightM = 5 * tan;
    expect(result.heightUsedM).toBeCloseTo(heightM, 2);
    expect(Math.abs(result.volumeM3 - (100 * heightM) / 3) / result.volumeM3).toBeLessThan(1e-3);
    expect(result.warnings.map((warning) => warning.code)).toEqual(['crest-vanishes']);
  });

  it('gives the wedge-topped solid of a rectangle whose crest closes to a ridge', () => {
    // closed form: a hipped roof over a×b at slope θ, ridge b − a: V = h·a·(3b − a)/6... via prismoidal, h = (a/2)tanθ
    const a = 10;
    const b = 30;
    const tan = Math.tan((45 * Math.PI) / 180);
    const h = (a / 2) * tan;
    const result = unwrap(flatToppedVolume({ footprint: polygonM([[0, 0], [b, 0], [b, a], [0, a]]), heightM: 20, angleOfReposeDeg: 45 }));
    // Sections (a − 2z/tanθ)(b − 2z/tanθ) at z = 0, h/2, h: prismoidal is exact for this quadratic.
    const exact = (h / 6) * (a * b + 4 * (a / 2) * (b - a / 2) + 0);
    expect(Math.abs(result.volumeM3 - exact) / exact).toBeLessThan(1e-3);
  });

  it('grows with height, and stops growing once the slope closes the crest', () => {
    fc.assert(
      fc.property(fc.double({ min: 0.2, max: 6, noNaN: true }), fc.double({ min: 0.05, max: 3, noNaN: true }), (heightM, extraM) => {
        const lower = unwrap(flatToppedVolume({ footprint: square(16), heightM, angleOfReposeDeg: 35 })).volumeM3;
        const higher = unwrap(flatToppedVolume({ footprint: square(16), heightM: heightM + extraM, angleOfReposeDeg: 35 })).volumeM3;
        // 1e-4: sections are offset on a 1 mm grid, so a plateau is flat only to that resolution.
        expect(higher).toBeGreaterThanOrEqual(lower * (1 - 1e-4));
      }),
      { numRuns: 40 },
    );
  });

  it('refuses an angle of 90° or more, a NaN height and a bad footprint together', () => {
    const result = flatToppedVolume({ footprint: { type: 'Polygon', coordinates: [] }, heightM: Number.NaN, angleOfReposeDeg: 90 });
    expect(!result.ok && result.errors.map((error) => error.field)).toEqual(['heightM', 'angleOfReposeDeg', 'footprint']);
    expect(flatToppedVolume({ footprint: square(10), heightM: 1, angleOfReposeDeg: -3 }).ok).toBe(false);
  });
});

describe('surveyedVolume', () => {
  it('gives a square pyramid exactly from its apex', () => {
    // closed form: square pyramid V = s²h/3
    const result = unwrap(surveyedVolume({ footprint: square(12), spotHeights: [at(0, 0, 3)] }));
    expect(result.volumeM3).toBeCloseTo((144 * 3) / 3, 6);
    expect(result.triangleCount).toBe(4);
  });

  it('gives a square frustum exactly from its four crest corners', () => {
    // closed form: frustum V = h(A₁ + A₂ + √(A₁A₂))/3, base 20 m, crest 8 m, h 2 m
    const crest = [at(-4, -4, 2), at(4, -4, 2), at(4, 4, 2), at(-4, 4, 2)];
    const result = unwrap(surveyedVolume({ footprint: square(20), spotHeights: crest }));
    expect(result.volumeM3).toBeCloseTo((2 * (400 + 64 + Math.sqrt(400 * 64))) / 3, 5);
  });

  it('approaches a cone from heights read on its surface', () => {
    // closed form: cone V = πr²h/3, r = 10 m, h = 4 m; rings of spot heights on the cone
    const spots = [at(0, 0, 4)];
    for (const fraction of [0.25, 0.5, 0.75]) {
      for (let index = 0; index < 72; index += 1) {
        const angle = (2 * Math.PI * (index + fraction)) / 72;
        spots.push(at(10 * fraction * Math.cos(angle), 10 * fraction * Math.sin(angle), 4 * (1 - fraction)));
      }
    }
    const result = unwrap(surveyedVolume({ footprint: disc(10, 72), spotHeights: spots }));
    const exact = (Math.PI * 100 * 4) / 3;
    expect(Math.abs(result.volumeM3 - exact) / exact).toBeLessThan(0.01);
  });

  it('leaves out spot heights outside the toe or repeated, with warnings', () => {
    const result = unwrap(surveyedVolume({ footprint: square(12), spotHeights: [at(0, 0, 3), at(0, 0, 3), at(50, 50, 9)] }));
    expect(result.volumeM3).toBeCloseTo(144, 6);
    expect(result.warnings.map((warning) => warning.code).sort()).toEqual(['spot-outside-footprint', 'spot-repeated']);
  });

  it('warns when the surface does not follow a concave toe', () => {
    const lShape = polygonM([[0, 0], [20, 0], [20, 10], [10, 10], [10, 20], [0, 20]]);
    const result = unwrap(surveyedVolume({ footprint: lShape, spotHeights: [at(5, 5, 2), at(15, 5, 2), at(5, 15, 2)] }));
    expect(result.volumeM3).toBeGreaterThan(0);
    expect(result.warnings.map((warning) => warning.code)).not.toContain('spot-outside-footprint');
  });

  it('refuses no spot heights, none inside, negative heights and NaN', () => {
    expect(!surveyedVolume({ footprint: square(10), spotHeights: [] }).ok).toBe(true);
    const outside = surveyedVolume({ footprint: square(10), spotHeights: [at(30, 30, 1)] });
    expect(!outside.ok && outside.errors[0].code).toBe('empty');
    const negative = surveyedVolume({ footprint: square(10), spotHeights: [at(0, 0, -1), { lon: Number.NaN, lat: 0, heightM: 1 }] });
    expect(!negative.ok && negative.errors.map((error) => error.code)).toEqual(['negative', 'not-a-number']);
    expect(surveyedVolume({ footprint: null, spotHeights: [at(0, 0, 1)] }).ok).toBe(false);
  });
});

describe('placeSpotHeights', () => {
  it('says of each point what the surveyed volume does with it, in the order taken', () => {
    // A 12 m square toe with corners at (±6, ±6): a point on a corner adds nothing to a surface that
    // already passes through that corner at 0 m (geometry of the triangulation, common practice, no source).
    const footprint = unwrap(parseFootprint(square(12)));
    const placements = placeSpotHeights(footprint, [at(0, 0, 3), at(50, 50, 9), at(0, 0.005, 3.1), at(6, 6, 0), at(2, 2, 2)]);
    expect(placements.map((placement) => placement.status)).toEqual(['counted', 'outside', 'repeated', 'repeated', 'counted']);
    expect(placements[2]).toEqual({ status: 'repeated', ofPoint: 0 });
    expect(placements[3]).toEqual({ status: 'repeated', ofPoint: null });
  });

  it('counts for the volume exactly the points it places as counted', () => {
    // The apex alone gives the square pyramid s²h/3 (closed form); the repeats and the far point change nothing.
    const spots = [at(0, 0, 3), at(0, 0.005, 3.1), at(50, 50, 9), at(6, -6, 0)];
    const counted = placeSpotHeights(unwrap(parseFootprint(square(12))), spots).filter((placement) => placement.status === 'counted');
    expect(counted).toHaveLength(1);
    expect(unwrap(surveyedVolume({ footprint: square(12), spotHeights: spots })).volumeM3).toBeCloseTo((144 * 3) / 3, 6);
  });
});

describe('sacksVolume', () => {
  it('counts sacks times mass and the volume at the bulk density', () => {
    // arithmetic: 120 sacks × 50 kg = 6 t; at 1.5 t/m³ = 4 m³
    const result = unwrap(sacksVolume({ sackCount: 120, sackMassKg: 50, bulkDensityTPerM3: 1.5 }));
    expect(result.wetMassKg).toBe(6000);
    expect(result.volumeM3).toBeCloseTo(4, 12);
  });

  it('refuses negative mass and part sacks', () => {
    expect(!sacksVolume({ sackCount: 10, sackMassKg: -50, bulkDensityTPerM3: 1.5 }).ok).toBe(true);
    const part = sacksVolume({ sackCount: 10.5, sackMassKg: 50, bulkDensityTPerM3: 1.5 });
    expect(!part.ok && part.errors[0].code).toBe('out-of-range');
  });
});

describe('pileVolume', () => {
  it('dispatches on the shape model', () => {
    expect(unwrap(pileVolume({ shapeModel: 'cone', footprint: square(10), heightM: 3 })).volumeM3).toBeCloseTo(100, 2);
    expect(unwrap(pileVolume({ shapeModel: 'flat-topped', footprint: square(20), heightM: 1, angleOfReposeDeg: 45 })).method).toBe('flat-topped');
    expect(unwrap(pileVolume({ shapeModel: 'surveyed', footprint: square(12), spotHeights: [at(0, 0, 3)] })).volumeM3).toBeCloseTo(144, 6);
    expect(unwrap(pileVolume({ shapeModel: 'sacks', sackCount: 2, sackMassKg: 50, bulkDensityTPerM3: 1 })).volumeM3).toBeCloseTo(0.1, 12);
  });

  it('refuses an unknown shape model and a cone without a footprint', () => {
    const unknown = pileVolume({ shapeModel: 'dome' as never });
    expect(!unknown.ok && unknown.errors[0].code).toBe('unknown-value');
    expect(pileVolume({ shapeModel: 'cone', heightM: 3 }).ok).toBe(false);
    expect(pileVolume({ shapeModel: 'cone', footprint: square(10), heightM: Number.NaN }).ok).toBe(false);
  });
});
