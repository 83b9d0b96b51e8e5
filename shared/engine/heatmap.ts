/**
 * Inverse-distance-weighted grade grid (Shepard 1968): z* = Σ wᵢzᵢ / Σ wᵢ with wᵢ = 1/dᵢᵖ, and z* = zᵢ
 * exactly where a cell centre sits on a sample. Distance is great-circle on the sphere of mean
 * radius (haversine, as @turf/distance computes it), so the full form matches @turf/interpolate.
 *
 * Speed, for 10,000 samples on a 200×200 grid in a browser worker: coordinate differences are taken
 * in degrees first (exact for nearby points, as turf does), and sin² of half the difference and asin²
 * of the haversine are short series while every distance is under about 60 km, so a sample–cell
 * pair costs a few multiplications and no trigonometry. The full form (every sample, power 2) splits
 * the haversine into a per-row and a per-column term and shares one division among four cells (see
 * fillFullPower2). With a search radius, the samples go into a k-d tree (kdbush); one box query
 * serves a block of cells, and each cell keeps the `maxNeighbours` nearest of the samples within
 * the radius.
 *
 * The grid is row-major with row 0 at the north edge (as an image is drawn); a cell with no
 * sample within the radius has no value: `hasValue` is 0 there and `values` holds NaN, the raster
 * convention for no data. Grids that cross the antimeridian are refused.
 */
import KDBush from 'kdbush';
import { EngineError, Result, checkNumber, engineError, fail, ok } from './result';

/** A sample for the heat map: position (degrees) and value (e.g. grade g/t). */
export interface HeatmapSample {
  readonly lon: number;
  readonly lat: number;
  readonly value: number;
}

/** The grid to fill: a lon/lat box cut into columns × rows equal cells. */
export interface GridSpec {
  readonly west: number;
  readonly south: number;
  readonly east: number;
  readonly north: number;
  readonly columns: number;
  readonly rows: number;
}

/** How samples are weighted. */
export interface IdwOptions {
  /** Power of the inverse distance; default 2 (Shepard 1968). */
  readonly power?: number;
  /** Only samples within this distance count, m; 'unlimited' weights every sample. */
  readonly searchRadiusM?: number | 'unlimited';
  /** Only this many nearest samples count; 'all' weights every sample in the radius. Default 12. */
  readonly maxNeighbours?: number | 'all';
}

/** A filled grid and its geometry. */
export interface HeatmapGrid {
  readonly values: Float64Array;
  readonly hasValue: Uint8Array;
  readonly columns: number;
  readonly rows: number;
  readonly west: number;
  readonly south: number;
  readonly east: number;
  readonly north: number;
  readonly cellWidthDeg: number;
  readonly cellHeightDeg: number;
  /** Cell size at the grid's middle latitude, m. */
  readonly cellWidthM: number;
  readonly cellHeightM: number;
  readonly power: number;
  readonly searchRadiusM: number | 'unlimited';
  readonly maxNeighbours: number | 'all';
  readonly minValue: number;
  readonly maxValue: number;
  readonly emptyCellCount: number;
}

/** Mean earth radius in metres, the radius @turf/distance uses. */
export const EARTH_RADIUS_M = 6371008.8;
/** Nearest samples used by default (common practice, no source: 8–16 is usual for IDW). */
export const DEFAULT_MAX_NEIGHBOURS = 12;
/** Default search radius as a multiple of the mean sample spacing √(area / n) (common practice, no source). */
export const DEFAULT_RADIUS_SPACINGS = 3;
// Largest grid this module fills (4096 × 4096 cells): beyond that a browser tab runs out of memory.
const MAX_GRID_SIDE = 4096;

const DEG = Math.PI / 180;
const HALF_DEG = DEG / 2;
const THIRD = 1 / 3;
const EIGHT_45THS = 8 / 45;
const FOUR_35THS = 4 / 35;
// asin²(√h) by its series up to h⁴ is exact to 1e-17 relative for h < 1e-4 (about 127 km).
const SERIES_LIMIT_H = 1e-4;

