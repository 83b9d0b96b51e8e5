/// <reference path="./vendor/clipper-lib.d.ts" />
/**
 * Inward offset of a planar footprint, for the section of a pile with a constant side slope: the
 * section at height z is the set of points at least z/tanθ from the toe, i.e. the footprint eroded
 * by that distance. Clipper works on integers, so metres are scaled to millimetres; corners that
 * the erosion rounds (re-entrant corners of the toe) are approximated within 2 mm.
 */
import ClipperLib from 'clipper-lib';
import { PlanePoint } from './geodesy';

// Millimetre integers: finer than any field measurement, far inside Clipper's integer range.
const SCALE = 1000;
// 2 mm arc tolerance, in scaled units.
const ARC_TOLERANCE = 2;

/** Area in m² of the footprint eroded inward by `insetM` metres (0 when nothing is left). */
export function insetAreaM2(ring: readonly PlanePoint[], insetM: number): number {
  const path = ring.map((point) => ({ X: Math.round(point.x * SCALE), Y: Math.round(point.y * SCALE) }));
  if (insetM <= 0) {
    return Math.abs(ClipperLib.Clipper.Area(path)) / (SCALE * SCALE);
  }
  const offset = new ClipperLib.ClipperOffset(2, ARC_TOLERANCE);
  offset.AddPath(path, ClipperLib.JoinType.jtRound, ClipperLib.EndType.etClosedPolygon);
  const solution: { X: number; Y: number }[][] = [];
  offset.Execute(solution, -insetM * SCALE);
  // Outer rings come back positive and holes negative, so the signed sum is the section's area.
  const area = solution.reduce((sum, part) => sum + ClipperLib.Clipper.Area(part), 0);
  return Math.max(0, area) / (SCALE * SCALE);
}

/** Largest inward offset in metres that leaves any area: the inradius of the footprint, to 1 mm. */
export function inradiusM(ring: readonly PlanePoint[]): number {
  const areaM2 = insetAreaM2(ring, 0);
  // A disc has the largest inradius for a given area, so √(A/π) bounds it from above.
  let low = 0;
  let high = Math.sqrt(areaM2 / Math.PI) + 0.01;
  while (high - low > 0.001) {
    const middle = (low + high) / 2;
    if (insetAreaM2(ring, middle) > 0) {
      low = middle;
    } else {
      high = middle;
    }
  }
  return low;
}
