import { randomUUID } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { deflateSync } from 'node:zlib';
import request from 'supertest';
import { Pile } from '../../server/capture/pile.model';
import { DEMO_PASSWORD, DEMO_SITES } from '../../server/demo/demo-scenario';
import { ImageJobs } from '../../server/photos/image-jobs';
import { createTestApp, type TestApp } from '../server/support/test-app';
import { CAMP_BOX, uploadSiteImage } from '../server/review/support/review-fixtures';
import { newPhoto, newPile, newSample, person, upsert } from '../server/sync/support/sync-test-app';
import { reportReliabilityFigures } from './support/figures';

/**
 * The hand-made part of the bad-input corpus: payloads a fuzzer would rarely build but an attacker
 * or a broken phone will — oversized and deeply nested JSON, invalid UTF-8, broken GeoJSON, files
 * that only pretend to be images, and a PNG that would need gigabytes to decode.
 */
const FIXTURE_PHOTO = readFileSync(join(__dirname, '../fixtures/pile-photo.jpg'));
const JR = DEMO_SITES[0];
let testApp: TestApp;
const tokens: Record<string, string> = {};
let refused = 0;

jest.setTimeout(60_000);

beforeAll(async () => {
  testApp = await createTestApp();
  for (const role of ['sampler', 'admin']) {
    const response = await request(testApp.app).post('/api/auth/login').send({ email: person(role).email, password: DEMO_PASSWORD });
    tokens[role] = response.body.accessToken;
  }
});

afterAll(async () => {
  reportReliabilityFigures('bad input corpus (hand-made)', { refused });
  await testApp.close();
});

afterEach(() => jest.restoreAllMocks());

const push = (body: string | object, contentType = 'application/json') =>
  request(testApp.app).post('/api/sync/push').set('Authorization', `Bearer ${tokens['sampler']}`).set('Content-Type', contentType).send(body);

function expectRefused(response: request.Response, status: number, code: string) {
  expect({ status: response.status, code: response.body?.error?.code, hasMessage: typeof response.body?.error?.message === 'string' })
    .toEqual({ status, code, hasMessage: true });
  refused += 1;
}

/** CRC-32 as PNG chunks need it (ISO 3309). */
function crc32(bytes: Buffer): number {
  let crc = 0xffffffff;
  for (const byte of bytes) {
    crc ^= byte;
    for (let bit = 0; bit < 8; bit += 1) {
      crc = (crc >>> 1) ^ (0xedb88320 & -(crc & 1));
    }
  }
  return (crc ^ 0xffffffff) >>> 0;
}

function pngChunk(type: string, data: Buffer): Buffer {
  const length = Buffer.alloc(4);
  length.writeUInt32BE(data.length);
  const body = Buffer.concat([Buffer.from(type, 'ascii'), data]);
  const crc = Buffer.alloc(4);
  crc.writeUInt32BE(crc32(body));
  return Buffer.concat([length, body, crc]);
}

/** A small, well-formed PNG file that declares `width` × `height` RGBA pixels: a decompression bomb when huge. */
function pngDeclaring(width: number, height: number): Buffer {
  const header = Buffer.alloc(13);
  header.writeUInt32BE(width, 0);
  header.writeUInt32BE(height, 4);
  header.set([8, 6, 0, 0, 0], 8);
  // A few rows of zeros; the decoder would still have to allocate width × height × 4 bytes.
  const rows = deflateSync(Buffer.alloc(Math.min(width * 4 + 1, 1 << 20) * 4));
  return Buffer.concat([Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]), pngChunk('IHDR', header), pngChunk('IDAT', rows), pngChunk('IEND', Buffer.alloc(0))]);
}

/** A pile, a sample and a photo record synced, so the photo's bytes may be uploaded. */
async function syncedPhotoId(): Promise<string> {
  const pile = newPile();
  const sample = newSample(pile.id);
  const photo = newPhoto(sample.id);
  const response = await push({ deviceId: 'hostile-device', mutations: [upsert('pile', pile), upsert('sample', sample), upsert('photo', photo)] });
  expect(response.body.results.map((result: { status: string }) => result.status)).toEqual(['applied', 'applied', 'applied']);
  return photo.id;
}

