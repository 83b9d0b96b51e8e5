/**
 * Geodesy on the WGS84 ellipsoid, small and dependency-free, for the footprint and volume modules.
 * - Area: the ellipsoid is mapped onto the sphere of equal area through the authalic latitude
 *   (Snyder 1987, "Map Projections: A Working Manual", eqs 3-11, 3-12), and the polygon's area is
 *   taken exactly on that sphere with great-circle edges. The only approximation is that a geodesic
 *   edge is not exactly a great circle on the authalic sphere, which is negligible for pile-sized
 *   edges (tested against GeographicLib).
 * - Distance: Vincenty's inverse formula (Survey Review 23, 1975), good to well under a millimetre.
 * - Local plane: x east, y north in metres around an origin, scaled by the ellipsoid's radii of
 *   curvature there; within a kilometre of the origin its distortion is below 1e-7.
 */

/** WGS84 semi-major axis in metres. */
export const WGS84_A_M = 6378137;
/** WGS84 flattening. */
export const WGS84_F = 1 / 298.257223563;

const E2 = WGS84_F * (2 - WGS84_F);
const E = Math.sqrt(E2);
const DEG = Math.PI / 180;

/** A position in degrees, WGS84. */
export interface LonLat {
  readonly lon: number;
  readonly lat: number;
}

/** A position in a local plane, metres east and north of its origin. */
export interface PlanePoint {
  readonly x: number;
  readonly y: number;
}

function authalicQ(sinLat: number): number {
  return (1 - E2) * (sinLat / (1 - E2 * sinLat * sinLat) - (1 / (2 * E)) * Math.log((1 - E * sinLat) / (1 + E * sinLat)));
}

const Q_POLE = authalicQ(1);
/** Radius of the sphere with the same surface area as the WGS84 ellipsoid, metres. */
export const AUTHALIC_RADIUS_M = WGS84_A_M * Math.sqrt(Q_POLE / 2);

function authalicLatitudeRad(latDeg: number): number {
  const ratio = authalicQ(Math.sin(latDeg * DEG)) / Q_POLE;
  return Math.asin(Math.max(-1, Math.min(1, ratio)));
}

function wrapRad(angle: number): number {
  let wrapped = angle;
  while (wrapped > Math.PI) wrapped -= 2 * Math.PI;
  while (wrapped <= -Math.PI) wrapped += 2 * Math.PI;
  return wrapped;
}

/** Unsigned ellipsoidal area of a simple ring (open: last vertex not repeated), m². */
export function ellipsoidalRingAreaM2(ring: readonly LonLat[]): number {
  let excess = 0;
  for (let index = 0; index < ring.length; index += 1) {
    const from = ring[index];
    const to = ring[(index + 1) % ring.length];
    const halfTanFrom = Math.tan(authalicLatitudeRad(from.lat) / 2);
    const halfTanTo = Math.tan(authalicLatitudeRad(to.lat) / 2);
    const halfDeltaLon = wrapRad((to.lon - from.lon) * DEG) / 2;
    // Exact excess of the region between a great-circle edge and the equator.
    excess += 2 * Math.atan2(Math.tan(halfDeltaLon) * (halfTanFrom + halfTanTo), 1 + halfTanFrom * halfTanTo);
  }
  return Math.abs(excess) * AUTHALIC_RADIUS_M * AUTHALIC_RADIUS_M;
}

/** Geodesic distance in metres (Vincenty inverse); undefined when the iteration fails (near-antipodal). */
export function vincentyDistanceM(from: LonLat, to: LonLat): number | undefined {
  const b = WGS84_A_M * (1 - WGS84_F);
  const deltaLon = wrapRad((to.lon - from.lon) * DEG);
  const reducedFrom = Math.atan((1 - WGS84_F) * Math.tan(from.lat * DEG));
  const reducedTo = Math.atan((1 - WGS84_F) * Math.tan(to.lat * DEG));
  const sinU1 = Math.sin(reducedFrom);
  const cosU1 = Math.cos(reducedFrom);
  const sinU2 = Math.sin(reducedTo);
  const cosU2 = Math.cos(reducedTo);
  let lambda = deltaLon;
  // 200 iterations: Vincenty converges in a handful except near the antipode, where it may not at all.
  for (let iteration = 0; iteration < 200; iteration += 1) {
    const sinLambda = Math.sin(lambda);
    const cosLambda = Math.cos(lambda);
    const sinSigma = Math.hypot(cosU2 * sinLambda, cosU1 * sinU2 - sinU1 * cosU2 * cosLambda);
    if (sinSigma === 0) {
      return 0;
    }
    const cosSigma = sinU1 * sinU2 + cosU1 * cosU2 * cosLambda;
    const sigma = Math.atan2(sinSigma, cosSigma);
    const sinAlpha = (cosU1 * cosU2 * sinLambda) / sinSigma;
    const cos2Alpha = 1 - sinAlpha * sinAlpha;
    const cos2SigmaM = cos2Alpha === 0 ? 0 : cosSigma - (2 * sinU1 * sinU2) / cos2Alpha;
    const c = (WGS84_F / 16) * cos2Alpha * (4 + WGS84_F * (4 - 3 * cos2Alpha));
    const previous = lambda;
    lambda =
      deltaLon +
      (1 - c) * WGS84_F * sinAlpha * (sigma + c * sinSigma * (cos2SigmaM + c * cosSigma * (-1 + 2 * cos2SigmaM * cos2SigmaM)));
    // 1e-12 rad is about 6 µm on the ground.
    if (Math.abs(lambda - previous) < 1e-12) {
      const u2 = (cos2Alpha * (WGS84_A_M * WGS84_A_M - b * b)) / (b * b);
      const bigA = 1 + (u2 / 16384) * (4096 + u2 * (-768 + u2 * (320 - 175 * u2)));
      const bigB = (u2 / 1024) * (256 + u2 * (-128 + u2 * (74 - 47 * u2)));
      const deltaSigma =
        bigB *
        sinSigma *
        (cos2SigmaM +
          (bigB / 4) *
            (cosSigma * (-1 + 2 * cos2SigmaM * cos2SigmaM) -
              (bigB / 6) * cos2SigmaM * (-3 + 4 * sinSigma * sinSigma) * (-3 + 4 * cos2SigmaM * cos2SigmaM)));
      return b * bigA * (sigma - deltaSigma);
    }
  }
  return undefined;
}

