import fc from 'fast-check';
import interpolate from '@turf/interpolate';
import { featureCollection, point } from '@turf/helpers';
import { HeatmapSample, cellCentre, idwAtPoints, idwGrid } from './heatmap';
import { unwrap } from './result';

const BOX = { west: 30, south: -2, east: 30.002, north: -1.998 };

describe('idwGrid by Shepard on a hand-checkable grid', () => {
  it('weights two samples by inverse squared distance', () => {
    // Shepard 1968: z* = Σ wᵢzᵢ / Σ wᵢ, wᵢ = 1/dᵢ²; a cell 1 part from A and 3 parts from B on a
    // meridian gives (9·zA + 1·zB)/10 (distances along one meridian are proportional to Δlat)
    const samples = [
      { lon: 30, lat: 0, value: 10 },
      { lon: 30, lat: 0.004, value: 20 },
    ];
    const grid = unwrap(idwGrid(samples, { west: 29.9995, east: 30.0005, south: 0.0005, north: 0.0015, columns: 1, rows: 1 }, { searchRadiusM: 'unlimited', maxNeighbours: 'all' }));
    expect(grid.values[0]).toBeCloseTo((9 * 10 + 1 * 20) / 10, 9);
  });

  it('gives the plain mean with power 0', () => {
    // Shepard 1968: p = 0 weights every sample equally
    const samples = [
      { lon: 30, lat: -2, value: 1 },
      { lon: 30.001, lat: -2, value: 2 },
      { lon: 30.002, lat: -1.999, value: 6 },
    ];
    const grid = unwrap(idwGrid(samples, { ...BOX, columns: 3, rows: 3 }, { power: 0, searchRadiusM: 'unlimited', maxNeighbours: 'all' }));
    expect([...grid.values].every((cell) => Math.abs(cell - 3) < 1e-12)).toBe(true);
  });

  it('returns the sample exactly at its own location', () => {
    // Shepard 1968: the interpolant passes through the data
    const samples = [
      { lon: 30.0005, lat: -1.9995, value: 7 },
      { lon: 30.0015, lat: -1.9985, value: 3 },
    ];
    const grid = unwrap(idwGrid(samples, { ...BOX, columns: 2, rows: 2 }, { searchRadiusM: 'unlimited', maxNeighbours: 'all' }));
    // Row 0 is north: cell 1 is the north-east cell, cell 2 the south-west one.
    expect(cellCentre({ ...BOX, columns: 2, rows: 2 }, 1).lat).toBeCloseTo(-1.9985, 12);
    expect(grid.values[1]).toBeCloseTo(3, 6);
    expect(grid.values[2]).toBeCloseTo(7, 6);
    expect(unwrap(idwAtPoints(samples, [samples[0], samples[1]], { searchRadiusM: 'unlimited', maxNeighbours: 'all' }))).toEqual([7, 3]);
  });

  it('uses Shepard exactly when a cell centre sits on a sample', () => {
    const grid = { west: 0, south: 0, east: 0.002, north: 0.002, columns: 2, rows: 2 };
    const samples = [
      { ...cellCentre(grid, 3), value: 5 },
      { lon: 0.0002, lat: 0.0019, value: 1 },
    ];
    expect(unwrap(idwGrid(samples, grid, { searchRadiusM: 'unlimited', maxNeighbours: 'all' })).values[3]).toBe(5);
    expect(unwrap(idwGrid(samples, grid, { searchRadiusM: 500, maxNeighbours: 4 })).values[3]).toBe(5);
  });

  it('agrees with @turf/interpolate (full IDW, power 2) to 1e-9', () => {
    // @turf/interpolate 7 with gridType 'point': the same Shepard weights over haversine distance
    const random = mulberry(5);
    const samples: HeatmapSample[] = Array.from({ length: 60 }, () => ({ lon: 30 + random() * 0.01, lat: -2 + random() * 0.01, value: random() * 5 }));
    const points = featureCollection(samples.map((sample) => point([sample.lon, sample.lat], { value: sample.value })));
    const turfGrid = interpolate(points, 0.1, { gridType: 'point', property: 'value', units: 'kilometers', weight: 2, bbox: [30, -2, 30.01, -1.99] });
    const turfPoints = turfGrid.features.map((feature) => ({ lon: feature.geometry.coordinates[0], lat: feature.geometry.coordinates[1], value: feature.properties?.['value'] as number }));
    const ours = unwrap(idwAtPoints(samples, turfPoints, { searchRadiusM: 'unlimited', maxNeighbours: 'all' }));
    const worst = Math.max(...turfPoints.map((cell, index) => Math.abs(ours[index] - cell.value) / Math.abs(cell.value)));
    expect(worst).toBeLessThan(1e-9);
  });
});

