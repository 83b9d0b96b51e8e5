/**
 * Pile volume by four shape models (DESIGN §7):
 * - `cone`: V = A·h/3, for a pile that comes to a point.
 * - `flat-topped`: sides at the angle of repose θ rising from the toe; the crest and mid sections are
 *   the footprint offset inward by h/tanθ and h/(2·tanθ), and V = h/6·(A_base + 4·A_mid + A_top)
 *   (prismoidal formula, exact when the section area is quadratic in height, as it is for a convex
 *   toe). When the slope closes the crest before the height is reached, the height is not possible
 *   at that angle: the volume is that of the solid the slope allows, with a warning.
 * - `surveyed`: a Delaunay surface (delaunator) through the spot heights and the toe (height 0), summed as
 *   prisms over the base, exact for a surface that is planar between the measured points.
 * - `sacks`: count × mass per sack, and the volume that mass fills at the bulk density.
 */
import Delaunator from 'delaunator';
import { Footprint, LonLat, metricsOf, parseFootprint } from './footprint';
import { PlanePoint, isInsideRing } from './geodesy';
import { inradiusM, insetAreaM2 } from './offset';
import { EngineError, EngineWarning, Result, checkNumber, checkNumbers, engineError, fail, ok } from './result';

/** How a pile's volume is modelled (DESIGN §6 `shapeModel`). */
export type ShapeModel = 'cone' | 'flat-topped' | 'surveyed' | 'sacks';

/** The shape models, in the order the UI offers them. */
export const SHAPE_MODELS: readonly ShapeModel[] = ['cone', 'flat-topped', 'surveyed', 'sacks'];

/** A volume, how it was found, and what the user should know about it. */
export interface VolumeEstimate {
  readonly volumeM3: number;
  readonly method: ShapeModel;
  readonly warnings: readonly EngineWarning[];
  /** Height used in the formula, m (lower than the entered height when the slope closes the crest). */
  readonly heightUsedM?: number;
  /** Section areas of the prismoidal formula, m². */
  readonly sectionsM2?: { readonly base: number; readonly mid: number; readonly top: number };
  readonly triangleCount?: number;
  /** Mass counted in sacks, kg (as bagged, i.e. wet). */
  readonly wetMassKg?: number;
}

/** A height measured on the pile surface, above its base. */
export interface SpotHeight extends LonLat {
  readonly heightM: number;
}

/** Cone: V = A·h/3 from base area (m²) and height (m). */
export function coneVolume(input: { readonly areaM2: number; readonly heightM: number }): Result<VolumeEstimate> {
  const errors = checkNumbers([
    ['areaM2', input.areaM2, 'positive'],
    ['heightM', input.heightM, 'positive'],
  ]);
  if (errors.length > 0) {
    return fail(...errors);
  }
  return ok({ volumeM3: (input.areaM2 * input.heightM) / 3, method: 'cone', warnings: [], heightUsedM: input.heightM });
}

function toFootprint(footprint: unknown): Result<Footprint> {
  return parseFootprint(footprint);
}

/** Flat-topped pile from footprint, height (m) and angle of repose (degrees), by the prismoidal formula. */
export function flatToppedVolume(input: {
  readonly footprint: unknown;
  readonly heightM: number;
  readonly angleOfReposeDeg: number;
}): Result<VolumeEstimate> {
  const errors: EngineError[] = checkNumbers([['heightM', input.heightM, 'positive']]);
  const angleError = checkNumber('angleOfReposeDeg', input.angleOfReposeDeg, 'positive');
  if (angleError) {
    errors.push(angleError);
  } else if (input.angleOfReposeDeg >= 90) {
    errors.push(engineError('out-of-range', 'angleOfReposeDeg', `angle of repose must be below 90° (got ${input.angleOfReposeDeg})`));
  }
  const footprint = toFootprint(input.footprint);
  if (!footprint.ok) {
    errors.push(...footprint.errors);
  }
  if (errors.length > 0 || !footprint.ok) {
    return fail(...errors);
  }
  const ring = footprint.value.planeRing;
  const tanAngle = Math.tan((input.angleOfReposeDeg * Math.PI) / 180);
  const runM = input.heightM / tanAngle;
  const base = insetAreaM2(ring, 0);
  const top = insetAreaM2(ring, runM);
  const warnings: EngineWarning[] = [...footprint.value.warnings];
  if (top > 0) {
    const mid = insetAreaM2(ring, runM / 2);
    return ok({
      volumeM3: (input.heightM / 6) * (base + 4 * mid + top),
      method: 'flat-topped',
      warnings,
      heightUsedM: input.heightM,
      sectionsM2: { base, mid, top },
    });
  }
  const reachM = inradiusM(ring);
  const heightUsedM = reachM * tanAngle;
  const mid = insetAreaM2(ring, reachM / 2);
  warnings.push({
    code: 'crest-vanishes',
    message:
      `At ${input.angleOfReposeDeg}° the sides meet ${heightUsedM.toFixed(2)} m up, below the ${input.heightM} m entered: ` +
      'the pile is a cone-like solid of that height. Check the height, the angle or the footprint.',
  });
  return ok({
    volumeM3: (heightUsedM / 6) * (base + 4 * mid),
    method: 'flat-topped',
    warnings,
    heightUsedM,
    sectionsM2: { base, mid, top: 0 },
  });
}