// Below this haversine h (a distance of about 18 km) and half-angle, the series sin²x ≈ x²(1 − x²/3) and
// asin²√h ≈ h(1 + h/3) are exact to 1e-12 relative: the site-scale fast path may use them.
const SITE_SCALE_H = 2e-6;
const SITE_SCALE_HALF_ANGLE = 1.4e-3;

// sin²(x) by its series up to x⁸ is exact to 1e-19 relative for |x| < 1e-2.
const SIN_SERIES_LIMIT = 1e-2;
const S1 = 1 / 3;
const S2 = 2 / 45;
const S3 = 1 / 315;

/** sin²(Δ/2) of an angle difference Δ in radians, accurate for tiny Δ. */
function sinSquaredHalf(deltaRad: number): number {
  const x = deltaRad / 2;
  if (Math.abs(x) < SIN_SERIES_LIMIT) {
    const x2 = x * x;
    return x2 * (1 - x2 * (S1 - x2 * (S2 - x2 * S3)));
  }
  const sine = Math.sin(x);
  return sine * sine;
}

function asinSquared(h: number): number {
  if (h < SERIES_LIMIT_H) {
    return h * (1 + h * (THIRD + h * (EIGHT_45THS + h * FOUR_35THS)));
  }
  const angle = Math.asin(Math.sqrt(Math.min(1, h)));
  return angle * angle;
}

interface Prepared {
  readonly count: number;
  readonly lonDeg: Float64Array;
  readonly latDeg: Float64Array;
  readonly cosLat: Float64Array;
  readonly value: Float64Array;
}

function prepare(lons: ArrayLike<number>, lats: ArrayLike<number>, values: ArrayLike<number>): Prepared {
  const count = lons.length;
  const prepared: Prepared = {
    count,
    lonDeg: Float64Array.from(lons),
    latDeg: Float64Array.from(lats),
    cosLat: new Float64Array(count),
    value: Float64Array.from(values),
  };
  for (let index = 0; index < count; index += 1) {
    prepared.cosLat[index] = Math.cos(lats[index] * DEG);
  }
  return prepared;
}

/** Haversine h between a point and a sample (cos φ of each given). */
function haversineH(lonDeg: number, latDeg: number, cosLat: number, sampleLonDeg: number, sampleLatDeg: number, sampleCosLat: number): number {
  return sinSquaredHalf((latDeg - sampleLatDeg) * DEG) + cosLat * sampleCosLat * sinSquaredHalf((lonDeg - sampleLonDeg) * DEG);
}

/** Haversine h of the largest distance between two points of a lon/lat box. */
function boxDiagonalH(west: number, south: number, east: number, north: number): number {
  const halfDeltaLat = ((north - south) * DEG) / 2;
  const halfDeltaLon = ((east - west) * DEG) / 2;
  // cos φ₁·cos φ₂ ≤ 1, so this bounds h of every pair in the box from above.
  return Math.sin(halfDeltaLat) ** 2 + Math.sin(halfDeltaLon) ** 2;
}