function mulberry(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let mixed = Math.imul(state ^ (state >>> 15), state | 1);
    mixed ^= mixed + Math.imul(mixed ^ (mixed >>> 7), mixed | 61);
    return ((mixed ^ (mixed >>> 14)) >>> 0) / 4294967296;
  };
}

const sampleArbitrary = fc.record({
  lon: fc.double({ min: 30, max: 30.002, noNaN: true }),
  lat: fc.double({ min: -2, max: -1.998, noNaN: true }),
  value: fc.double({ min: -50, max: 50, noNaN: true }),
});

describe('idwGrid invariants', () => {
  it('stays within the min and max of the data, in every mode', () => {
    fc.assert(
      fc.property(fc.array(sampleArbitrary, { minLength: 1, maxLength: 30 }), fc.constantFrom<['unlimited' | number, 'all' | number]>(['unlimited', 'all'], [80, 5], [300, 'all'], ['unlimited', 3]), (samples, [searchRadiusM, maxNeighbours]) => {
        const grid = unwrap(idwGrid(samples, { ...BOX, columns: 9, rows: 7 }, { searchRadiusM, maxNeighbours }));
        const values = samples.map((sample) => sample.value);
        const [low, high] = [Math.min(...values), Math.max(...values)];
        grid.values.forEach((cell, index) => {
          if (grid.hasValue[index] === 1) {
            expect(cell).toBeGreaterThanOrEqual(low - 1e-9 * Math.abs(low));
            expect(cell).toBeLessThanOrEqual(high + 1e-9 * Math.abs(high));
          } else {
            expect(cell).toBeNaN();
          }
        });
      }),
      { numRuns: 60 },
    );
  });

  it('equals a sample at its own location', () => {
    fc.assert(
      fc.property(fc.array(sampleArbitrary, { minLength: 1, maxLength: 30 }), fc.nat(), (samples, pick) => {
        const chosen = samples[pick % samples.length];
        const twins = samples.filter((sample) => sample.lon === chosen.lon && sample.lat === chosen.lat);
        const [estimate] = unwrap(idwAtPoints(samples, [chosen], { searchRadiusM: 200, maxNeighbours: 8 }));
        expect(twins.map((twin) => twin.value)).toContain(estimate);
      }),
    );
  });

  it('shifts by a constant added to every value', () => {
    // Shepard 1968: the interpolant is invariant under a constant shift of the data
    fc.assert(
      fc.property(fc.array(sampleArbitrary, { minLength: 1, maxLength: 20 }), fc.double({ min: -100, max: 100, noNaN: true }), (samples, shift) => {
        const spec = { ...BOX, columns: 5, rows: 5 };
        const base = unwrap(idwGrid(samples, spec, { searchRadiusM: 'unlimited', maxNeighbours: 'all' }));
        const moved = unwrap(idwGrid(samples.map((sample) => ({ ...sample, value: sample.value + shift })), spec, { searchRadiusM: 'unlimited', maxNeighbours: 'all' }));
        base.values.forEach((cell, index) => expect(moved.values[index]).toBeCloseTo(cell + shift, 6));
      }),
      { numRuns: 40 },
    );
  });

  it('matches the spatial-index path with a brute-force search of the same radius and neighbours', () => {
    fc.assert(
      fc.property(fc.array(sampleArbitrary, { minLength: 1, maxLength: 40 }), fc.integer({ min: 30, max: 250 }), fc.integer({ min: 1, max: 10 }), (samples, radiusM, neighbours) => {
        const spec = { ...BOX, columns: 6, rows: 6 };
        const grid = unwrap(idwGrid(samples, spec, { searchRadiusM: radiusM, maxNeighbours: neighbours }));
        const centres = Array.from({ length: 36 }, (_, cell) => cellCentre(spec, cell));
        const brute = unwrap(idwAtPoints(samples, centres, { searchRadiusM: radiusM, maxNeighbours: neighbours }));
        brute.forEach((value, cell) => (Number.isNaN(value) ? expect(grid.values[cell]).toBeNaN() : expect(grid.values[cell]).toBeCloseTo(value, 8)));
      }),
      { numRuns: 60 },
    );
  });
});