/**
 * Where each spot height falls, in the order taken: counted; outside the footprint; or repeating
 * (closer than 1 cm to) an earlier counted point (`ofPoint`, 0-based) or a toe corner (`ofPoint` null).
 * `surveyedVolume` counts exactly the points placed `counted`; the capture form shows the same verdicts.
 */
export type SpotHeightPlacement =
  | { readonly status: 'counted'; readonly point: PlanePoint }
  | { readonly status: 'outside' }
  | { readonly status: 'repeated'; readonly ofPoint: number | null };

/** Places spot heights against a parsed footprint (see `SpotHeightPlacement`). */
export function placeSpotHeights(footprint: Pick<Footprint, 'plane' | 'planeRing'>, spots: readonly LonLat[]): SpotHeightPlacement[] {
  const { plane, planeRing } = footprint;
  const counted: { point: PlanePoint; index: number | null }[] = planeRing.map((point) => ({ point, index: null }));
  return spots.map((spot, index): SpotHeightPlacement => {
    const point = plane.toPlane(spot);
    if (!isInsideRing(point, planeRing)) {
      return { status: 'outside' };
    }
    // 1 cm: two readings closer than that are the same place read twice.
    const earlier = counted.find((existing) => Math.hypot(existing.point.x - point.x, existing.point.y - point.y) < 0.01);
    if (earlier) {
      return { status: 'repeated', ofPoint: earlier.index };
    }
    counted.push({ point, index });
    return { status: 'counted', point };
  });
}

/** Surveyed pile: a triangulated surface through spot heights (m above the base) and the toe at 0 m. */
export function surveyedVolume(input: { readonly footprint: unknown; readonly spotHeights: readonly SpotHeight[] }): Result<VolumeEstimate> {
  const footprint = toFootprint(input.footprint);
  if (!footprint.ok) {
    return footprint;
  }
  if (!Array.isArray(input.spotHeights) || input.spotHeights.length === 0) {
    return fail(engineError('empty', 'spotHeights', 'a surveyed pile needs at least one spot height'));
  }
  const errors: EngineError[] = [];
  input.spotHeights.forEach((spot, index) => {
    errors.push(
      ...checkNumbers([
        [`spotHeights[${index}].lon`, spot?.lon],
        [`spotHeights[${index}].lat`, spot?.lat],
        [`spotHeights[${index}].heightM`, spot?.heightM, 'non-negative'],
      ]),
    );
  });
  if (errors.length > 0) {
    return fail(...errors);
  }
  const { planeRing } = footprint.value;
  const warnings: EngineWarning[] = [...footprint.value.warnings];
  const points: PlanePoint[] = [...planeRing];
  const heights: number[] = planeRing.map(() => 0);
  const placements = placeSpotHeights(footprint.value, input.spotHeights);
  placements.forEach((placement, index) => {
    if (placement.status === 'counted') {
      points.push(placement.point);
      heights.push(input.spotHeights[index].heightM);
    }
  });
  const outside = placements.filter((placement) => placement.status === 'outside').length;
  const duplicates = placements.filter((placement) => placement.status === 'repeated').length;
  if (outside > 0) {
    warnings.push({ code: 'spot-outside-footprint', message: `${outside} spot height(s) lie outside the footprint and were left out.` });
  }
  if (duplicates > 0) {
    warnings.push({ code: 'spot-repeated', message: `${duplicates} spot height(s) repeat a point already measured and were left out.` });
  }
  if (points.length === planeRing.length) {
    return fail(engineError('empty', 'spotHeights', 'no spot height lies inside the footprint'));
  }
  let volumeM3 = 0;
  let coveredM2 = 0;
  let triangleCount = 0;
  const { triangles } = Delaunator.from(points, (point) => point.x, (point) => point.y);
  for (let first = 0; first < triangles.length; first += 3) {
    // delaunator turns its triangles counter-clockwise on screen axes (y down), so clockwise here (y north).
    const a = triangles[first];
    const b = triangles[first + 2];
    const c = triangles[first + 1];
    const pa = points[a];
    const pb = points[b];
    const pc = points[c];
    const areaM2 = ((pb.x - pa.x) * (pc.y - pa.y) - (pb.y - pa.y) * (pc.x - pa.x)) / 2;
    const centre = { x: (pa.x + pb.x + pc.x) / 3, y: (pa.y + pb.y + pc.y) / 3 };
    // Delaunay covers the convex hull; triangles in a bay of a concave toe are not pile.
    if (areaM2 <= 0 || !isInsideRing(centre, planeRing)) {
      continue;
    }
    volumeM3 += (areaM2 * (heights[a] + heights[b] + heights[c])) / 3;
    coveredM2 += areaM2;
    triangleCount += 1;
  }
  const baseM2 = insetAreaM2(planeRing, 0);
  // 1 %: beyond this the surface does not follow a concave toe closely; more toe points would help.
  if (Math.abs(coveredM2 - baseM2) / baseM2 > 0.01) {
    warnings.push({
      code: 'surface-misses-toe',
      message: `The surveyed surface covers ${coveredM2.toFixed(1)} m² of a ${baseM2.toFixed(1)} m² footprint; add points along concave parts of the toe.`,
    });
  }
  return ok({ volumeM3, method: 'surveyed', warnings, triangleCount });
}

