/**
 * The footprint of a pile: the polygon walked around its toe, as GeoJSON (WGS84 lon/lat).
 * Area is ellipsoidal (authalic sphere, see geodesy.ts), perimeter is the sum of Vincenty geodesic
 * edges, the centroid is the area centroid in a local plane. A footprint with holes, fewer than
 * three distinct corners, no area, or edges that cross is refused with the problem named.
 * Consecutive repeated points (a GPS standing still) are dropped; an unclosed ring is closed, with a
 * warning, because the walk back to the first point is implied.
 */
import {
  LocalPlane,
  LonLat,
  PlanePoint,
  ellipsoidalRingAreaM2,
  localPlane,
  planarCentroid,
  planarSignedAreaM2,
  vincentyDistanceM,
} from './geodesy';
import { EngineError, EngineWarning, Result, engineError, fail, ok } from './result';

export type { LonLat, PlanePoint } from './geodesy';

/** A validated footprint: the open ring (first corner not repeated) and its local plane. */
export interface Footprint {
  readonly ring: readonly LonLat[];
  /** The same ring in metres around the vertex mean, counter-clockwise. */
  readonly planeRing: readonly PlanePoint[];
  readonly plane: LocalPlane;
  readonly warnings: readonly EngineWarning[];
}

/** Size and position of a footprint. */
export interface FootprintMetrics {
  readonly areaM2: number;
  readonly perimeterM: number;
  readonly centroid: LonLat;
  readonly vertexCount: number;
  readonly warnings: readonly EngineWarning[];
}

const FIELD = 'footprint';

function parsePosition(position: unknown, index: number): LonLat | EngineError {
  if (!Array.isArray(position) || position.length < 2) {
    return engineError('not-a-number', FIELD, `corner ${index} is not a [lon, lat] pair`);
  }
  const [lon, lat] = position as unknown[];
  if (typeof lon !== 'number' || typeof lat !== 'number' || !Number.isFinite(lon) || !Number.isFinite(lat)) {
    return engineError('not-a-number', FIELD, `corner ${index} has a coordinate that is not a number`);
  }
  if (lon < -180 || lon > 180 || lat < -90 || lat > 90) {
    return engineError('out-of-range', FIELD, `corner ${index} (${lon}, ${lat}) is outside lon −180…180, lat −90…90`);
  }
  return { lon, lat };
}

function segmentsCross(a: PlanePoint, b: PlanePoint, c: PlanePoint, d: PlanePoint): boolean {
  const orient = (p: PlanePoint, q: PlanePoint, r: PlanePoint): number => (q.x - p.x) * (r.y - p.y) - (q.y - p.y) * (r.x - p.x);
  const within = (p: PlanePoint, q: PlanePoint, r: PlanePoint): boolean =>
    Math.min(p.x, q.x) <= r.x && r.x <= Math.max(p.x, q.x) && Math.min(p.y, q.y) <= r.y && r.y <= Math.max(p.y, q.y);
  const d1 = orient(c, d, a);
  const d2 = orient(c, d, b);
  const d3 = orient(a, b, c);
  const d4 = orient(a, b, d);
  if (((d1 > 0 && d2 < 0) || (d1 < 0 && d2 > 0)) && ((d3 > 0 && d4 < 0) || (d3 < 0 && d4 > 0))) {
    return true;
  }
  return (
    (d1 === 0 && within(c, d, a)) || (d2 === 0 && within(c, d, b)) || (d3 === 0 && within(a, b, c)) || (d4 === 0 && within(a, b, d))
  );
}

interface Crossing {
  readonly edges: readonly [number, number];
  readonly isDoubleBack: boolean;
}

function findCrossing(ring: readonly PlanePoint[]): Crossing | undefined {
  const count = ring.length;
  for (let first = 0; first < count; first += 1) {
    for (let second = first + 1; second < count; second += 1) {
      const isAdjacent = second === first + 1 || (first === 0 && second === count - 1);
      if (isAdjacent) {
        continue;
      }
      if (segmentsCross(ring[first], ring[(first + 1) % count], ring[second], ring[(second + 1) % count])) {
        return { edges: [first, second], isDoubleBack: false };
      }
    }
  }
  // Adjacent edges meet at one corner; they overlap only when the walk doubles back on itself.
  for (let index = 0; index < count; index += 1) {
    const previous = ring[(index + count - 1) % count];
    const corner = ring[index];
    const next = ring[(index + 1) % count];
    const cross = (corner.x - previous.x) * (next.y - corner.y) - (corner.y - previous.y) * (next.x - corner.x);
    const dot = (corner.x - previous.x) * (next.x - corner.x) + (corner.y - previous.y) * (next.y - corner.y);
    if (cross === 0 && dot < 0) {
      return { edges: [(index + count - 1) % count, index], isDoubleBack: true };
    }
  }
  return undefined;
}