describe('idwGrid geometry and defaults', () => {
  it('describes its cells and counts empty ones', () => {
    const samples = [{ lon: 30.0001, lat: -1.9999, value: 1 }];
    const grid = unwrap(idwGrid(samples, { ...BOX, columns: 4, rows: 2 }, { searchRadiusM: 60 }));
    expect(grid.cellWidthDeg).toBeCloseTo(0.0005, 15);
    expect(grid.cellHeightDeg).toBeCloseTo(0.001, 15);
    expect(grid.cellWidthM).toBeCloseTo(0.0005 * (Math.PI / 180) * 6371008.8 * Math.cos((-1.999 * Math.PI) / 180), 6);
    expect(grid.emptyCellCount).toBe(7);
    expect(grid.hasValue[4]).toBe(1);
  });

  it('chooses a radius from the sample spacing and 12 neighbours by default', () => {
    const random = mulberry(9);
    const samples = Array.from({ length: 200 }, () => ({ lon: 30 + random() * 0.002, lat: -2 + random() * 0.002, value: random() }));
    const grid = unwrap(idwGrid(samples, { ...BOX, columns: 10, rows: 10 }));
    expect(grid.maxNeighbours).toBe(12);
    expect(typeof grid.searchRadiusM).toBe('number');
    expect(grid.emptyCellCount).toBe(0);
  });

  it('uses the general weights for far-apart data and other powers', () => {
    const samples = [
      { lon: 10, lat: 10, value: 1 },
      { lon: 12, lat: 11, value: 3 },
    ];
    const far = unwrap(idwGrid(samples, { west: 9, south: 9, east: 13, north: 12, columns: 3, rows: 3 }, { searchRadiusM: 'unlimited', maxNeighbours: 'all' }));
    const brute = unwrap(idwAtPoints(samples, Array.from({ length: 9 }, (_, cell) => cellCentre({ west: 9, south: 9, east: 13, north: 12, columns: 3, rows: 3 }, cell)), { searchRadiusM: 'unlimited', maxNeighbours: 'all' }));
    far.values.forEach((cell, index) => expect(cell).toBeCloseTo(brute[index], 10));
    const cubed = unwrap(idwGrid(samples, { west: 9, south: 9, east: 13, north: 12, columns: 3, rows: 3 }, { power: 3, searchRadiusM: 'unlimited', maxNeighbours: 'all' }));
    expect(cubed.values[4]).not.toBeCloseTo(far.values[4], 6);
  });

  it.each([
    ['no samples', [], { ...BOX, columns: 2, rows: 2 }, {}, 'empty'],
    ['a NaN value', [{ lon: 30, lat: -2, value: Number.NaN }], { ...BOX, columns: 2, rows: 2 }, {}, 'not-a-number'],
    ['a box crossing itself', [{ lon: 30, lat: -2, value: 1 }], { ...BOX, west: 31, columns: 2, rows: 2 }, {}, 'out-of-range'],
    ['zero columns', [{ lon: 30, lat: -2, value: 1 }], { ...BOX, columns: 0, rows: 2 }, {}, 'out-of-range'],
    ['a negative power', [{ lon: 30, lat: -2, value: 1 }], { ...BOX, columns: 2, rows: 2 }, { power: -1 }, 'negative'],
    ['a zero radius', [{ lon: 30, lat: -2, value: 1 }], { ...BOX, columns: 2, rows: 2 }, { searchRadiusM: 0 }, 'not-positive'],
    ['part neighbours', [{ lon: 30, lat: -2, value: 1 }], { ...BOX, columns: 2, rows: 2 }, { maxNeighbours: 1.5 }, 'out-of-range'],
    ['a NaN grid edge', [{ lon: 30, lat: -2, value: 1 }], { ...BOX, north: Number.NaN, columns: 2, rows: 2 }, {}, 'not-a-number'],
  ])('refuses %s', (_label, samples, grid, options, code) => {
    const result = idwGrid(samples as HeatmapSample[], grid, options);
    expect(!result.ok && result.errors[0].code).toBe(code);
  });

  it('refuses a query point that is not a number', () => {
    expect(idwAtPoints([{ lon: 30, lat: -2, value: 1 }], [{ lon: Number.NaN, lat: 0 }]).ok).toBe(false);
  });
});