const uploadPhoto = (photoId: string, bytes: Buffer, contentType = 'image/jpeg') =>
  request(testApp.app).put(`/api/photos/${photoId}`).set('Authorization', `Bearer ${tokens['sampler']}`).attach('photo', bytes, { filename: 'photo', contentType });

describe('POST /api/sync/push with hostile JSON', () => {
  it('refuses a body over the 2 MB limit with 413 and writes nothing', async () => {
    const before = await Pile.count();
    const notes = 'x'.repeat(3500);
    const mutations = Array.from({ length: 700 }, () => upsert('pile', newPile({ notes })));
    expectRefused(await push({ deviceId: 'hostile-device', mutations }), 413, 'payload_too_large');
    expect(await Pile.count()).toBe(before);
  });

  it('refuses JSON nested 100,000 deep with a 4xx, not a crash', async () => {
    const deep = `{"deviceId":"d","mutations":${'['.repeat(100_000)}${']'.repeat(100_000)}}`;
    const response = await push(deep);
    expect(response.status).toBeGreaterThanOrEqual(400);
    expect(response.status).toBeLessThan(500);
    expect(typeof response.body.error.code).toBe('string');
    refused += 1;
  });

  it('refuses a deeply nested record inside a well-formed batch, whole or as rejected, and writes nothing', async () => {
    const before = await Pile.count();
    let nested: unknown = 'bottom';
    for (let depth = 0; depth < 5000; depth += 1) {
      nested = { nested };
    }
    const response = await push({ deviceId: 'hostile-device', mutations: [upsert('pile', { ...newPile(), notes: nested })] });
    expect(response.status === 200 ? response.body.results[0].status : response.body.error.code).toMatch(/^(rejected|validation_failed|bad_request)$/);
    expect(await Pile.count()).toBe(before);
    refused += 1;
  });

  it('refuses a body that is not valid UTF-8 with 400, instead of storing replacement characters', async () => {
    const before = await Pile.count();
    const json = Buffer.from(JSON.stringify({ deviceId: 'hostile-device', mutations: [upsert('pile', newPile({ notes: 'MARK' }))] }));
    const at = json.indexOf('MARK');
    const invalid = Buffer.concat([json.subarray(0, at), Buffer.from([0xc3, 0x28, 0xff, 0xfe]), json.subarray(at + 4)]);
    const response = await request(testApp.app).post('/api/sync/push').set('Authorization', `Bearer ${tokens['sampler']}`)
      .set('Content-Type', 'application/json').serialize((body: Buffer) => body as unknown as string).send(invalid);
    expectRefused(response, 400, 'bad_request');
    expect(await Pile.count()).toBe(before);
  });

  it('refuses a body sent as another content type with a 4xx', async () => {
    const response = await push('deviceId=d&mutations=1', 'application/x-www-form-urlencoded');
    expect(response.status).toBeGreaterThanOrEqual(400);
    expect(response.status).toBeLessThan(500);
    refused += 1;
  });
});