function validate(samples: readonly HeatmapSample[], grid: GridSpec, options: IdwOptions): EngineError[] {
  const errors: EngineError[] = [];
  if (!Array.isArray(samples) || samples.length === 0) {
    errors.push(engineError('empty', 'samples', 'there are no samples to interpolate'));
  } else {
    for (let index = 0; index < samples.length; index += 1) {
      const sample = samples[index];
      for (const field of ['lon', 'lat', 'value'] as const) {
        const invalid = checkNumber(`samples[${index}].${field}`, sample?.[field]);
        if (invalid) {
          errors.push(invalid);
        }
      }
      // Stop at a handful: ten thousand identical messages help no one.
      if (errors.length >= 5) break;
    }
  }
  for (const field of ['west', 'south', 'east', 'north'] as const) {
    const invalid = checkNumber(field, grid?.[field]);
    if (invalid) errors.push(invalid);
  }
  if (errors.length === 0 && (grid.west >= grid.east || grid.south >= grid.north || grid.west < -180 || grid.east > 180 || grid.south < -90 || grid.north > 90)) {
    errors.push(engineError('out-of-range', 'grid', 'the grid box needs west < east and south < north within −180…180, −90…90 (no antimeridian crossing)'));
  }
  for (const field of ['columns', 'rows'] as const) {
    const side = grid?.[field];
    if (typeof side !== 'number' || !Number.isInteger(side) || side < 1 || side > MAX_GRID_SIDE) {
      errors.push(engineError('out-of-range', field, `${field} must be a whole number from 1 to ${MAX_GRID_SIDE} (got ${String(side)})`));
    }
  }
  const power = options.power ?? 2;
  const powerInvalid = checkNumber('power', power, 'non-negative');
  if (powerInvalid) errors.push(powerInvalid);
  if (options.searchRadiusM !== undefined && options.searchRadiusM !== 'unlimited') {
    const invalid = checkNumber('searchRadiusM', options.searchRadiusM, 'positive');
    if (invalid) errors.push(invalid);
  }
  const neighbours = options.maxNeighbours;
  if (neighbours !== undefined && neighbours !== 'all' && (!Number.isInteger(neighbours) || neighbours < 1)) {
    errors.push(engineError('out-of-range', 'maxNeighbours', `maxNeighbours must be a whole number of at least 1 or 'all' (got ${String(neighbours)})`));
  }
  return errors;
}

function defaultRadiusM(samples: readonly HeatmapSample[]): number {
  let west = Infinity;
  let east = -Infinity;
  let south = Infinity;
  let north = -Infinity;
  for (const { lon, lat } of samples) {
    west = Math.min(west, lon);
    east = Math.max(east, lon);
    south = Math.min(south, lat);
    north = Math.max(north, lat);
  }
  const widthM = (east - west) * DEG * EARTH_RADIUS_M * Math.cos(((south + north) / 2) * DEG);
  const heightM = (north - south) * DEG * EARTH_RADIUS_M;
  const spacingM = Math.sqrt((widthM * heightM) / samples.length) || Math.max(widthM, heightM) / samples.length;
  // At least a metre, so that samples all in one spot still have a radius.
  return Math.max(1, DEFAULT_RADIUS_SPACINGS * spacingM);
}

interface CellAxis {
  readonly deg: Float64Array;
  readonly cos: Float64Array;
}

function cellAxis(start: number, step: number, count: number): CellAxis {
  const axis = { deg: new Float64Array(count), cos: new Float64Array(count) };
  for (let index = 0; index < count; index += 1) {
    axis.deg[index] = start + (index + 0.5) * step;
    axis.cos[index] = Math.cos(axis.deg[index] * DEG);
  }
  return axis;
}

// Samples per tile of the full-IDW loop: the tile's longitude terms for every column (columns × 64
// doubles, 100 kB at 200 columns) stay in the core's cache while every row is filled.
const FULL_TILE_SAMPLES = 64;

/**
 * Every sample weighted, power 2, a site-sized extent: the tight loop. With h = A + cos φ_cell·cos φᵢ·t,
 * where A = sin²(Δφ/2) and t = sin²(Δλ/2), the weight 1/asin²(√h) is 1/h − 1/3 − h/15 − …, and h/15 is
 * below 3e-13 of 1/h at site scale (see SITE_SCALE_H). So a cell needs only Σ 1/h and Σ zᵢ/h, the
 * constants −1/3 being added once at the end; and as h / cos φ_cell = A / cos φ_cell + cos φᵢ·t, the
 * row's factor cos φ_cell cancels in the ratio too. The two terms are computed once per tile of samples
 * (per row and per column), so a sample–cell pair costs two additions, a share of one division (four
 * cells of a row share it: 1/a = bcd/(abcd) and so on) and one multiply-add.
 */
