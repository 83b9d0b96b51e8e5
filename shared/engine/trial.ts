/**
 * A trial run over the table: the two-product formula (Wills & Napier-Munn, "Wills' Mineral
 * Processing Technology", metallurgical accounting) from feed f, concentrate c and tailings t grades:
 *   mass yield Y = C/F = (f − t)/(c − t),  recovery R = c·(f − t) / (f·(c − t)),
 * valid only when c > f > t. With weighed feed and concentrate masses, recovery is also C·c/(F·f);
 * the discrepancy between the two (weighed − formula) shows how far the assays and masses agree.
 * The formula is badly conditioned when t is close to f, so a first-order uncertainty is given.
 * All results are fractions, not percent (DESIGN §6).
 */
import { EngineError, EngineWarning, Result, checkNumbers, engineError, fail, ok } from './result';

/** A trial as recorded (DESIGN §6 names). */
export interface TrialInput {
  readonly feedGradeGpt: number;
  readonly concentrateGradeGpt: number;
  readonly tailingsGradeGpt: number;
  readonly feedMassKg?: number | null;
  readonly concentrateMassKg?: number | null;
  /** Relative SD of each assay, for the uncertainty of recovery; default 0.1 (common practice, no source). */
  readonly assayRelativeSd?: number;
}

/** What a trial says (DESIGN §6 computed fields). */
export interface TrialResult {
  readonly massYield: number;
  readonly recoveryTwoProduct: number;
  readonly recoveryWeighed: number | null;
  readonly massYieldWeighed: number | null;
  readonly discrepancy: number | null;
  readonly enrichmentRatio: number;
  /** First-order SD of recoveryTwoProduct from the assay errors, as a fraction. */
  readonly recoverySd: number;
  readonly warnings: readonly EngineWarning[];
}

/** Mass yield, recovery by the two-product formula and by weighed masses, and their discrepancy. */
export function evaluateTrial(input: TrialInput): Result<TrialResult> {
  const assayRelativeSd = input.assayRelativeSd ?? 0.1;
  const errors: EngineError[] = checkNumbers([
    ['feedGradeGpt', input.feedGradeGpt, 'positive'],
    ['concentrateGradeGpt', input.concentrateGradeGpt, 'positive'],
    ['tailingsGradeGpt', input.tailingsGradeGpt, 'non-negative'],
    ['assayRelativeSd', assayRelativeSd, 'non-negative'],
  ]);
  const hasMasses = input.feedMassKg !== undefined && input.feedMassKg !== null && input.concentrateMassKg !== undefined && input.concentrateMassKg !== null;
  if (hasMasses) {
    errors.push(
      ...checkNumbers([
        ['feedMassKg', input.feedMassKg, 'positive'],
        ['concentrateMassKg', input.concentrateMassKg, 'non-negative'],
      ]),
    );
  }
  if (errors.length > 0) {
    return fail(...errors);
  }
  const f = input.feedGradeGpt;
  const c = input.concentrateGradeGpt;
  const t = input.tailingsGradeGpt;
  if (t >= f) {
    errors.push(engineError('grade-order', 'tailingsGradeGpt', `tailings (${t} g/t) must assay below the feed (${f} g/t)`));
  }
  if (c <= f) {
    errors.push(engineError('grade-order', 'concentrateGradeGpt', `concentrate (${c} g/t) must assay above the feed (${f} g/t)`));
  }
  if (hasMasses && (input.concentrateMassKg as number) > (input.feedMassKg as number)) {
    errors.push(engineError('out-of-range', 'concentrateMassKg', 'the concentrate cannot weigh more than the feed'));
  }
  if (errors.length > 0) {
    return fail(...errors);
  }
  const massYield = (f - t) / (c - t);
  const recoveryTwoProduct = (c * (f - t)) / (f * (c - t));
  // Partial derivatives of R = c(f − t)/(f(c − t)) with respect to f, c and t.
  const dRdf = (c * t) / (f * f * (c - t));
  const dRdc = (-t * (f - t)) / (f * (c - t) ** 2);
  const dRdt = (c * (f - c)) / (f * (c - t) ** 2);
  const recoverySd = Math.sqrt((dRdf * f * assayRelativeSd) ** 2 + (dRdc * c * assayRelativeSd) ** 2 + (dRdt * t * assayRelativeSd) ** 2);
  const warnings: EngineWarning[] = [];
  // 0.05 SD: beyond this the recovery is too uncertain to rank on (common practice, no source).
  if (recoverySd > 0.05) {
    warnings.push({
      code: 'recovery-uncertain',
      message: `Tailings assay close to feed: recovery ${(recoveryTwoProduct * 100).toFixed(1)} % ± ${(recoverySd * 100).toFixed(1)} % (1 SD). Re-assay or weigh the products.`,
    });
  }
  let recoveryWeighed: number | null = null;
  let massYieldWeighed: number | null = null;
  let discrepancy: number | null = null;
  if (hasMasses) {
    massYieldWeighed = (input.concentrateMassKg as number) / (input.feedMassKg as number);
    recoveryWeighed = (massYieldWeighed * c) / f;
    discrepancy = recoveryWeighed - recoveryTwoProduct;
    if (recoveryWeighed > 1) {
      warnings.push({ code: 'recovery-above-one', message: 'Weighed masses and assays give more gold out than in: check masses and assays.' });
    }
  }
  return ok({ massYield, recoveryTwoProduct, recoveryWeighed, massYieldWeighed, discrepancy, enrichmentRatio: c / f, recoverySd, warnings });
}
