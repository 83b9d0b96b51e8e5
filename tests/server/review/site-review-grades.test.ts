import request from 'supertest';
import { sampleGradesForPile } from '../../../server/lab/assay-grades';
import { IF, JR, batchBody, makeSamples, resultsCsv, tokenFor } from '../lab/support/lab-fixtures';
import { createTestApp, type TestApp } from '../support/test-app';

/**
 * The Samples table and the site map read each sample's grade from `GET /api/review/sites/:siteId`.
 * That grade must be the lab loop's one answer per sample (`sampleGradesForPile`): the assay where
 * there is one, else the calibrated pan estimate when calibration is on, else the pan estimate.
 */
let testApp: TestApp;
let geologist: string;

beforeAll(async () => {
  testApp = await createTestApp();
  geologist = await tokenFor(testApp.app, 'geologist');
});
afterAll(() => testApp.close());

const as = (token: string) => ({
  get: (url: string) => request(testApp.app).get(url).set('Authorization', `Bearer ${token}`),
  post: (url: string) => request(testApp.app).post(url).set('Authorization', `Bearer ${token}`),
  put: (url: string) => request(testApp.app).put(url).set('Authorization', `Bearer ${token}`),
});

interface ReviewSampleBody {
  id: string;
  pileId: string;
  gradeGpt: number | null;
  gradeSource: string | null;
  assayGpt: number | null;
  isBelowDetection: boolean;
  panGpt: number | null;
}

/** Makes one pile of samples with these pan estimates and imports these assays (null: none) for them. */
async function pileWithAssays(pans: readonly (number | null)[], assays: readonly (string | null)[]) {
  const samples = await makeSamples(testApp.app, geologist, pans.map((panGpt) => ({ panGpt })));
  const assayedIds = samples.ids.filter((_, index) => assays[index] !== null);
  const batch = (await as(geologist).post('/api/lab-batches').send(batchBody(assayedIds)).expect(201)).body;
  const rows = batch.items.map((item: { labCode: string; sampleId: string }) => [item.labCode, assays[samples.ids.indexOf(item.sampleId)] as string]);
  await as(geologist).post(`/api/lab-batches/${batch.id}/results?dryRun=false`).attach('file', Buffer.from(resultsCsv(rows)), 'results.csv').expect(200);
  return samples;
}

async function reviewSamplesOf(pileId: string): Promise<ReviewSampleBody[]> {
  const review = (await as(geologist).get(`/api/review/sites/${JR.id}`).expect(200)).body;
  return (review.samples as ReviewSampleBody[]).filter((sample) => sample.pileId === pileId);
}

describe('GET /api/review/sites/:siteId', () => {
  describe('when some samples of a pile have assays', () => {
    it('gives each sample the grade and source of sampleGradesForPile: assay first, below detection at half the limit, else pan, else none', async () => {
      // Arrange: assayed with a pan test, pan only, assayed below detection without a pan test, neither.
      const samples = await pileWithAssays([0.3, 0.2, null, null], ['0.42', null, '<0.01', null]);

      // Act
      const shown = await reviewSamplesOf(samples.pileId);
      const expected = await sampleGradesForPile(samples.pileId);

      // Assert
      const byId = new Map(shown.map((sample) => [sample.id, sample]));
      expect(samples.ids.map((id) => [byId.get(id)?.gradeGpt, byId.get(id)?.gradeSource])).toEqual([[0.42, 'assay'], [0.2, 'pan'], [0.005, 'assay'], [null, null]]);
      expect(samples.ids.map((id) => [byId.get(id)?.assayGpt, byId.get(id)?.isBelowDetection, byId.get(id)?.panGpt])).toEqual([[0.42, false, 0.3], [null, false, 0.2], [0.005, true, null], [null, false, null]]);
      expect(expected.map((entry) => [entry.sampleId, entry.gradeGpt, entry.source])).toEqual(
        expected.map((entry) => [entry.sampleId, byId.get(entry.sampleId)?.gradeGpt, byId.get(entry.sampleId)?.gradeSource]),
      );
    });
  });

  describe('when the site calibration is switched on', () => {
    it('gives pan-only samples the calibrated pan grade, the same as sampleGradesForPile', async () => {
      // Arrange: ten routine pairs with assay = 0.1 + 1.5 × pan (plus a small wobble), then a pan-only sample.
      const pans = [0.2, 0.4, 0.6, 0.8, 1.0, 1.2, 1.4, 1.6, 1.8, 2.0];
      const wobble = [0.01, -0.01, 0.02, -0.02, 0, 0.01, -0.01, 0.02, -0.02, 0];
      await pileWithAssays(pans, pans.map((pan, index) => (0.1 + 1.5 * pan + wobble[index]).toFixed(3)));
      await as(geologist).put(`/api/calibration/${JR.id}`).send({ isApplied: true }).expect(200);
      const panOnly = await makeSamples(testApp.app, geologist, [{ panGpt: 1 }]);

      // Act
      const [shown] = await reviewSamplesOf(panOnly.pileId);
      const [expected] = await sampleGradesForPile(panOnly.pileId);

      // Assert
      expect(shown.gradeSource).toBe('calibrated-pan');
      expect(shown.gradeGpt).toBeCloseTo(1.6, 1);
      expect([shown.gradeGpt, shown.gradeSource]).toEqual([expected.gradeGpt, expected.source]);
    });
  });

  describe('refusals', () => {
    it('answers 404 for a site the user is no member of, 400 for a malformed id or an unknown query, 401 without sign-in', async () => {
      const sampler = await tokenFor(testApp.app, 'sampler');
      const outside = await as(sampler).get(`/api/review/sites/${IF.id}`).expect(404);
      expect(outside.body.samples).toBeUndefined();
      await as(geologist).get('/api/review/sites/not-a-uuid').expect(400);
      await as(geologist).get(`/api/review/sites/${JR.id}?limit=5`).expect(400);
      await request(testApp.app).get(`/api/review/sites/${JR.id}`).expect(401);
    });
  });
});