/** Validates a GeoJSON Polygon as a pile footprint; refuses holes, degenerate and self-intersecting rings. */
export function parseFootprint(polygon: unknown): Result<Footprint> {
  if (typeof polygon !== 'object' || polygon === null || (polygon as { type?: unknown }).type !== 'Polygon') {
    return fail(engineError('missing', FIELD, 'footprint must be a GeoJSON Polygon'));
  }
  const rings = (polygon as { coordinates?: unknown }).coordinates;
  if (!Array.isArray(rings) || rings.length === 0 || !Array.isArray(rings[0]) || rings[0].length === 0) {
    return fail(engineError('empty', FIELD, 'footprint has no corners'));
  }
  if (rings.length > 1) {
    return fail(engineError('holes-not-supported', FIELD, 'footprint has holes; walk the outer toe only', { ringCount: rings.length }));
  }
  const positions: LonLat[] = [];
  for (const [index, position] of (rings[0] as unknown[]).entries()) {
    const parsed = parsePosition(position, index);
    if ('code' in parsed) {
      return fail(parsed);
    }
    const last = positions[positions.length - 1];
    if (!last || last.lon !== parsed.lon || last.lat !== parsed.lat) {
      positions.push(parsed);
    }
  }
  const warnings: EngineWarning[] = [];
  const first = positions[0];
  const last = positions[positions.length - 1];
  if (positions.length > 1 && first.lon === last.lon && first.lat === last.lat) {
    positions.pop();
  } else if ((rings[0] as unknown[]).length > 1) {
    warnings.push({ code: 'ring-closed', message: 'The footprint did not end where it began; it was closed back to the first corner.' });
  }
  if (positions.length < 3) {
    return fail(engineError('degenerate-ring', FIELD, `footprint has ${positions.length} distinct corners; at least 3 are needed`));
  }
  const origin = {
    lon: positions.reduce((sum, position) => sum + position.lon, 0) / positions.length,
    lat: positions.reduce((sum, position) => sum + position.lat, 0) / positions.length,
  };
  const plane = localPlane(origin);
  let planeRing = positions.map(plane.toPlane);
  const signedArea = planarSignedAreaM2(planeRing);
  const crossing = findCrossing(planeRing);
  // 0.01 m²: a footprint smaller than a hand's breadth is a mis-tap or a straight line, not a pile.
  if (Math.abs(signedArea) < 0.01 && (!crossing || crossing.isDoubleBack)) {
    return fail(engineError('degenerate-ring', FIELD, 'footprint encloses no area (its corners lie on a line)'));
  }
  if (crossing) {
    const [first, second] = crossing.edges;
    return fail(
      engineError('self-intersection', FIELD, `footprint edges ${first + 1} and ${second + 1} cross or overlap; redraw the toe`, {
        edges: crossing.edges,
      }),
    );
  }
  const ring = signedArea < 0 ? [...positions].reverse() : positions;
  planeRing = signedArea < 0 ? [...planeRing].reverse() : planeRing;
  return ok({ ring, planeRing, plane, warnings });
}

/** Geodesic area (m²), perimeter (m) and area centroid of a GeoJSON Polygon footprint. */
export function measureFootprint(polygon: unknown): Result<FootprintMetrics> {
  const parsed = parseFootprint(polygon);
  if (!parsed.ok) {
    return parsed;
  }
  return ok(metricsOf(parsed.value));
}

/** Metrics of an already validated footprint. */
export function metricsOf(footprint: Footprint): FootprintMetrics {
  const { ring, planeRing, plane } = footprint;
  let perimeterM = 0;
  for (let index = 0; index < ring.length; index += 1) {
    // Footprint edges are short, so Vincenty always converges here; the fallback is the plane length.
    const from = ring[index];
    const to = ring[(index + 1) % ring.length];
    perimeterM += vincentyDistanceM(from, to) ?? Math.hypot(planeRing[(index + 1) % ring.length].x - planeRing[index].x, planeRing[(index + 1) % ring.length].y - planeRing[index].y);
  }
  return {
    areaM2: ellipsoidalRingAreaM2(ring),
    perimeterM,
    centroid: plane.toLonLat(planarCentroid(planeRing)),
    vertexCount: ring.length,
    warnings: footprint.warnings,
  };
}

/** Geodesic distance in metres between two positions on WGS84. */
export function geodesicDistanceM(from: LonLat, to: LonLat): Result<number> {
  const errors: EngineError[] = [];
  for (const [field, position] of [['from', from], ['to', to]] as const) {
    const parsed = parsePosition([position?.lon, position?.lat], 0);
    if ('code' in parsed) {
      errors.push({ ...parsed, field });
    }
  }
  if (errors.length > 0) {
    return fail(...errors);
  }
  const distanceM = vincentyDistanceM(from, to);
  return distanceM === undefined
    ? fail(engineError('no-convergence', 'to', 'the two points are nearly antipodal; the distance could not be computed'))
    : ok(distanceM);
}

/** Geodesic distance in metres from a footprint's centroid to a point (e.g. the processing point). */
export function centroidDistanceM(polygon: unknown, point: LonLat): Result<number> {
  const metrics = measureFootprint(polygon);
  return metrics.ok ? geodesicDistanceM(metrics.value.centroid, point) : metrics;
}
