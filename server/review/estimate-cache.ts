import { createHash } from 'node:crypto';
import { estimatePile, type EstimateOptions, type EstimateSample, type PileEstimate, type PileInput, type Result } from '../../shared/engine';

/**
 * `estimatePile` with its answers kept in process, keyed by a digest of everything it is given.
 * The estimate is a pure function of its inputs, and its grade interval is a bootstrap of 2,000
 * resamples with a fixed seed, so the same inputs always give the same answer; working it out
 * again is what cost the site review and the shortlist most of their CPU (some 5 ms a pile of 200
 * graded samples). A change to anything that feeds it (a pile edit, a new sample, pan test or
 * assay, the calibration, the confidence level) gives another digest, so nothing is ever stale.
 * The answers are shared between callers: read them, never change them.
 */
const KEPT = 2_000;
const kept = new Map<string, Result<PileEstimate>>();

export function estimatePileKept(pile: PileInput, samples: readonly EstimateSample[], options: EstimateOptions = {}, samplesDigest = digestOfSamples(samples)): Result<PileEstimate> {
  const key = createHash('sha1').update(JSON.stringify([pile, options, samplesDigest])).digest('base64');
  const held = kept.get(key);
  if (held) {
    kept.delete(key);
    kept.set(key, held);
    return held;
  }
  const result = estimatePile(pile, samples, options);
  kept.set(key, result);
  if (kept.size > KEPT) {
    kept.delete(kept.keys().next().value as string);
  }
  return result;
}

/** The digest of a pile's samples as `estimatePileKept` keys them; a caller that keeps the list may keep its digest too. */
export function digestOfSamples(samples: readonly EstimateSample[]): string {
  return createHash('sha1').update(JSON.stringify(samples)).digest('base64');
}
