/**
 * Delaunay triangulation of a few hundred planar points (Bowyer 1981; Watson 1981), for the
 * surveyed-volume surface. Quadratic time, which is fine for spot heights on one pile; the engine
 * keeps its own because the npm triangulators ship as ES modules only and the shared tests run as
 * CommonJS.
 */
import { PlanePoint } from './geodesy';

/** A triangle as three indices into the input points, counter-clockwise. */
export type Triangle = readonly [number, number, number];

interface WorkingTriangle {
  readonly corners: Triangle;
  readonly centreX: number;
  readonly centreY: number;
  readonly radiusSquared: number;
}

function makeTriangle(points: readonly PlanePoint[], a: number, b: number, c: number): WorkingTriangle {
  const pa = points[a];
  const pb = points[b];
  const pc = points[c];
  const cross = (pb.x - pa.x) * (pc.y - pa.y) - (pb.y - pa.y) * (pc.x - pa.x);
  const corners: Triangle = cross >= 0 ? [a, b, c] : [a, c, b];
  const d = 2 * (pa.x * (pb.y - pc.y) + pb.x * (pc.y - pa.y) + pc.x * (pa.y - pb.y));
  const aa = pa.x * pa.x + pa.y * pa.y;
  const bb = pb.x * pb.x + pb.y * pb.y;
  const cc = pc.x * pc.x + pc.y * pc.y;
  const centreX = (aa * (pb.y - pc.y) + bb * (pc.y - pa.y) + cc * (pa.y - pb.y)) / d;
  const centreY = (aa * (pc.x - pb.x) + bb * (pa.x - pc.x) + cc * (pb.x - pa.x)) / d;
  return { corners, centreX, centreY, radiusSquared: (pa.x - centreX) ** 2 + (pa.y - centreY) ** 2 };
}

/** Delaunay triangles of distinct planar points (indices into `points`). */
export function delaunayTriangles(points: readonly PlanePoint[]): Triangle[] {
  if (points.length < 3) {
    return [];
  }
  const xs = points.map((point) => point.x);
  const ys = points.map((point) => point.y);
  const minX = Math.min(...xs);
  const minY = Math.min(...ys);
  const span = Math.max(Math.max(...xs) - minX, Math.max(...ys) - minY, 1);
  const midX = minX + span / 2;
  const midY = minY + span / 2;
  // A super-triangle 40 spans across holds every point well inside its circumcircle.
  const all: PlanePoint[] = [
    ...points,
    { x: midX - 40 * span, y: midY - 40 * span },
    { x: midX + 40 * span, y: midY - 40 * span },
    { x: midX, y: midY + 40 * span },
  ];
  const superStart = points.length;
  let triangles: WorkingTriangle[] = [makeTriangle(all, superStart, superStart + 1, superStart + 2)];
  for (let index = 0; index < points.length; index += 1) {
    const point = all[index];
    const bad: WorkingTriangle[] = [];
    const kept: WorkingTriangle[] = [];
    for (const triangle of triangles) {
      const distanceSquared = (point.x - triangle.centreX) ** 2 + (point.y - triangle.centreY) ** 2;
      // Strictly inside, with a relative margin so that co-circular points (squares, grids) stay out.
      (distanceSquared < triangle.radiusSquared * (1 - 1e-10) ? bad : kept).push(triangle);
    }
    const edgeCount = new Map<string, { from: number; to: number; count: number }>();
    for (const { corners } of bad) {
      for (let side = 0; side < 3; side += 1) {
        const from = corners[side];
        const to = corners[(side + 1) % 3];
        const key = from < to ? `${from},${to}` : `${to},${from}`;
        const entry = edgeCount.get(key);
        if (entry) {
          entry.count += 1;
        } else {
          edgeCount.set(key, { from, to, count: 1 });
        }
      }
    }
    triangles = kept;
    for (const { from, to, count } of edgeCount.values()) {
      if (count === 1) {
        triangles.push(makeTriangle(all, from, to, index));
      }
    }
  }
  return triangles
    .filter(({ corners }) => corners.every((corner) => corner < superStart))
    .map(({ corners }) => corners);
}