function fillFullPower2(prepared: Prepared, lat: CellAxis, lon: CellAxis, columns: number, rows: number, values: Float64Array): void {
  const { count, lonDeg, latDeg, cosLat, value } = prepared;
  // Columns padded to a multiple of four with copies of the last one, so that every block is whole.
  const blocks = Math.ceil(columns / 4);
  const paddedColumns = blocks * 4;
  const inverseSums = new Float64Array(rows * paddedColumns);
  const weightedSums = new Float64Array(rows * paddedColumns);
  // lonTerms[(block·size + i)·4 + j] = cos φᵢ·t for column 4·block + j and the tile's sample i.
  const lonTerms = new Float64Array(paddedColumns * FULL_TILE_SAMPLES);
  const latTerms = new Float64Array(FULL_TILE_SAMPLES);
  let valueSum = 0;
  for (let i = 0; i < count; i += 1) {
    valueSum += value[i];
  }
  for (let first = 0; first < count; first += FULL_TILE_SAMPLES) {
    const size = Math.min(FULL_TILE_SAMPLES, count - first);
    for (let i = 0; i < size; i += 1) {
      const li = lonDeg[first + i];
      const ci = cosLat[first + i];
      for (let column = 0; column < paddedColumns; column += 1) {
        const x = (lon.deg[Math.min(column, columns - 1)] - li) * HALF_DEG;
        const x2 = x * x;
        lonTerms[((column >> 2) * size + i) * 4 + (column & 3)] = ci * x2 * (1 - x2 * S1);
      }
    }
    for (let row = 0; row < rows; row += 1) {
      const cellLat = lat.deg[row];
      const rowScale = 1 / lat.cos[row];
      for (let i = 0; i < size; i += 1) {
        const y = (cellLat - latDeg[first + i]) * HALF_DEG;
        const y2 = y * y;
        latTerms[i] = y2 * (1 - y2 * S1) * rowScale;
      }
      const tileValues = value.subarray(first, first + size);
      for (let block = 0; block < blocks; block += 1) {
        let w0 = 0, w1 = 0, w2 = 0, w3 = 0, z0 = 0, z1 = 0, z2 = 0, z3 = 0;
        let at = block * size * 4;
        for (let i = 0; i < size; i += 1, at += 4) {
          const a = latTerms[i];
          const h0 = a + lonTerms[at];
          const h1 = a + lonTerms[at + 1];
          const h2 = a + lonTerms[at + 2];
          const h3 = a + lonTerms[at + 3];
          const h01 = h0 * h1;
          const h23 = h2 * h3;
          const inverse = 1 / (h01 * h23);
          const e23 = inverse * h23;
          const e01 = inverse * h01;
          const u0 = e23 * h1, u1 = e23 * h0, u2 = e01 * h3, u3 = e01 * h2;
          const z = tileValues[i];
          w0 += u0; w1 += u1; w2 += u2; w3 += u3;
          z0 += z * u0; z1 += z * u1; z2 += z * u2; z3 += z * u3;
        }
        const base = row * paddedColumns + block * 4;
        inverseSums[base] += w0; inverseSums[base + 1] += w1; inverseSums[base + 2] += w2; inverseSums[base + 3] += w3;
        weightedSums[base] += z0; weightedSums[base + 1] += z1; weightedSums[base + 2] += z2; weightedSums[base + 3] += z3;
      }
    }
  }
  for (let row = 0; row < rows; row += 1) {
    // The sums hold cos φ_cell/h; the −1/3 of each weight is scaled to match.
    const cl = lat.cos[row];
    for (let column = 0; column < columns; column += 1) {
      const at = row * paddedColumns + column;
      values[row * columns + column] = (weightedSums[at] - (cl * valueSum) / 3) / (inverseSums[at] - (cl * count) / 3);
    }
  }
}

// Points per leaf of the k-d tree: half kdbush's default of 64 was a little faster for queries that
// hold a few dozen samples (measured at 10,000 samples; 8 to 64 are within the noise of each other).
const INDEX_NODE_SIZE = 32;
// Cells per side of a block that shares one index query: 4 × 4 cells cost one query where one per cell
// spent more time in the tree than in the weights, and larger blocks give each cell more candidates.
const NEIGHBOUR_BLOCK_SIDE = 4;
// Distance rings the block's candidates are ordered by (see fillNeighbours).
const RING_COUNT = 8;

