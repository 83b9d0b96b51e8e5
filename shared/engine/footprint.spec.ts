import fc from 'fast-check';
import { Geodesic } from 'geographiclib-geodesic';
import { centroidDistanceM, geodesicDistanceM, measureFootprint, parseFootprint } from './footprint';
import { unwrap } from './result';

function polygon(corners: readonly (readonly [number, number])[]): { type: 'Polygon'; coordinates: number[][][] } {
  const ring = corners.map(([lon, lat]) => [lon, lat]);
  return { type: 'Polygon', coordinates: [[...ring, ring[0]]] };
}

function geographicLib(corners: readonly (readonly [number, number])[]): { area: number; perimeter: number } {
  const polygonArea = Geodesic.WGS84.Polygon(false);
  for (const [lon, lat] of corners) {
    polygonArea.AddPoint(lat, lon);
  }
  const result = polygonArea.Compute(false, true);
  return { area: result.area as number, perimeter: result.perimeter };
}

/** A pile-sized ring walked around a centre: radius in metres, with some wobble. */
function pileRing(lon: number, lat: number, radiusM: number, corners: number): [number, number][] {
  const ring: [number, number][] = [];
  for (let index = 0; index < corners; index += 1) {
    const angle = (2 * Math.PI * index) / corners;
    const r = radiusM * (1 + 0.15 * Math.sin(3 * angle));
    ring.push([lon + (r * Math.cos(angle)) / (111320 * Math.cos((lat * Math.PI) / 180)), lat + (r * Math.sin(angle)) / 110574]);
  }
  return ring;
}

describe('measureFootprint', () => {
  it('matches the published GeographicLib diamond test polygon', () => {
    // GeographicLib documentation (Karney 2013), diamond (0,−1),(−1,0),(0,1),(1,0) lat,lon:
    // perimeter 627,598.2731 m, area 24,619,419,146 m²
    const metrics = unwrap(measureFootprint(polygon([[-1, 0], [0, -1], [1, 0], [0, 1]])));
    expect(metrics.perimeterM).toBeCloseTo(627598.2731, 2);
    // 1e-5 relative: the authalic-sphere edges differ from true geodesics over 150 km edges.
    expect(Math.abs(metrics.areaM2 - 24619419146) / 24619419146).toBeLessThan(1e-5);
  });

  it('agrees with GeographicLib on pile-sized footprints to 1e-7 of area (or 1e-3 m²) and 1 mm of perimeter', () => {
    // GeographicLib Karney 2013 via geographiclib-geodesic, WGS84
    fc.assert(
      fc.property(
        fc.double({ min: -179, max: 179, noNaN: true }),
        fc.double({ min: -70, max: 70, noNaN: true }),
        fc.double({ min: 3, max: 400, noNaN: true }),
        fc.integer({ min: 5, max: 40 }),
        (lon, lat, radiusM, corners) => {
          const ring = pileRing(lon, lat, radiusM, corners);
          const reference = geographicLib(ring);
          const metrics = unwrap(measureFootprint(polygon(ring)));
          // GeographicLib's own area carries up to about 1e-4 m² of rounding on polygons of a few m², hence the floor.
          expect(Math.abs(metrics.areaM2 - Math.abs(reference.area))).toBeLessThan(Math.max(1e-7 * Math.abs(reference.area), 1e-3));
          expect(Math.abs(metrics.perimeterM - reference.perimeter)).toBeLessThan(1e-3);
        },
      ),
      { numRuns: 60 },
    );
  });

  it('gives the same area whichever way the toe was walked', () => {
    const ring = pileRing(29.1, -2.5, 30, 12);
    const forward = unwrap(measureFootprint(polygon(ring)));
    const backward = unwrap(measureFootprint(polygon([...ring].reverse())));
    expect(backward.areaM2).toBeCloseTo(forward.areaM2, 6);
  });

  it('puts the centroid of a square at its middle', () => {
    // closed form: the centroid of a square is its centre
    const half = 0.0002;
    const metrics = unwrap(measureFootprint(polygon([[10 - half, 5 - half], [10 + half, 5 - half], [10 + half, 5 + half], [10 - half, 5 + half]])));
    expect(metrics.centroid.lon).toBeCloseTo(10, 9);
    expect(metrics.centroid.lat).toBeCloseTo(5, 9);
  });

  it('uses the area centroid, not the mean of the corners', () => {
    // closed form: an L of two unit squares has its centroid at (1, 0.75) of a 2×1 + 1×1 shape
    const unit = 0.0001;
    const ring: [number, number][] = [[0, 0], [2, 0], [2, 1], [1, 1], [1, 2], [0, 2]].map(([x, y]) => [x * unit, y * unit]);
    const centroid = unwrap(measureFootprint(polygon(ring))).centroid;
    // Three unit squares at (0.5,0.5), (1.5,0.5), (0.5,1.5): centroid (2.5/3, 2.5/3).
    expect(centroid.lon / unit).toBeCloseTo(2.5 / 3, 4);
    expect(centroid.lat / unit).toBeCloseTo(2.5 / 3, 3);
  });

  it('closes an unclosed ring and says so', () => {
    const ring = pileRing(0.5, 0.5, 20, 8);
    const open = unwrap(measureFootprint({ type: 'Polygon', coordinates: [ring] }));
    expect(open.warnings.map((warning) => warning.code)).toEqual(['ring-closed']);
    expect(open.areaM2).toBeCloseTo(unwrap(measureFootprint(polygon(ring))).areaM2, 6);
  });

  it('drops repeated consecutive points of a GPS standing still', () => {
    const ring = pileRing(0.5, 0.5, 20, 8);
    const stuttered = [ring[0], ring[0], ...ring.slice(1), ring[0]];
    expect(unwrap(measureFootprint({ type: 'Polygon', coordinates: [stuttered] })).vertexCount).toBe(8);
  });
});

