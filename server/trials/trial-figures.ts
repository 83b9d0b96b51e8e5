import { evaluateTrial, type EngineError, type EngineWarning, type Result } from '../../shared/engine';

/** The recorded fields of a trial the figures come from. */
export interface TrialMeasurements {
  readonly feedMassKg: number;
  readonly feedGradeGpt: number;
  readonly concentrateMassKg: number;
  readonly concentrateGradeGpt: number;
  readonly tailingsGradeGpt: number;
  readonly middlingsMassKg: number | null;
  readonly middlingsGradeGpt: number | null;
}

/** What a trial says (DESIGN §6 computed fields, fractions), with its warnings. */
export interface TrialFigures {
  readonly massYield: number;
  readonly recoveryTwoProduct: number;
  readonly recoveryWeighed: number | null;
  readonly discrepancy: number | null;
  readonly enrichmentRatio: number;
  readonly recoverySd: number;
  /** Share of the feed's gold reported to the middlings (weighed), kept apart from recovery. */
  readonly middlingsGoldFraction: number | null;
  readonly isDiscrepancyOverTolerance: boolean;
  readonly warnings: readonly EngineWarning[];
}

/**
 * The figures of one trial from the numbers engine (two-product formula and weighed masses), plus
 * the middlings, reported on their own: the two-product formula sees concentrate and tailings only,
 * so the middlings' gold is neither counted as recovered nor hidden in the tailings.
 */
export function trialFigures(trial: TrialMeasurements, discrepancyTolerance: number): Result<TrialFigures> {
  const evaluated = evaluateTrial({
    feedGradeGpt: trial.feedGradeGpt, concentrateGradeGpt: trial.concentrateGradeGpt, tailingsGradeGpt: trial.tailingsGradeGpt,
    feedMassKg: trial.feedMassKg, concentrateMassKg: trial.concentrateMassKg,
  });
  if (!evaluated.ok) {
    return evaluated;
  }
  const { massYield, recoveryTwoProduct, recoveryWeighed, discrepancy, enrichmentRatio, recoverySd } = evaluated.value;
  const warnings: EngineWarning[] = [...evaluated.value.warnings];
  const isDiscrepancyOverTolerance = discrepancy !== null && Math.abs(discrepancy) > discrepancyTolerance;
  if (isDiscrepancyOverTolerance) {
    warnings.push({
      code: 'discrepancy-over-tolerance',
      message: `Weighed recovery differs from the two-product recovery by ${((discrepancy as number) * 100).toFixed(1)} percentage points, more than the ${(discrepancyTolerance * 100).toFixed(1)} allowed: check the masses and assays.`,
    });
  }
  const middlingsGoldFraction =
    trial.middlingsMassKg !== null && trial.middlingsGradeGpt !== null
      ? (trial.middlingsMassKg * trial.middlingsGradeGpt) / (trial.feedMassKg * trial.feedGradeGpt)
      : null;
  return {
    ok: true,
    value: { massYield, recoveryTwoProduct, recoveryWeighed, discrepancy, enrichmentRatio, recoverySd, middlingsGoldFraction, isDiscrepancyOverTolerance, warnings },
  };
}

/** The recovery the shortlist uses for a site, and where it came from. */
export interface WorkingRecovery {
  readonly recovery: number;
  readonly source: 'trials' | 'default';
  readonly trialCount: number;
  readonly feedMassKg: number;
}

/**
 * The site's working recovery: the feed-mass-weighted mean of the two-product recoveries of its
 * accepted trials, Σ Fᵢ·Rᵢ / Σ Fᵢ, or the stated default while there is none.
 */
export function workingRecovery(accepted: readonly { feedMassKg: number; recoveryTwoProduct: number }[], defaultRecovery: number): WorkingRecovery {
  const feedMassKg = accepted.reduce((sum, trial) => sum + trial.feedMassKg, 0);
  if (accepted.length === 0 || feedMassKg <= 0) {
    return { recovery: defaultRecovery, source: 'default', trialCount: 0, feedMassKg: 0 };
  }
  const recovery = accepted.reduce((sum, trial) => sum + trial.feedMassKg * trial.recoveryTwoProduct, 0) / feedMassKg;
  return { recovery, source: 'trials', trialCount: accepted.length, feedMassKg };
}

/** Engine refusals as the API's error details (`path`, `message`). */
export function engineErrorDetails(errors: readonly EngineError[]): { path: string; message: string; code: string }[] {
  return errors.map((error) => ({ path: error.field, message: error.message, code: error.code }));
}