/** Haversine h of a search radius: a sample is within the radius when its h is at most this. */
function radiusHaversine(radiusM: number | 'unlimited'): number {
  const angle = radiusM === 'unlimited' ? Infinity : radiusM / EARTH_RADIUS_M;
  return angle >= Math.PI ? Infinity : Math.sin(angle / 2) ** 2;
}

/** A k-d tree of the samples (lon, lat in degrees) and how far around a cell centre to look. */
interface NeighbourIndex {
  readonly tree: KDBush;
  readonly lonReachDeg: number;
  readonly latReachDeg: number;
}

/**
 * The index for a search radius, or undefined when every sample must be looked at (no radius, or a
 * circle round some cell centre that reaches a pole). A point within angular distance ρ of a centre at
 * latitude φ differs from it by at most ρ in latitude and asin(sin ρ / cos φ) in longitude (the bounding
 * box of a spherical cap), so the box query misses no sample; the exact test on h then decides.
 */
function buildIndex(lons: Float64Array, lats: Float64Array, radiusM: number | 'unlimited', maxAbsCellLatDeg: number): NeighbourIndex | undefined {
  if (radiusM === 'unlimited') {
    return undefined;
  }
  const angle = radiusM / EARTH_RADIUS_M;
  const maxAbsCellLat = maxAbsCellLatDeg * DEG;
  if (angle >= Math.PI / 2 - maxAbsCellLat) {
    return undefined;
  }
  const tree = new KDBush(lons.length, INDEX_NODE_SIZE);
  for (let index = 0; index < lons.length; index += 1) {
    tree.add(lons[index], lats[index]);
  }
  tree.finish();
  // 1e-9: a margin for rounding in degrees, far below any distance that matters.
  return {
    tree,
    latReachDeg: (angle / DEG) * (1 + 1e-9),
    lonReachDeg: (Math.asin(Math.sin(angle) / Math.cos(maxAbsCellLat)) / DEG) * (1 + 1e-9),
  };
}

interface NeighbourFill {
  readonly isSiteScale: boolean;
  readonly power: number;
  readonly radiusH: number;
  readonly maxNeighbours: number;
}

