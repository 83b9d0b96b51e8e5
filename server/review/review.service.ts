import { estimatePile, type EngineError, type EstimateSample, type PileEstimate, type Result } from '../../shared/engine';
import type { PileData, SampleData } from '../../shared/sync/protocol';
import type { RecordView } from '../capture/capture.repository';
import type { CurrentUser } from '../accounts/current-user';
import { assertCan, can } from '../accounts/policy';
import { AppError } from '../lib/errors';
import { pileById, pilesOfSite, samplesOf, siteImageOf, siteSummary } from './review.repository';
import { gradesOfSamples, type SampleGradeView } from './sample-grades';
import { siteImageView, type SiteImageView } from './site-image.service';

/** A pile's estimate as the API answers it: the engine's result plus the grades it was built from. */
export type PileEstimateView = PileEstimate & {
  readonly pileId: string;
  readonly sampleGrades: readonly { sampleId: string; code: string; sampleType: SampleData['sampleType']; gradeGpt: number | null; gradeSource: string | null }[];
};

/** A pile row of the review desk: the record and a summary of its estimate (or why there is none). */
export interface ReviewPile {
  readonly pile: RecordView<PileData>;
  readonly estimate: PileEstimate | null;
  readonly estimateErrors: readonly EngineError[];
}

/** A sample row of the review desk: the record, its pile's code and its grade from the engine. */
export type ReviewSample = RecordView<SampleData> & SampleGradeView & { readonly pileCode: string };

/** Everything the site map and the tables of one site need, in one answer. */
export interface SiteReview {
  readonly site: { readonly id: string; readonly code: string; readonly name: string };
  readonly image: SiteImageView | null;
  readonly piles: readonly ReviewPile[];
  readonly samples: readonly ReviewSample[];
}

/** The engine's inputs for a pile record (DESIGN §6 names map one to one; nulls become "not given"). */
function pileInput(pile: PileData) {
  return {
    material: pile.material, footprint: pile.footprint ?? undefined, heightM: pile.heightM ?? undefined, shapeModel: pile.shapeModel,
    angleOfReposeDeg: pile.angleOfReposeDeg, bulkDensityTPerM3: pile.bulkDensityTPerM3, moisturePct: pile.moisturePct,
    spotHeights: pile.spotHeights ?? undefined, sackCount: pile.sackCount ?? undefined, sackMassKg: pile.sackMassKg ?? undefined,
  };
}

/** The samples the estimate weighs: those with a grade (the rest are listed but not counted). */
function estimateSamples(samples: readonly SampleData[], grades: Map<string, SampleGradeView>): EstimateSample[] {
  return samples
    .filter((sample) => grades.get(sample.id)?.gradeGpt != null)
    .map((sample) => ({ sampleId: sample.id, sampleType: sample.sampleType, assayGpt: grades.get(sample.id)?.assayGpt ?? null, panGpt: grades.get(sample.id)?.panGpt ?? null }));
}

function withUngradedNote(result: Result<PileEstimate>, ungraded: number): Result<PileEstimate> {
  if (!result.ok || ungraded === 0) {
    return result;
  }
  return { ok: true, value: { ...result.value, assumptions: [...result.value.assumptions, `${ungraded} sample(s) with no pan test or assay yet left out of the grade`] } };
}

/** The review desk: estimates recomputed from stored data by the engine, and the site's data for map and tables. */
export class ReviewService {
  /** `GET /api/piles/:id/estimate`: never taken from a client, always worked out here from what is stored. */
  async estimate(user: CurrentUser, pileId: string): Promise<PileEstimateView> {
    assertCan(user, 'site:read');
    const pile = await pileById(pileId);
    if (!pile || !can(user, 'site:read', { siteId: pile.siteId })) {
      throw new AppError('not_found', 'No such pile');
    }
    const samples = await samplesOf({ siteId: pile.siteId, pileId });
    const { grades, calibration } = await gradesOfSamples(pile.siteId, samples);
    const counted = estimateSamples(samples, grades);
    const result = withUngradedNote(estimatePile(pileInput(pile), counted, { calibration }), samples.length - counted.length);
    if (!result.ok) {
      throw new AppError('validation_failed', 'The pile cannot be estimated from its stored data', result.errors);
    }
    return {
      ...result.value,
      pileId,
      sampleGrades: samples.map((sample) => ({
        sampleId: sample.id, code: sample.code, sampleType: sample.sampleType,
        gradeGpt: grades.get(sample.id)?.gradeGpt ?? null, gradeSource: grades.get(sample.id)?.gradeSource ?? null,
      })),
    };
  }

  /** `GET /api/review/sites/:siteId`: piles with their estimates, samples with their grades, the site image. */
  async siteReview(user: CurrentUser, siteId: string): Promise<SiteReview> {
    assertCan(user, 'site:read');
    const site = await siteSummary(siteId, user.organizationId);
    if (!site || !can(user, 'site:read', { siteId })) {
      throw new AppError('not_found', 'No such site');
    }
    const [piles, samples, image] = await Promise.all([pilesOfSite(siteId), samplesOf({ siteId }), siteImageOf(siteId)]);
    const { grades, calibration } = await gradesOfSamples(siteId, samples);
    const samplesByPile = new Map<string, SampleData[]>();
    for (const sample of samples) {
      const list = samplesByPile.get(sample.pileId) ?? [];
      list.push(sample);
      samplesByPile.set(sample.pileId, list);
    }
    const pileCodes = new Map(piles.map((pile) => [pile.id, pile.code]));
    return {
      site,
      image: image ? siteImageView(image) : null,
      piles: piles.map((pile) => {
        const own = samplesByPile.get(pile.id) ?? [];
        const counted = estimateSamples(own, grades);
        const result = withUngradedNote(estimatePile(pileInput(pile), counted, { calibration }), own.length - counted.length);
        return { pile, estimate: result.ok ? result.value : null, estimateErrors: result.ok ? [] : result.errors };
      }),
      samples: samples.map((sample) => ({ ...sample, ...(grades.get(sample.id) as SampleGradeView), pileCode: pileCodes.get(sample.pileId) ?? '' })),
    };
  }
}
