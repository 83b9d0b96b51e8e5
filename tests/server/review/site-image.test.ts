import request from 'supertest';
import { DEMO_SITES } from '../../../server/demo/demo-scenario';
import { signInAs } from '../accounts/support/sign-in';
import { createTestApp, type TestApp } from '../support/test-app';
import { CAMP_BOX, makePng, uploadSiteImage } from './support/review-fixtures';

let testApp: TestApp;
let admin: string;
let geologist: string;
let sampler: string;
const JR = DEMO_SITES[0].id;
const IF = DEMO_SITES[1].id;

beforeAll(async () => {
  testApp = await createTestApp({ env: { MAP_TILE_URL: 'https://tiles.example.test/{z}/{x}/{y}.png' } });
  [admin, geologist, sampler] = await Promise.all(['admin', 'geologist', 'sampler'].map(async (role) => (await signInAs(testApp.app, role)).accessToken));
});

afterAll(() => testApp.close());

const info = (siteId: string, token = geologist) => request(testApp.app).get(`/api/sites/${siteId}/image-info`).set('Authorization', `Bearer ${token}`);

describe('PUT /api/sites/:id/image', () => {
  it('stores a georeferenced image that every reader of the site can fetch, byte for byte', async () => {
    const png = await makePng(80, 40);

    const uploaded = await uploadSiteImage(testApp.app, admin, JR, png).expect(200);

    expect(uploaded.body).toMatchObject({ siteId: JR, contentType: 'image/png', widthPx: 80, heightPx: 40, ...CAMP_BOX });
    const described = await info(JR).expect(200);
    expect(described.body.url).toBe(`/api/sites/${JR}/image?v=${described.body.version}`);
    const fetched = await request(testApp.app).get(described.body.url).set('Authorization', `Bearer ${sampler}`).buffer(true).parse((response, done) => {
      const chunks: Buffer[] = [];
      response.on('data', (chunk: Buffer) => chunks.push(chunk));
      response.on('end', () => done(null, Buffer.concat(chunks)));
    }).expect(200);
    expect(Buffer.compare(fetched.body as Buffer, png)).toBe(0);
    expect(fetched.headers['content-type']).toBe('image/png');
    expect(fetched.headers['cache-control']).toContain('immutable');
  });

  it('moves the box of the stored image when only corners are sent, with a new version', async () => {
    await uploadSiteImage(testApp.app, admin, JR, await makePng()).expect(200);
    const before = (await info(JR).expect(200)).body;
    const moved = { ...CAMP_BOX, east: CAMP_BOX.east + 0.001 };

    const response = await request(testApp.app).put(`/api/sites/${JR}/image`).set('Authorization', `Bearer ${admin}`).send(moved).expect(200);

    expect(response.body.east).toBeCloseTo(moved.east, 12);
    expect(response.body.version).not.toBe(before.version);
  });

  describe('refusals (nothing is stored)', () => {
    it('refuses a file that is not an image with 415', async () => {
      const response = await uploadSiteImage(testApp.app, admin, IF, Buffer.from('not a picture at all, just text'), CAMP_BOX, 'image/png');
      expect(response.status).toBe(415);
      expect(response.body.error.code).toBe('unsupported_media_type');
      await info(IF).expect(404);
    });

    it('refuses a text upload by its type with 415', async () => {
      const response = await uploadSiteImage(testApp.app, admin, IF, Buffer.from('west,south'), CAMP_BOX, 'text/csv');
      expect(response.status).toBe(415);
      await info(IF).expect(404);
    });

    it.each([
      ['a latitude beyond the map', { ...CAMP_BOX, north: 95 }, 'north'],
      ['west east of east', { ...CAMP_BOX, west: CAMP_BOX.east + 0.01 }, 'east'],
      ['a box of a whole country', { west: 30, south: -10, east: 40, north: 0 }, 'east'],
      ['a corner that is not a number', { ...CAMP_BOX, south: 'abc' }, 'south'],
    ])('refuses %s with 400 naming the corner', async (_case, box, field) => {
      const response = await uploadSiteImage(testApp.app, admin, IF, await makePng(), box as Record<string, number | string>);
      expect(response.status).toBe(400);
      expect(response.body.error.details.map((detail: { path: string }) => detail.path)).toContain(field);
      await info(IF).expect(404);
    });

    it('refuses corners alone when the site has no image yet', async () => {
      const response = await request(testApp.app).put(`/api/sites/${IF}/image`).set('Authorization', `Bearer ${admin}`).send(CAMP_BOX);
      expect(response.status).toBe(400);
      await info(IF).expect(404);
    });

    it('refuses a geologist with 403', async () => {
      const response = await uploadSiteImage(testApp.app, geologist, IF, await makePng());
      expect(response.status).toBe(403);
      await info(IF).expect(404);
    });
  });
});

describe('GET /api/sites/:id/image', () => {
  it('answers 404 to a reader who is not a member of the site', async () => {
    await uploadSiteImage(testApp.app, admin, IF, await makePng()).expect(200);
    await info(IF, geologist).expect(200);
    await info(IF, sampler).expect(404);
    await request(testApp.app).get(`/api/sites/${IF}/image`).set('Authorization', `Bearer ${sampler}`).expect(404);
  });
});

describe('GET /api/client-config', () => {
  it('tells the client the tile URL of the deployment without a sign-in', async () => {
    const response = await request(testApp.app).get('/api/client-config').expect(200);
    expect(response.body).toEqual({ mapTileUrl: 'https://tiles.example.test/{z}/{x}/{y}.png' });
  });
});