function fillNeighbours(
  prepared: Prepared,
  index: NeighbourIndex | undefined,
  grid: GridSpec,
  lat: CellAxis,
  lon: CellAxis,
  fill: NeighbourFill,
  values: Float64Array,
  hasValue: Uint8Array,
): void {
  const { count } = prepared;
  const { isSiteScale, radiusH } = fill;
  const limit = fill.maxNeighbours;
  const isLimited = Number.isFinite(limit);
  const nearH = new Float64Array(isLimited ? limit : 0);
  const nearZ = new Float64Array(isLimited ? limit : 0);
  const nearIndex = new Int32Array(isLimited ? limit : 0);
  const halfPower = fill.power / 2;
  // The block's candidates, copied next to each other so that every cell of the block reads them in order.
  const candidateIndex = new Int32Array(count);
  const candidateLon = new Float64Array(count);
  const candidateLat = new Float64Array(count);
  const candidateCos = new Float64Array(count);
  const candidateValue = new Float64Array(count);
  const ringOf = new Uint8Array(count);
  const ringStart = new Int32Array(RING_COUNT + 1);
  // Copies the block's candidates in rings of growing distance from the block's middle (equal-area
  // rings by squared distance in the lon·cos φ, lat plane), so that each cell meets its nearest early
  // and the short list of nearest takes few insertions. The order changes no result.
  const gather = (ids: readonly number[] | undefined, middleLon: number, middleLat: number, lonScale: number, reachSquared: number): number => {
    const gathered = ids ? ids.length : count;
    ringStart.fill(0);
    for (let k = 0; k < gathered; k += 1) {
      const i = ids ? ids[k] : k;
      const dx = (prepared.lonDeg[i] - middleLon) * lonScale;
      const dy = prepared.latDeg[i] - middleLat;
      const ring = Math.min(RING_COUNT - 1, Math.floor(((dx * dx + dy * dy) / reachSquared) * RING_COUNT));
      ringOf[k] = ring;
      ringStart[ring + 1] += 1;
    }
    for (let ring = 0; ring < RING_COUNT; ring += 1) {
      ringStart[ring + 1] += ringStart[ring];
    }
    for (let k = 0; k < gathered; k += 1) {
      const i = ids ? ids[k] : k;
      const slot = ringStart[ringOf[k]]++;
      candidateIndex[slot] = i;
      candidateLon[slot] = prepared.lonDeg[i];
      candidateLat[slot] = prepared.latDeg[i];
      candidateCos[slot] = prepared.cosLat[i];
      candidateValue[slot] = prepared.value[i];
    }
    return gathered;
  };
  let candidateCount = index ? 0 : gather(undefined, 0, 0, 0, Infinity);
  for (let blockRow = 0; blockRow < grid.rows; blockRow += NEIGHBOUR_BLOCK_SIDE) {
    const lastRow = Math.min(grid.rows, blockRow + NEIGHBOUR_BLOCK_SIDE) - 1;
    for (let blockColumn = 0; blockColumn < grid.columns; blockColumn += NEIGHBOUR_BLOCK_SIDE) {
      const lastColumn = Math.min(grid.columns, blockColumn + NEIGHBOUR_BLOCK_SIDE) - 1;
      if (index) {
        // Rows run north to south and columns west to east: the box round every centre of the block.
        const west = lon.deg[blockColumn] - index.lonReachDeg;
        const east = lon.deg[lastColumn] + index.lonReachDeg;
        const south = lat.deg[lastRow] - index.latReachDeg;
        const north = lat.deg[blockRow] + index.latReachDeg;
        const lonScale = index.latReachDeg / index.lonReachDeg;
        const halfHeight = (north - south) / 2;
        candidateCount = gather(index.tree.range(west, south, east, north), (west + east) / 2, (south + north) / 2, lonScale, 2 * halfHeight * halfHeight);
      }
      for (let row = blockRow; row <= lastRow; row += 1) {
        const cl = lat.cos[row];
        const cellLat = lat.deg[row];
        for (let column = blockColumn; column <= lastColumn; column += 1) {
          const cellLon = lon.deg[column];
          let found = 0;
          let weightSum = 0;
          let weightedSum = 0;
          // The first sample (in input order) on the cell centre, as idwAtPoints picks it.
          let exactIndex = count;
          let exactValue = NaN;
          for (let k = 0; k < candidateCount; k += 1) {
            let h: number;
            if (isSiteScale) {
              const dy = (cellLat - candidateLat[k]) * HALF_DEG;
              const dy2 = dy * dy;
              const dx = (cellLon - candidateLon[k]) * HALF_DEG;
              const dx2 = dx * dx;
              h = dy2 * (1 - dy2 * S1) + cl * candidateCos[k] * dx2 * (1 - dx2 * S1);
            } else {
              h = haversineH(cellLon, cellLat, cl, candidateLon[k], candidateLat[k], candidateCos[k]);
            }
            if (h > radiusH) continue;
            const i = candidateIndex[k];
            if (h === 0 && i < exactIndex) {
              exactIndex = i;
              exactValue = candidateValue[k];
            }
            if (!isLimited) {
              const weight = halfPower === 1 ? 1 / asinSquared(h) : Math.pow(asinSquared(h), -halfPower);
              weightSum += weight;
              weightedSum += weight * candidateValue[k];
              found += 1;
              continue;
            }
            // Nearer first, and of two at the same distance the earlier sample, as a stable sort orders them.
            if (found === limit && (h > nearH[limit - 1] || (h === nearH[limit - 1] && i > nearIndex[limit - 1]))) continue;
            // Insertion into the short sorted list of the nearest so far.
            let slot = found < limit ? found : limit - 1;
            while (slot > 0 && (nearH[slot - 1] > h || (nearH[slot - 1] === h && nearIndex[slot - 1] > i))) {
              nearH[slot] = nearH[slot - 1];
              nearZ[slot] = nearZ[slot - 1];
              nearIndex[slot] = nearIndex[slot - 1];
              slot -= 1;
            }
            nearH[slot] = h;
            nearZ[slot] = candidateValue[k];
            nearIndex[slot] = i;
            if (found < limit) found += 1;
          }
          const cell = row * grid.columns + column;
          if (found === 0) {
            values[cell] = NaN;
            continue;
          }
          hasValue[cell] = 1;
          if (exactIndex < count && fill.power > 0) {
            values[cell] = exactValue;
            continue;
          }
          if (isLimited) {
            for (let k = 0; k < found; k += 1) {
              const hk = nearH[k];
              const weight = halfPower === 1 ? (isSiteScale ? 1 / (hk * (1 + hk * THIRD)) : 1 / asinSquared(hk)) : Math.pow(asinSquared(hk), -halfPower);
              weightSum += weight;
              weightedSum += weight * nearZ[k];
            }
          }
          values[cell] = weightedSum / weightSum;
        }
      }
    }
  }
}

