import request from 'supertest';
import { JR, batchBody, makeSamples, resultsCsv, tokenFor } from '../lab/support/lab-fixtures';
import { createTestApp, type TestApp } from '../support/test-app';

/**
 * The Samples screen pages `GET /api/samples` instead of the whole site review, so each item
 * carries its pile's code and its grade. That grade is worked out for the page alone, and must be
 * the review desk's answer for the same sample (`GET /api/review/sites/:siteId`): the assay where
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

interface GradedItem {
  id: string;
  pileId: string;
  pileCode: string;
  gradeGpt: number | null;
  gradeSource: string | null;
}

/** Makes one pile of samples with these pan estimates and imports these assays (null: none) for them. */
async function pileWithAssays(pans: readonly (number | null)[], assays: readonly (string | null)[]) {
  const samples = await makeSamples(testApp.app, geologist, pans.map((panGpt) => ({ panGpt })));
  await importAssays(samples.ids, assays);
  return samples;
}

async function importAssays(ids: readonly string[], assays: readonly (string | null)[]) {
  const assayedIds = ids.filter((_, index) => assays[index] !== null);
  const batch = (await as(geologist).post('/api/lab-batches').send(batchBody(assayedIds)).expect(201)).body;
  const rows = batch.items.map((item: { labCode: string; sampleId: string }) => [item.labCode, assays[ids.indexOf(item.sampleId)] as string]);
  await as(geologist).post(`/api/lab-batches/${batch.id}/results?dryRun=false`).attach('file', Buffer.from(resultsCsv(rows)), 'results.csv').expect(200);
}

/** The pile's samples as one page of the list answers them. */
async function listedOf(pileId: string): Promise<GradedItem[]> {
  return (await as(geologist).get(`/api/samples?siteId=${JR.id}&pileId=${pileId}&limit=500`).expect(200)).body.items;
}

/** The same samples as the full site review grades them. */
async function reviewedOf(pileId: string): Promise<Map<string, GradedItem>> {
  const review = (await as(geologist).get(`/api/review/sites/${JR.id}`).expect(200)).body;
  return new Map((review.samples as GradedItem[]).filter((sample) => sample.pileId === pileId).map((sample) => [sample.id, sample]));
}

const gradesOf = (items: readonly GradedItem[]) => items.map((item) => [item.id, item.gradeGpt, item.gradeSource]);

describe('GET /api/samples grades', () => {
  it('gives each item its pile code and the review desk\'s grade: assay first, below detection at half the limit, else pan, else none', async () => {
    // Arrange: assayed with a pan test, pan only, assayed below detection without a pan test, neither.
    const samples = await pileWithAssays([0.3, 0.2, null, null], ['0.42', null, '<0.01', null]);

    // Act
    const listed = await listedOf(samples.pileId);
    const reviewed = await reviewedOf(samples.pileId);

    // Assert
    const byId = new Map(listed.map((item) => [item.id, item]));
    expect(samples.ids.map((id) => [byId.get(id)?.gradeGpt, byId.get(id)?.gradeSource])).toEqual([[0.42, 'assay'], [0.2, 'pan'], [0.005, 'assay'], [null, null]]);
    expect(listed.map((item) => item.pileCode)).toEqual(samples.ids.map(() => samples.pileCode));
    expect(gradesOf(listed)).toEqual(gradesOf(listed.map((item) => reviewed.get(item.id) as GradedItem)));
  });

  it('grades the items of any page alike, whatever the sort', async () => {
    const samples = await pileWithAssays([0.5, 0.6, 0.7, null, 0.9], [null, '1.1', null, '0.8', null]);
    const whole = await listedOf(samples.pileId);
    const paged: GradedItem[] = [];
    for (const offset of [0, 2, 4]) {
      paged.push(...(await as(geologist).get(`/api/samples?pileId=${samples.pileId}&sort=code&direction=desc&limit=2&offset=${offset}`).expect(200)).body.items);
    }
    const wholeById = new Map(whole.map((item) => [item.id, item]));
    expect(paged).toHaveLength(5);
    expect(gradesOf(paged)).toEqual(gradesOf(paged.map((item) => wholeById.get(item.id) as GradedItem)));
  });

  describe('when the site calibration is switched on', () => {
    it('gives pan-only items the calibrated pan grade of the review desk, and follows a new import and the switch', async () => {
      // Arrange: ten routine pairs with assay = 0.1 + 1.5 × pan (plus a small wobble), then a pan-only sample.
      const pans = [0.2, 0.4, 0.6, 0.8, 1.0, 1.2, 1.4, 1.6, 1.8, 2.0];
      const wobble = [0.01, -0.01, 0.02, -0.02, 0, 0.01, -0.01, 0.02, -0.02, 0];
      await pileWithAssays(pans, pans.map((pan, index) => (0.1 + 1.5 * pan + wobble[index]).toFixed(3)));
      await as(geologist).put(`/api/calibration/${JR.id}`).send({ isApplied: true }).expect(200);
      const panOnly = await makeSamples(testApp.app, geologist, [{ panGpt: 1 }]);

      // Act
      const [listed] = await listedOf(panOnly.pileId);
      const reviewed = (await reviewedOf(panOnly.pileId)).get(listed.id) as GradedItem;

      // Assert
      expect(listed.gradeSource).toBe('calibrated-pan');
      expect(listed.gradeGpt).toBeCloseTo(1.6, 1);
      expect([listed.gradeGpt, listed.gradeSource]).toEqual([reviewed.gradeGpt, reviewed.gradeSource]);

      // Ten more pairs on a steeper line move the fit (an import moves no data revision): the kept line must follow.
      const steeper = await makeSamples(testApp.app, geologist, pans.map((panGpt) => ({ panGpt })));
      expect((await listedOf(panOnly.pileId))[0].gradeGpt).toBe(listed.gradeGpt);
      await importAssays(steeper.ids, pans.map((pan, index) => (0.1 + 4 * pan + wobble[index]).toFixed(3)));
      const [relisted] = await listedOf(panOnly.pileId);
      const rereviewed = (await reviewedOf(panOnly.pileId)).get(listed.id) as GradedItem;
      expect(relisted.gradeGpt).toBeGreaterThan(2);
      expect([relisted.gradeGpt, relisted.gradeSource]).toEqual([rereviewed.gradeGpt, rereviewed.gradeSource]);

      // Switched off: the pan estimate as it stands.
      await as(geologist).put(`/api/calibration/${JR.id}`).send({ isApplied: false }).expect(200);
      const [uncalibrated] = await listedOf(panOnly.pileId);
      expect([uncalibrated.gradeGpt, uncalibrated.gradeSource]).toEqual([1, 'pan']);
    });
  });
});
