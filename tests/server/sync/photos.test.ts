import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Mutation } from '../../../shared/sync/protocol';
import { createSyncTestApp, newPhoto, newPile, newSample, upsert, type SyncTestApp } from './support/sync-test-app';

const FIXTURE_JPEG = readFileSync(join(__dirname, '../../fixtures/pile-photo.jpg'));

describe('photos', () => {
  let app: SyncTestApp;
  let sampleId: string;

  beforeAll(async () => {
    app = await createSyncTestApp();
    const pile = newPile();
    const sample = newSample(pile.id);
    sampleId = sample.id;
    await app.as('sampler').post('/api/sync/push').send({ deviceId: 'device-a', mutations: [upsert('pile', pile), upsert('sample', sample)] }).expect(200);
  });

  afterAll(async () => {
    await app.close();
  });

  async function syncPhotoRecord(): Promise<string> {
    const photo = newPhoto(sampleId);
    const mutations: Mutation[] = [upsert('photo', photo)];
    const response = await app.as('sampler').post('/api/sync/push').send({ deviceId: 'device-a', mutations }).expect(200);
    expect(response.body.results[0].status).toBe('applied');
    return photo.id;
  }

  describe('PUT /api/photos/:uuid', () => {
    it('stores the picture after its record, and again changes nothing', async () => {
      const photoId = await syncPhotoRecord();
      const first = await app.as('sampler').put(`/api/photos/${photoId}`).attach('photo', FIXTURE_JPEG, { filename: 'p.jpg', contentType: 'image/jpeg' }).expect(200);
      const second = await app.as('sampler').put(`/api/photos/${photoId}`).attach('photo', FIXTURE_JPEG, { filename: 'p.jpg', contentType: 'image/jpeg' }).expect(200);
      expect(first.body.storedSizes).toContain('full');
      expect(second.body.id).toBe(photoId);
    });

    it('refuses a PUT with no file for a photo not yet stored, with 400', async () => {
      const photoId = await syncPhotoRecord();
      await app.as('sampler').put(`/api/photos/${photoId}`).expect(400);
    });

    it('refuses a picture whose record has not synced with 404', async () => {
      const response = await app.as('sampler').put('/api/photos/0b6f3c2e-1a4d-4e8b-9c7d-00000000beef').attach('photo', FIXTURE_JPEG, { filename: 'p.jpg', contentType: 'image/jpeg' }).expect(404);
      expect(response.body.error.code).toBe('not_found');
    });

    it('refuses text dressed as a JPEG with 415 and stores nothing', async () => {
      const photoId = await syncPhotoRecord();
      await app.as('sampler').put(`/api/photos/${photoId}`).attach('photo', Buffer.from('not a picture at all'), { filename: 'p.jpg', contentType: 'image/jpeg' }).expect(415);
      await app.as('sampler').get(`/api/photos/${photoId}`).expect(404);
    });

    it('refuses bytes that start like a JPEG but do not decode, with 415', async () => {
      const photoId = await syncPhotoRecord();
      const broken = Buffer.concat([FIXTURE_JPEG.subarray(0, 200), Buffer.alloc(400, 7)]);
      await app.as('sampler').put(`/api/photos/${photoId}`).attach('photo', broken, { filename: 'p.jpg', contentType: 'image/jpeg' }).expect(415);
    });

    it('refuses a file type that is not an image with 415', async () => {
      const photoId = await syncPhotoRecord();
      await app.as('sampler').put(`/api/photos/${photoId}`).attach('photo', Buffer.from('a,b\n1,2'), { filename: 'p.csv', contentType: 'text/csv' }).expect(415);
    });

    it('refuses a picture over the size limit with 413', async () => {
      const photoId = await syncPhotoRecord();
      const huge = Buffer.concat([FIXTURE_JPEG, Buffer.alloc(9 * 1024 * 1024)]);
      const response = await app.as('sampler').put(`/api/photos/${photoId}`).attach('photo', huge, { filename: 'p.jpg', contentType: 'image/jpeg' }).expect(413);
      expect(response.body.error.code).toBe('payload_too_large');
    });
  });

  describe('GET /api/photos/:uuid', () => {
    it('serves the thumbnail once made, smaller than the picture, with long-lived private caching', async () => {
      const photoId = await syncPhotoRecord();
      await app.as('sampler').put(`/api/photos/${photoId}`).attach('photo', FIXTURE_JPEG, { filename: 'p.jpg', contentType: 'image/jpeg' }).expect(200);
      await app.services.imageJobs.idle();

      const response = await app.as('sampler').get(`/api/photos/${photoId}?size=thumb`).expect(200);

      expect(response.headers['content-type']).toBe('image/jpeg');
      expect(response.headers['x-photo-size']).toBe('thumb');
      expect(response.headers['cache-control']).toBe('private, max-age=31536000, immutable');
      expect(Number(response.headers['content-length'])).toBeLessThan(FIXTURE_JPEG.length);
      const listed = await app.as('sampler').get(`/api/photos?ownerEntity=sample&ownerId=${sampleId}`).expect(200);
      expect(listed.body.items.find((item: { id: string }) => item.id === photoId).storedSizes).toEqual(['full', 'thumb']);
    });

    it('answers 304 when the browser already holds it', async () => {
      const photoId = await syncPhotoRecord();
      await app.as('sampler').put(`/api/photos/${photoId}`).attach('photo', FIXTURE_JPEG, { filename: 'p.jpg', contentType: 'image/jpeg' }).expect(200);
      const first = await app.as('sampler').get(`/api/photos/${photoId}`).expect(200);
      await app.as('sampler').get(`/api/photos/${photoId}`).set('if-none-match', first.headers['etag']).expect(304);
    });

    it('refuses a role that reads no site with 403', async () => {
      const photoId = await syncPhotoRecord();
      await app.as('sampler').put(`/api/photos/${photoId}`).attach('photo', FIXTURE_JPEG, { filename: 'p.jpg', contentType: 'image/jpeg' }).expect(200);
      await app.as('lab').get(`/api/photos/${photoId}`).expect(403);
    });
  });
});
