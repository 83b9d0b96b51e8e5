import type { EngineWarning, GradeSource } from '../../shared/engine';

/** What the review desk knows of one sample's grade, all from the engine through the lab loop's reads (`siteGrades`). */
export interface SampleGradeView {
  readonly assayGpt: number | null;
  readonly isBelowDetection: boolean;
  readonly panGpt: number | null;
  /** The grade the estimate uses and its source; null when the sample has neither assay nor usable pan test. */
  readonly gradeGpt: number | null;
  readonly gradeSource: GradeSource | null;
  readonly warnings: readonly EngineWarning[];
}
