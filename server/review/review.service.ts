import type { CalibrationFit, EngineError, EstimateSample, PileEstimate, Result } from '../../shared/engine';
import type { PileData, SampleData } from '../../shared/sync/protocol';
import type { RecordView } from '../capture/capture.repository';
import type { CurrentUser } from '../accounts/current-user';
import { assertCan, can } from '../accounts/policy';
import { AppError } from '../lib/errors';
import { digestOfSamples, estimatePileKept } from './estimate-cache';
import { pileById, pilesOfSite, siteImageOf, siteSummary } from './review.repository';
import type { SampleGradeView } from './sample-grades';
import { samplesByPile, siteGrades, type SiteGrades } from './site-grades';
import { SITE_MAP_SAMPLE_FIELDS, type SiteMap, type SiteMapSample } from './site-map-view';
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
function estimateSamples(samples: readonly SampleData[], grades: ReadonlyMap<string, SampleGradeView>): EstimateSample[] {
  return samples
    .filter((sample) => grades.get(sample.id)?.gradeGpt != null)
    .map((sample) => ({ sampleId: sample.id, sampleType: sample.sampleType, assayGpt: grades.get(sample.id)?.assayGpt ?? null, panGpt: grades.get(sample.id)?.panGpt ?? null }));
}

/** A pile's samples newest first, those the estimate counts, and their digest for the kept estimates. */
interface EstimateInputs {
  readonly samples: readonly RecordView<SampleData>[];
  readonly counted: readonly EstimateSample[];
  readonly countedDigest: string;
}

const NO_SAMPLES: EstimateInputs = { samples: [], counted: [], countedDigest: digestOfSamples([]) };

/** Every pile's estimate inputs, worked out once per set of site grades. */
function estimateInputsByPile({ table, grades }: SiteGrades): Map<string, EstimateInputs> {
  const byPile = new Map<string, EstimateInputs>();
  for (const [pileId, samples] of samplesByPile(table.newestFirst)) {
    const counted = estimateSamples(samples, grades);
    byPile.set(pileId, { samples, counted, countedDigest: digestOfSamples(counted) });
  }
  return byPile;
}

/** The engine's estimate of a pile from its inputs (kept: the same inputs give the same answer). */
function estimateOf(pile: PileData, inputs: EstimateInputs, calibration: CalibrationFit | undefined): Result<PileEstimate> {
  const result = estimatePileKept(pileInput(pile), inputs.counted, { calibration }, inputs.countedDigest);
  return withUngradedNote(result, inputs.samples.length - inputs.counted.length);
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
    // The pile's samples newest first, graded with the site's calibration, from one read of the site.
    const graded = await siteGrades(pile.siteId);
    const { grades } = graded;
    const own = graded.derive('review estimate samples by pile', estimateInputsByPile).get(pileId) ?? NO_SAMPLES;
    const samples = own.samples;
    const result = estimateOf(pile, own, graded.calibration);
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
    const { site, image, piles, estimates, samples, grades } = await this.siteData(user, siteId);
    const pileCodes = new Map(piles.map((pile) => [pile.id, pile.code]));
    return {
      site,
      image,
      piles: piles.map((pile, index) => {
        const result = estimates[index];
        return { pile, estimate: result.ok ? result.value : null, estimateErrors: result.ok ? [] : result.errors };
      }),
      samples: samples.map((sample) => ({ ...sample, ...(grades.get(sample.id) as SampleGradeView), pileCode: pileCodes.get(sample.pileId) ?? '' })),
    };
  }

  /**
   * `GET /api/review/sites/:siteId?view=map`: what the site map draws and nothing else, from the
   * same data as the full review. Piles keep their id, code, material and footprint and the
   * estimate's tonnes, contained gold and grade block; each sample is one row of
   * `SITE_MAP_SAMPLE_FIELDS`. About 60 bytes a sample instead of some 800.
   */
  async siteMap(user: CurrentUser, siteId: string): Promise<SiteMap> {
    const { site, image, piles, estimates, samples, grades } = await this.siteData(user, siteId);
    return {
      site,
      image,
      piles: piles.map((pile, index) => {
        const result = estimates[index];
        const estimate = result.ok ? result.value : null;
        return {
          pile: { id: pile.id, code: pile.code, material: pile.material, footprint: pile.footprint },
          estimate: estimate && { dryTonnes: estimate.dryTonnes, containedAuG: estimate.containedAuG, grade: estimate.grade },
        };
      }),
      sampleFields: SITE_MAP_SAMPLE_FIELDS,
      samples: samples.map((sample): SiteMapSample => {
        const [lon, lat] = sample.location?.coordinates ?? [null, null];
        return [sample.code, sample.sampleType, lon, lat, grades.get(sample.id)?.gradeGpt ?? null];
      }),
    };
  }

  /** The site's piles with their estimates and its samples with their grades, for both answers above. */
  private async siteData(user: CurrentUser, siteId: string) {
    assertCan(user, 'site:read');
    const site = await siteSummary(siteId, user.organizationId);
    if (!site || !can(user, 'site:read', { siteId })) {
      throw new AppError('not_found', 'No such site');
    }
    const [piles, graded, image] = await Promise.all([pilesOfSite(siteId), siteGrades(siteId), siteImageOf(siteId)]);
    const inputs = graded.derive('review estimate samples by pile', estimateInputsByPile);
    const estimates = piles.map((pile) => estimateOf(pile, inputs.get(pile.id) ?? NO_SAMPLES, graded.calibration));
    return { site, image: image ? siteImageView(image) : null, piles, estimates, samples: graded.table.newestFirst, grades: graded.grades };
  }
}