describe('parseFootprint refusals', () => {
  it.each([
    ['not a polygon', { type: 'Point', coordinates: [0, 0] }, 'missing'],
    ['null', null, 'missing'],
    ['empty', { type: 'Polygon', coordinates: [] }, 'empty'],
    ['an empty ring', { type: 'Polygon', coordinates: [[]] }, 'empty'],
    ['two corners', polygon([[0, 0], [0.001, 0]]), 'degenerate-ring'],
    ['a straight line', polygon([[0, 0], [0.001, 0], [0.002, 0]]), 'degenerate-ring'],
    ['a hole', { type: 'Polygon', coordinates: [polygon([[0, 0], [1, 0], [1, 1]]).coordinates[0], polygon([[0.2, 0.2], [0.3, 0.2], [0.3, 0.3]]).coordinates[0]] }, 'holes-not-supported'],
    ['a NaN coordinate', polygon([[0, 0], [Number.NaN, 0], [0, 0.001]]), 'not-a-number'],
    ['a latitude past the pole', polygon([[0, 0], [0, 91], [1, 0]]), 'out-of-range'],
    ['a corner that is not a pair', { type: 'Polygon', coordinates: [[[0, 0], [1], [1, 1], [0, 0]]] }, 'not-a-number'],
  ])('refuses %s', (_label, input, code) => {
    const result = parseFootprint(input);
    expect(result.ok).toBe(false);
    expect(!result.ok && result.errors[0].code).toBe(code);
  });

  it('refuses a bow-tie and names the crossing edges', () => {
    const result = parseFootprint(polygon([[0, 0], [0.001, 0.001], [0.001, 0], [0, 0.001]]));
    expect(!result.ok && result.errors[0]).toMatchObject({ code: 'self-intersection', details: { edges: [0, 2] } });
    expect(!result.ok && result.errors[0].message).toContain('cross');
  });

  it('refuses a walk that doubles back along itself', () => {
    const result = parseFootprint(polygon([[0, 0], [0.002, 0], [0.001, 0], [0.001, 0.001]]));
    expect(!result.ok && result.errors[0].code).toBe('self-intersection');
  });

  it('refuses a ring that touches itself at a corner', () => {
    const result = parseFootprint(polygon([[0, 0], [0.002, 0], [0.001, 0.001], [0.002, 0.002], [0, 0.002], [0.001, 0.001]]));
    expect(!result.ok && result.errors[0].code).toBe('self-intersection');
  });
});

describe('distances', () => {
  it('matches GeographicLib for a geodesic distance', () => {
    // GeographicLib Karney 2013 via geographiclib-geodesic, WGS84 inverse problem
    const reference = Geodesic.WGS84.Inverse(-2.51, 29.12, -2.47, 29.2);
    expect(unwrap(geodesicDistanceM({ lon: 29.12, lat: -2.51 }, { lon: 29.2, lat: -2.47 }))).toBeCloseTo(reference.s12 as number, 3);
  });

  it('gives zero for the same point and refuses bad positions', () => {
    expect(unwrap(geodesicDistanceM({ lon: 1, lat: 1 }, { lon: 1, lat: 1 }))).toBe(0);
    const result = geodesicDistanceM({ lon: Number.NaN, lat: 0 }, { lon: 0, lat: 200 });
    expect(!result.ok && result.errors.map((error) => error.field)).toEqual(['from', 'to']);
  });

  it('says so when Vincenty cannot converge between near-antipodal points', () => {
    const result = geodesicDistanceM({ lon: 0, lat: 0 }, { lon: 179.7, lat: 0.1 });
    expect(!result.ok && result.errors[0].code).toBe('no-convergence');
  });

  it('measures from the footprint centroid to a processing point', () => {
    const half = 0.0002;
    const square = polygon([[10 - half, 5 - half], [10 + half, 5 - half], [10 + half, 5 + half], [10 - half, 5 + half]]);
    const reference = Geodesic.WGS84.Inverse(5, 10, 5.01, 10);
    expect(unwrap(centroidDistanceM(square, { lon: 10, lat: 5.01 }))).toBeCloseTo(reference.s12 as number, 2);
    expect(centroidDistanceM({ type: 'Polygon', coordinates: [] }, { lon: 0, lat: 0 }).ok).toBe(false);
  });
});
