/**
 * The four corners of a site image as typed in the upload form, checked with the same rules as the
 * server (`PUT /api/sites/:id/image`), so the form can say what is wrong before anything is sent.
 */

/** The lon/lat box an image covers, north up, in decimal degrees (WGS84). */
export interface ImageCorners {
  readonly west: number;
  readonly south: number;
  readonly east: number;
  readonly north: number;
}

/** The corner fields, in the order the form shows them. */
export const CORNER_FIELDS = ['north', 'west', 'east', 'south'] as const;
export type CornerField = (typeof CORNER_FIELDS)[number];

/** A site image covers one camp: at most half a degree (about 55 km) each way, as the server allows. */
export const MAX_IMAGE_SPAN_DEG = 0.5;

const LIMITS: Record<CornerField, { low: number; high: number; word: 'longitude' | 'latitude' }> = {
  west: { low: -180, high: 180, word: 'longitude' },
  east: { low: -180, high: 180, word: 'longitude' },
  // The map's projection stops at ±85°.
  south: { low: -85, high: 85, word: 'latitude' },
  north: { low: -85, high: 85, word: 'latitude' },
};

/** What is wrong with one corner: a translation key (under siteMap, corners) with its figures. */
export interface CornerProblem {
  readonly key: string;
  readonly params?: Readonly<Record<string, number>>;
}

/** The form's answer: the corners, or what is wrong per field. */
export type CornersCheck =
  | { readonly ok: true; readonly value: ImageCorners }
  | { readonly ok: false; readonly errors: Partial<Record<CornerField, CornerProblem>> };

/** Reads a typed number: a point as the decimal mark, a leading minus for west and south. */
function readNumber(raw: string | number | null | undefined): number | null {
  if (typeof raw === 'number') {
    return Number.isFinite(raw) ? raw : null;
  }
  const text = (raw ?? '').trim();
  return /^[-+]?(\d+(\.\d*)?|\.\d+)$/.test(text) ? Number(text) : null;
}

/** Checks the typed corners: each a number of degrees in range, west of east, south of north, not too large. */
export function checkImageCorners(raw: Readonly<Record<CornerField, string | number | null | undefined>>): CornersCheck {
  const errors: Partial<Record<CornerField, CornerProblem>> = {};
  const values: Partial<Record<CornerField, number>> = {};
  for (const field of CORNER_FIELDS) {
    const { low, high, word } = LIMITS[field];
    const text = typeof raw[field] === 'string' ? (raw[field] as string).trim() : raw[field];
    if (text === '' || text === null || text === undefined) {
      errors[field] = { key: `siteMap.corners.missing.${field}` };
      continue;
    }
    const value = readNumber(text);
    if (value === null) {
      errors[field] = { key: `siteMap.corners.notANumber.${word}` };
    } else if (value < low || value > high) {
      errors[field] = { key: `siteMap.corners.outOfRange.${word}`, params: { low, high } };
    } else {
      values[field] = value;
    }
  }
  const { west, south, east, north } = values;
  if (west !== undefined && east !== undefined) {
    if (!(west < east)) {
      errors.east = { key: 'siteMap.corners.eastOfWest' };
    } else if (east - west > MAX_IMAGE_SPAN_DEG) {
      errors.east = { key: 'siteMap.corners.spanWestEast', params: { span: MAX_IMAGE_SPAN_DEG } };
    }
  }
  if (south !== undefined && north !== undefined) {
    if (!(south < north)) {
      errors.north = { key: 'siteMap.corners.northOfSouth' };
    } else if (north - south > MAX_IMAGE_SPAN_DEG) {
      errors.north = { key: 'siteMap.corners.spanSouthNorth', params: { span: MAX_IMAGE_SPAN_DEG } };
    }
  }
  if (Object.keys(errors).length > 0) {
    return { ok: false, errors };
  }
  return { ok: true, value: { west: west as number, south: south as number, east: east as number, north: north as number } };
}