describe('pile footprints that are not valid GeoJSON', () => {
  const ring = (corners: number[][]) => ({ type: 'Polygon', coordinates: [[...corners, corners[0]]] });
  const cases: [string, unknown][] = [
    ['self-intersecting (a bow tie)', ring([[33.4521, -4.0515], [33.4525, -4.0519], [33.4525, -4.0515], [33.4521, -4.0519]])],
    ['longitude out of range', ring([[190, -4.0515], [33.4525, -4.0515], [33.4525, -4.0519]])],
    ['latitude out of range', ring([[33.4521, -95], [33.4525, -4.0515], [33.4525, -4.0519]])],
    ['corners on one line', ring([[33.4521, -4.0515], [33.4523, -4.0515], [33.4525, -4.0515]])],
    ['a ring that does not close', { type: 'Polygon', coordinates: [[[33.4521, -4.0515], [33.4525, -4.0515], [33.4525, -4.0519], [33.4521, -4.0519]]] }],
    ['a point instead of a polygon', { type: 'Point', coordinates: [33.4521, -4.0515] }],
    ['NaN smuggled as a string', ring([['NaN', -4.0515] as unknown as number[], [33.4525, -4.0515], [33.4525, -4.0519]])],
  ];

  it.each(cases)('rejects a pushed pile whose footprint is %s, and stores nothing', async (_what, footprint) => {
    const pile = { ...newPile(), footprint };
    const response = await push({ deviceId: 'hostile-device', mutations: [upsert('pile', pile)] });
    expect(response.status).toBe(200);
    expect(response.body.results[0].status).toBe('rejected');
    expect(await Pile.count({ where: { id: pile.id } })).toBe(0);
    refused += 1;
  });

  it('accepts a clockwise ring (RFC 7946 asks readers not to refuse the other winding) and measures the same area', async () => {
    const counterClockwise = newPile();
    const corners = counterClockwise.footprint?.coordinates[0] as [number, number][];
    const clockwise = newPile({ footprint: { type: 'Polygon', coordinates: [[...corners].reverse()] } });
    const response = await push({ deviceId: 'hostile-device', mutations: [upsert('pile', counterClockwise), upsert('pile', clockwise)] });
    expect(response.body.results.map((result: { status: string }) => result.status)).toEqual(['applied', 'applied']);
    const estimate = (id: string) => request(testApp.app).get(`/api/piles/${id}/estimate`).set('Authorization', `Bearer ${tokens['sampler']}`);
    const [first, second] = await Promise.all([estimate(counterClockwise.id), estimate(clockwise.id)]);
    expect(second.status).toBe(first.status);
    expect(second.body).toEqual({ ...first.body, ...(first.body.pileId ? { pileId: clockwise.id } : {}) });
  });
});

describe('PUT /api/photos/:uuid with files that are not what they claim', () => {
  it('refuses a text file named as a JPEG with 415', async () => {
    expectRefused(await uploadPhoto(await syncedPhotoId(), Buffer.from('<?php system($_GET["c"]); ?>')), 415, 'unsupported_media_type');
  });

  it('refuses a JPEG cut off after its first kilobyte with 415', async () => {
    expectRefused(await uploadPhoto(await syncedPhotoId(), FIXTURE_PHOTO.subarray(0, 1024)), 415, 'unsupported_media_type');
  });

  it('refuses a PNG sent as a JPEG with 415', async () => {
    expectRefused(await uploadPhoto(await syncedPhotoId(), pngDeclaring(4, 4)), 415, 'unsupported_media_type');
  });

  it('refuses a PNG declaring 100,000 × 100,000 pixels before decoding it', async () => {
    const decode = jest.spyOn(ImageJobs.prototype, 'decodeThenThumbnail');
    const response = await uploadPhoto(await syncedPhotoId(), pngDeclaring(100_000, 100_000), 'image/png');
    expectRefused(response, 413, 'payload_too_large');
    expect(decode).not.toHaveBeenCalled();
  });

  it('still takes a real photo after all that', async () => {
    const response = await uploadPhoto(await syncedPhotoId(), FIXTURE_PHOTO);
    expect(response.status).toBe(200);
    expect(response.body.storedSizes).toContain('full');
  });
});

describe('PUT /api/sites/:id/image with a decompression bomb', () => {
  it('refuses a PNG declaring 60,000 × 60,000 pixels before decoding it', async () => {
    const decode = jest.spyOn(ImageJobs.prototype, 'decodeThenThumbnail');
    const response = await uploadSiteImage(testApp.app, tokens['admin'], JR.id, pngDeclaring(60_000, 60_000), CAMP_BOX);
    expectRefused(response, 413, 'payload_too_large');
    expect(decode).not.toHaveBeenCalled();
  });
});

describe('ids that try to leave the photo folder', () => {
  it.each(['..%2F..%2Fheapsight.sqlite', '%2e%2e%2f%2e%2e%2fheapsight.sqlite', `${randomUUID()}%2F..%2F..%2Fheapsight.sqlite`])('GET /api/photos/%s answers a 4xx and never a file', async (id) => {
    const response = await request(testApp.app).get(`/api/photos/${id}`).set('Authorization', `Bearer ${tokens['sampler']}`);
    expect(response.status).toBeGreaterThanOrEqual(400);
    expect(response.status).toBeLessThan(500);
    expect(response.headers['content-type']).toMatch(/json/);
    refused += 1;
  });
});