/** IDW grid over a lon/lat box: typed-array values, a has-value mask and the cell geometry. */
export function idwGrid(samples: readonly HeatmapSample[], grid: GridSpec, options: IdwOptions = {}): Result<HeatmapGrid> {
  const errors = validate(samples, grid, options);
  if (errors.length > 0) {
    return fail(...errors);
  }
  const power = options.power ?? 2;
  const maxNeighbours = options.maxNeighbours ?? DEFAULT_MAX_NEIGHBOURS;
  const searchRadiusM = options.searchRadiusM ?? defaultRadiusM(samples);
  const count = samples.length;
  const lons = new Float64Array(count);
  const lats = new Float64Array(count);
  const vals = new Float64Array(count);
  let minValue = Infinity;
  let maxValue = -Infinity;
  let sampleWest = Infinity, sampleEast = -Infinity, sampleSouth = Infinity, sampleNorth = -Infinity;
  for (let index = 0; index < count; index += 1) {
    const { lon, lat, value } = samples[index];
    lons[index] = lon;
    lats[index] = lat;
    vals[index] = value;
    minValue = Math.min(minValue, value);
    maxValue = Math.max(maxValue, value);
    sampleWest = Math.min(sampleWest, lon);
    sampleEast = Math.max(sampleEast, lon);
    sampleSouth = Math.min(sampleSouth, lat);
    sampleNorth = Math.max(sampleNorth, lat);
  }
  const { columns, rows } = grid;
  const cellWidthDeg = (grid.east - grid.west) / columns;
  const cellHeightDeg = (grid.north - grid.south) / rows;
  const lonTrig = cellAxis(grid.west, cellWidthDeg, columns);
  const latTrig = cellAxis(grid.north, -cellHeightDeg, rows);
  const values = new Float64Array(columns * rows);
  const hasValue = new Uint8Array(columns * rows);
  const diagonalH = boxDiagonalH(
    Math.min(sampleWest, grid.west),
    Math.min(sampleSouth, grid.south),
    Math.max(sampleEast, grid.east),
    Math.max(sampleNorth, grid.north),
  );
  const isFull = searchRadiusM === 'unlimited' && maxNeighbours === 'all';
  const halfLonSpan = ((Math.max(sampleEast, grid.east) - Math.min(sampleWest, grid.west)) * DEG) / 2;
  const isSiteScale = diagonalH < SITE_SCALE_H && halfLonSpan < SITE_SCALE_HALF_ANGLE;
  if (isFull && power === 2 && isSiteScale) {
    fillFullPower2(prepare(lons, lats, vals), latTrig, lonTrig, columns, rows, values);
    hasValue.fill(1);
    // A cell centre exactly on a sample gives an infinite weight; Shepard's rule gives that sample.
    for (let cell = 0; cell < values.length; cell += 1) {
      if (Number.isNaN(values[cell])) {
        const single = idwAtPoints(samples, [cellCentre(grid, cell)], { ...options, searchRadiusM: 'unlimited', maxNeighbours: 'all' });
        values[cell] = single.ok ? single.value[0] : NaN;
      }
    }
  } else {
    const prepared = prepare(lons, lats, vals);
    const index = buildIndex(lons, lats, searchRadiusM, Math.max(Math.abs(grid.north), Math.abs(grid.south)));
    const radiusH = radiusHaversine(searchRadiusM);
    fillNeighbours(prepared, index, grid, latTrig, lonTrig, { power, radiusH, maxNeighbours: maxNeighbours === 'all' ? Infinity : maxNeighbours, isSiteScale }, values, hasValue);
  }
  let emptyCellCount = 0;
  for (let cell = 0; cell < hasValue.length; cell += 1) {
    if (hasValue[cell] === 0) emptyCellCount += 1;
  }
  const middleLat = ((grid.north + grid.south) / 2) * DEG;
  return ok({
    values,
    hasValue,
    columns,
    rows,
    west: grid.west,
    south: grid.south,
    east: grid.east,
    north: grid.north,
    cellWidthDeg,
    cellHeightDeg,
    cellWidthM: cellWidthDeg * DEG * EARTH_RADIUS_M * Math.cos(middleLat),
    cellHeightM: cellHeightDeg * DEG * EARTH_RADIUS_M,
    power,
    searchRadiusM,
    maxNeighbours,
    minValue,
    maxValue,
    emptyCellCount,
  });
}