/** A local plane around an origin: forward and inverse mapping between degrees and metres. */
export interface LocalPlane {
  readonly origin: LonLat;
  readonly toPlane: (position: LonLat) => PlanePoint;
  readonly toLonLat: (point: PlanePoint) => LonLat;
}

/** Builds a local east-north plane in metres around an origin (equirectangular on the local radii). */
export function localPlane(origin: LonLat): LocalPlane {
  const sinLat = Math.sin(origin.lat * DEG);
  const w = Math.sqrt(1 - E2 * sinLat * sinLat);
  const primeVerticalM = WGS84_A_M / w;
  const meridionalM = (WGS84_A_M * (1 - E2)) / (w * w * w);
  const metresPerRadLon = primeVerticalM * Math.cos(origin.lat * DEG);
  return {
    origin,
    toPlane: (position) => ({
      x: wrapRad((position.lon - origin.lon) * DEG) * metresPerRadLon,
      y: (position.lat - origin.lat) * DEG * meridionalM,
    }),
    toLonLat: (point) => ({
      lon: origin.lon + point.x / metresPerRadLon / DEG,
      lat: origin.lat + point.y / meridionalM / DEG,
    }),
  };
}

/** Signed planar area of a ring (positive when counter-clockwise), m². */
export function planarSignedAreaM2(ring: readonly PlanePoint[]): number {
  let twiceArea = 0;
  for (let index = 0; index < ring.length; index += 1) {
    const from = ring[index];
    const to = ring[(index + 1) % ring.length];
    twiceArea += from.x * to.y - to.x * from.y;
  }
  return twiceArea / 2;
}

/** Area-weighted centroid of a planar ring. */
export function planarCentroid(ring: readonly PlanePoint[]): PlanePoint {
  let twiceArea = 0;
  let sumX = 0;
  let sumY = 0;
  for (let index = 0; index < ring.length; index += 1) {
    const from = ring[index];
    const to = ring[(index + 1) % ring.length];
    const cross = from.x * to.y - to.x * from.y;
    twiceArea += cross;
    sumX += (from.x + to.x) * cross;
    sumY += (from.y + to.y) * cross;
  }
  return { x: sumX / (3 * twiceArea), y: sumY / (3 * twiceArea) };
}

/** True when a point lies inside a planar ring (even-odd rule; points on the edge count as inside). */
export function isInsideRing(point: PlanePoint, ring: readonly PlanePoint[]): boolean {
  let inside = false;
  for (let index = 0, previous = ring.length - 1; index < ring.length; previous = index, index += 1) {
    const a = ring[index];
    const b = ring[previous];
    if (onSegment(point, a, b)) {
      return true;
    }
    if (a.y > point.y !== b.y > point.y && point.x < ((b.x - a.x) * (point.y - a.y)) / (b.y - a.y) + a.x) {
      inside = !inside;
    }
  }
  return inside;
}

function onSegment(point: PlanePoint, a: PlanePoint, b: PlanePoint): boolean {
  const cross = (b.x - a.x) * (point.y - a.y) - (b.y - a.y) * (point.x - a.x);
  // 1e-9 m² of cross product: a millimetre-scale tolerance on pile-sized edges.
  if (Math.abs(cross) > 1e-9) {
    return false;
  }
  return (
    Math.min(a.x, b.x) <= point.x && point.x <= Math.max(a.x, b.x) && Math.min(a.y, b.y) <= point.y && point.y <= Math.max(a.y, b.y)
  );
}
