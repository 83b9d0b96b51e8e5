/**
 * Heat map: the engine's inverse-distance-weighted grid against @turf/interpolate on the same points.
 * 1. Like with like: full IDW (every sample weighted, power 2) over the same grid points, both grids
 *    checked to agree to 1e-9 relative. Turf is slow (about 400 million distance calls at full size),
 *    so at full size it runs on a band of rows and its time is scaled up to the whole grid; the output
 *    says so, and agreement is checked on every cell turf computed.
 * 2. The engine's default (search radius from the sample spacing, 12 nearest through its kdbush
 *    k-d tree) on the full grid, reported beside it.
 * Data are invented: seeded random points over a square kilometre with lognormal grades.
 */
import interpolate from '@turf/interpolate';
import { featureCollection, point } from '@turf/helpers';
import { BENCH_SIZE, medianMs, reportFigure, timeIt } from './report';
import { GridSpec, HeatmapSample, idwGrid, seededRandom, unwrap } from '../shared/engine';

const isFull = BENCH_SIZE === 'full';
const SAMPLE_COUNT = isFull ? 10_000 : 2_000;
const GRID_SIDE = isFull ? 200 : 60;
// Turf computes this many rows of the grid (all of them in the smoke run).
const TURF_ROWS = isFull ? 20 : GRID_SIDE;
const SPAN_DEG = 0.01;
const WEST = 30.05;
const SOUTH = -1.96;

function makeSamples(count: number): HeatmapSample[] {
  const random = seededRandom(42);
  const samples: HeatmapSample[] = [];
  for (let index = 0; index < count; index += 1) {
    // Lognormal grade, median 0.8 g/t, by Box–Muller.
    const normal = Math.sqrt(-2 * Math.log(1 - random())) * Math.cos(2 * Math.PI * random());
    samples.push({ lon: WEST + random() * SPAN_DEG, lat: SOUTH + random() * SPAN_DEG, value: 0.8 * Math.exp(0.9 * normal) });
  }
  return samples;
}

async function main(): Promise<void> {
  const samples = makeSamples(SAMPLE_COUNT);
  const grid: GridSpec = { west: WEST, south: SOUTH, east: WEST + SPAN_DEG, north: SOUTH + SPAN_DEG, columns: GRID_SIDE, rows: GRID_SIDE };
  const fullOptions = { power: 2, searchRadiusM: 'unlimited', maxNeighbours: 'all' } as const;

  // Turf on a band of rows: its own point grid, GRID_SIDE columns across the same box.
  const cellDeg = SPAN_DEG / GRID_SIDE;
  const turfBox: [number, number, number, number] = [WEST, SOUTH, WEST + SPAN_DEG, SOUTH + TURF_ROWS * cellDeg];
  const points = featureCollection(samples.map((sample) => point([sample.lon, sample.lat], { value: sample.value })));
  const cellSideKm = (SPAN_DEG / GRID_SIDE) * (Math.PI / 180) * 6371.0088 * Math.cos((SOUTH * Math.PI) / 180);
  const turfRun = await timeIt(() => interpolate(points, cellSideKm, { gridType: 'point', property: 'value', units: 'kilometers', weight: 2, bbox: turfBox }));
  const turfCells = turfRun.result.features.length;
  const turfMsWholeGrid = turfRun.ms * ((GRID_SIDE * GRID_SIDE) / turfCells);

  // The engine on exactly turf's grid points, for the agreement check.
  const xs = [...new Set(turfRun.result.features.map((feature) => feature.geometry.coordinates[0]))].sort((a, b) => a - b);
  const ys = [...new Set(turfRun.result.features.map((feature) => feature.geometry.coordinates[1]))].sort((a, b) => a - b);
  const dx = (xs[xs.length - 1] - xs[0]) / (xs.length - 1);
  const dy = (ys[ys.length - 1] - ys[0]) / (ys.length - 1);
  const matching: GridSpec = { west: xs[0] - dx / 2, east: xs[xs.length - 1] + dx / 2, south: ys[0] - dy / 2, north: ys[ys.length - 1] + dy / 2, columns: xs.length, rows: ys.length };
  const engineOnTurfGrid = unwrap(idwGrid(samples, matching, fullOptions));
  let worstRelative = 0;
  for (const feature of turfRun.result.features) {
    const [lon, lat] = feature.geometry.coordinates;
    const column = xs.indexOf(lon);
    const row = ys.length - 1 - ys.indexOf(lat);
    const turfValue = feature.properties?.['value'] as number;
    const ours = engineOnTurfGrid.values[row * matching.columns + column];
    worstRelative = Math.max(worstRelative, Math.abs(ours - turfValue) / Math.abs(turfValue));
  }
  if (!(worstRelative < 1e-9)) {
    throw new Error(`engine and turf disagree: worst relative difference ${worstRelative}`);
  }

  const runs = isFull ? 3 : 5;
  const engineFullMs = await medianMs(runs, () => unwrap(idwGrid(samples, grid, fullOptions)));
  const engineDefaultMs = await medianMs(isFull ? 9 : 15, () => unwrap(idwGrid(samples, grid)));
  const defaultGrid = unwrap(idwGrid(samples, grid));

  const scaledNote = turfCells < GRID_SIDE * GRID_SIDE ? `turf measured on ${turfCells} cells (${TURF_ROWS} rows) in ${turfRun.ms.toFixed(0)} ms and scaled to ${GRID_SIDE * GRID_SIDE}; ` : '';
  const label = `${SAMPLE_COUNT.toLocaleString('en')} points, ${GRID_SIDE}x${GRID_SIDE} grid`;
  process.stdout.write(
    `full IDW: engine ${engineFullMs.toFixed(1)} ms, turf ${turfMsWholeGrid.toFixed(0)} ms (${(turfMsWholeGrid / engineFullMs).toFixed(0)}x); ` +
      `${scaledNote}worst relative difference ${worstRelative.toExponential(2)} on ${turfCells} cells\n`,
  );
  process.stdout.write(
    `engine default: ${engineDefaultMs.toFixed(1)} ms (radius ${(defaultGrid.searchRadiusM as number).toFixed(1)} m, ${defaultGrid.maxNeighbours} nearest, ${defaultGrid.emptyCellCount} empty cells)\n`,
  );
  reportFigure({
    group: 'heatmap',
    name: `full IDW power 2, ${label}`,
    value: engineFullMs,
    unit: 'ms',
    baselineName: '@turf/interpolate',
    baselineValue: turfMsWholeGrid,
    higherIsBetter: false,
    goal: '>= 100x faster',
    note: `${scaledNote}grids agree to ${worstRelative.toExponential(2)} relative`,
  });
  reportFigure({
    group: 'heatmap',
    name: `engine default (radius + 12 nearest, k-d tree), ${label}`,
    value: engineDefaultMs,
    unit: 'ms',
    baselineName: '@turf/interpolate',
    baselineValue: turfMsWholeGrid,
    higherIsBetter: false,
    goal: '< 50 ms (full size)',
    note: `radius ${(defaultGrid.searchRadiusM as number).toFixed(1)} m`,
  });
}

main().catch((error: unknown) => {
  process.stderr.write(`${error instanceof Error ? error.stack : String(error)}\n`);
  process.exit(1);
});