/** Centre of a grid cell (row-major, row 0 north). */
export function cellCentre(grid: GridSpec, cell: number): { readonly lon: number; readonly lat: number } {
  const row = Math.floor(cell / grid.columns);
  const column = cell - row * grid.columns;
  return {
    lon: grid.west + (column + 0.5) * ((grid.east - grid.west) / grid.columns),
    lat: grid.north - (row + 0.5) * ((grid.north - grid.south) / grid.rows),
  };
}

/** IDW estimate at given points (NaN where no sample is within the radius); same rules as `idwGrid`. */
export function idwAtPoints(
  samples: readonly HeatmapSample[],
  points: readonly { readonly lon: number; readonly lat: number }[],
  options: IdwOptions = {},
): Result<number[]> {
  const errors = validate(samples, { west: -180, south: -90, east: 180, north: 90, columns: 1, rows: 1 }, options);
  points.forEach((point, index) => {
    for (const field of ['lon', 'lat'] as const) {
      const invalid = checkNumber(`points[${index}].${field}`, point?.[field]);
      if (invalid) errors.push(invalid);
    }
  });
  if (errors.length > 0) {
    return fail(...errors);
  }
  const power = options.power ?? 2;
  const maxNeighbours = options.maxNeighbours ?? DEFAULT_MAX_NEIGHBOURS;
  const radiusM = options.searchRadiusM ?? defaultRadiusM(samples);
  const radiusH = radiusHaversine(radiusM);
  const prepared = prepare(
    samples.map((sample) => sample.lon),
    samples.map((sample) => sample.lat),
    samples.map((sample) => sample.value),
  );
  return ok(
    points.map((point) => {
      const cl = Math.cos(point.lat * DEG);
      const near: { h: number; z: number }[] = [];
      for (let i = 0; i < prepared.count; i += 1) {
        const h = haversineH(point.lon, point.lat, cl, prepared.lonDeg[i], prepared.latDeg[i], prepared.cosLat[i]);
        if (h <= radiusH) near.push({ h, z: prepared.value[i] });
      }
      near.sort((first, second) => first.h - second.h);
      const used = maxNeighbours === 'all' ? near : near.slice(0, maxNeighbours);
      if (used.length === 0) return NaN;
      if (power > 0 && used[0].h === 0) return used[0].z;
      let weightSum = 0;
      let weightedSum = 0;
      for (const { h, z } of used) {
        const weight = Math.pow(asinSquared(h), -power / 2);
        weightSum += weight;
        weightedSum += weight * z;
      }
      return weightedSum / weightSum;
    }),
  );
}
