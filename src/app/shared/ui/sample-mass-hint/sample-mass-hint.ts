import { Component, computed, input } from '@angular/core';
import { DecimalPipe } from '@angular/common';
import { MatIconModule } from '@angular/material/icon';
import { minimumSampleMass, samplingErrorForMass } from '../../../../../shared/engine';

/** Default target: a relative SD of 10 % for the fundamental error (common practice, no source). */
export const DEFAULT_TARGET_RELATIVE_SD = 0.1;

/**
 * A hint on a sample form: when the sample is lighter than Gy's formula asks for its material,
 * says so with the minimum mass and the error the sample as taken would carry. Shows nothing
 * while the inputs are incomplete or the sample is heavy enough. All numbers come from the engine.
 */
@Component({
  selector: 'hs-sample-mass-hint',
  imports: [DecimalPipe, MatIconModule],
  template: `
    @if (advice(); as advice) {
      @if (advice.isTooSmall) {
        <aside class="hint" role="status">
          <mat-icon aria-hidden="true">scale</mat-icon>
          <p>
            This sample is {{ massKg() | number: '1.0-2' }} kg. For a fundamental error of ±{{ targetRelativeSd() * 100 | number: '1.0-0' }} %
            (1 SD) at {{ topSizeMm() | number: '1.0-2' }} mm top size, Gy's formula asks for at least
            <strong>{{ advice.minimumMassKg | number: '1.0-2' }} kg</strong>; as taken it carries about
            ±{{ advice.relativeSd * 100 | number: '1.0-0' }} %.
          </p>
        </aside>
      }
    }
  `,
  styles: `
    .hint { display: flex; gap: 8px; align-items: flex-start; padding: 12px; border-radius: 12px; border: 2px solid var(--hs-warn); background: var(--mat-sys-surface-container-low); }
    .hint mat-icon { color: var(--hs-warn); flex: none; }
    p { margin: 0; }
  `,
})
export class SampleMassHint {
  /** Mass of the sample as taken, kg. */
  readonly massKg = input<number | null>(null);
  /** Top size (95 % passing) of the material, mm. */
  readonly topSizeMm = input<number | null>(null);
  /** Gold liberation size, mm. */
  readonly liberationSizeMm = input<number | null>(null);
  /** Expected grade, g/t. */
  readonly gradeGpt = input<number | null>(null);
  /** Target relative SD of the fundamental error (a fraction). */
  readonly targetRelativeSd = input(DEFAULT_TARGET_RELATIVE_SD);

  protected readonly advice = computed(() => {
    const massKg = this.massKg();
    const topSizeMm = this.topSizeMm();
    const liberationSizeMm = this.liberationSizeMm();
    const gradeGpt = this.gradeGpt();
    if (massKg === null || topSizeMm === null || liberationSizeMm === null || gradeGpt === null || !(massKg > 0)) {
      return null;
    }
    const material = { topSizeMm, liberationSizeMm, gradeGpt };
    const minimum = minimumSampleMass({ ...material, targetRelativeSd: this.targetRelativeSd() });
    const error = samplingErrorForMass({ ...material, sampleMassKg: massKg });
    if (!minimum.ok || !error.ok) {
      return null;
    }
    return { isTooSmall: massKg < minimum.value.minimumMassKg, minimumMassKg: minimum.value.minimumMassKg, relativeSd: error.value.relativeSd };
  });
}
