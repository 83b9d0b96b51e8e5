import { randomUUID } from 'node:crypto';
import type { Express } from 'express';
import { Jimp } from 'jimp';
import request from 'supertest';

/** A small PNG made in memory (a flat colour), standing in for a drone orthophoto. */
export async function makePng(width = 64, height = 48): Promise<Buffer> {
  return new Jimp({ width, height, color: 0x8899aaff }).getBuffer('image/png');
}

/** A north-up box of about 100 m around the demo camp. */
export const CAMP_BOX = { west: 33.4510, south: -4.0520, east: 33.4525, north: -4.0505 } as const;

/** Uploads a site image as the caller (multipart: the file and its four corners). */
export function uploadSiteImage(app: Express, token: string, siteId: string, bytes: Buffer, box: Record<string, number | string> = CAMP_BOX, contentType = 'image/png') {
  let call = request(app).put(`/api/sites/${siteId}/image`).set('Authorization', `Bearer ${token}`);
  for (const [field, value] of Object.entries(box)) {
    call = call.field(field, String(value));
  }
  return call.attach('image', bytes, { filename: 'site.png', contentType });
}

/**
 * A square footprint of `sideM` metres centred on (lon, lat), as a GeoJSON ring. Metres per degree
 * on the WGS84 ellipsoid by the usual series (meridian: 111132.954 − 559.822 cos 2φ; parallel:
 * 111319.49 cos φ / √(1 − e² sin² φ)), good to millimetres over tens of metres.
 */
export function squareFootprint(lon: number, lat: number, sideM: number) {
  const phi = (lat * Math.PI) / 180;
  const metresPerDegreeLat = 111132.954 - 559.822 * Math.cos(2 * phi) + 1.175 * Math.cos(4 * phi);
  const metresPerDegreeLon = (111319.49 * Math.cos(phi)) / Math.sqrt(1 - 0.00669438 * Math.sin(phi) ** 2);
  const halfLat = sideM / 2 / metresPerDegreeLat;
  const halfLon = sideM / 2 / metresPerDegreeLon;
  return {
    type: 'Polygon' as const,
    coordinates: [[
      [lon - halfLon, lat - halfLat], [lon + halfLon, lat - halfLat], [lon + halfLon, lat + halfLat], [lon - halfLon, lat + halfLat], [lon - halfLon, lat - halfLat],
    ]],
  };
}

/** Pushes mutations through sync as the caller; answers the per-mutation results. */
export async function push(app: Express, token: string, mutations: readonly { entity: string; data: { id: string } & Record<string, unknown> }[], deviceId = 'review-test-device') {
  const response = await request(app).post('/api/sync/push').set('Authorization', `Bearer ${token}`).send({
    deviceId,
    mutations: mutations.map((mutation) => ({ mutationId: randomUUID(), entity: mutation.entity, id: mutation.data.id, op: 'upsert', baseRevision: null, data: mutation.data })),
  });
  return response.body.results as { status: string; revision?: number; errors?: unknown }[];
}