/** Sacks: count × mass per sack (kg), and the volume (m³) that mass fills at the bulk density (t/m³). */
export function sacksVolume(input: {
  readonly sackCount: number;
  readonly sackMassKg: number;
  readonly bulkDensityTPerM3: number;
}): Result<VolumeEstimate> {
  const errors = checkNumbers([
    ['sackCount', input.sackCount, 'positive'],
    ['sackMassKg', input.sackMassKg, 'positive'],
    ['bulkDensityTPerM3', input.bulkDensityTPerM3, 'positive'],
  ]);
  if (errors.length === 0 && !Number.isInteger(input.sackCount)) {
    errors.push(engineError('out-of-range', 'sackCount', `sackCount must be a whole number (got ${input.sackCount})`));
  }
  if (errors.length > 0) {
    return fail(...errors);
  }
  const wetMassKg = input.sackCount * input.sackMassKg;
  return ok({ volumeM3: wetMassKg / 1000 / input.bulkDensityTPerM3, method: 'sacks', warnings: [], wetMassKg });
}

/** The pile fields that decide its volume (DESIGN §6 names). */
export interface PileShape {
  readonly shapeModel: ShapeModel;
  readonly footprint?: unknown;
  readonly heightM?: number;
  readonly angleOfReposeDeg?: number;
  readonly spotHeights?: readonly SpotHeight[];
  readonly sackCount?: number;
  readonly sackMassKg?: number;
  readonly bulkDensityTPerM3?: number;
}

/** Volume of a pile by its own shape model. */
export function pileVolume(pile: PileShape): Result<VolumeEstimate> {
  switch (pile.shapeModel) {
    case 'cone': {
      const footprint = parseFootprint(pile.footprint);
      if (!footprint.ok) {
        return footprint;
      }
      const cone = coneVolume({ areaM2: metricsOf(footprint.value).areaM2, heightM: pile.heightM as number });
      return cone.ok ? ok({ ...cone.value, warnings: footprint.value.warnings }) : cone;
    }
    case 'flat-topped':
      return flatToppedVolume({
        footprint: pile.footprint,
        heightM: pile.heightM as number,
        angleOfReposeDeg: pile.angleOfReposeDeg as number,
      });
    case 'surveyed':
      return surveyedVolume({ footprint: pile.footprint, spotHeights: pile.spotHeights ?? [] });
    case 'sacks':
      return sacksVolume({
        sackCount: pile.sackCount as number,
        sackMassKg: pile.sackMassKg as number,
        bulkDensityTPerM3: pile.bulkDensityTPerM3 as number,
      });
    default:
      return fail(engineError('unknown-value', 'shapeModel', `${String(pile.shapeModel)} is not a shape model`, { known: SHAPE_MODELS }));
  }
}
