import { Component, computed, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import { TranslocoPipe } from '@jsverse/transloco';
import { minimumSampleMass, samplingErrorForMass } from '../../../../../shared/engine';
import { LOCALE_FORMAT_PIPES } from '../../../i18n/locale-format.pipes';

/** Default target: a relative SD of 10 % for the fundamental error (common practice, no source). */
export const DEFAULT_TARGET_RELATIVE_SD = 0.1;

/**
 * A hint on a sample form: when the sample is lighter than Gy's formula asks for its material,
 * says so with the minimum mass and the error the sample as taken would carry. Shows nothing
 * while the inputs are incomplete or the sample is heavy enough. All numbers come from the engine.
 */
@Component({
  selector: 'hs-sample-mass-hint',
  imports: [MatIconModule, TranslocoPipe, LOCALE_FORMAT_PIPES],
  template: `
    @if (advice(); as advice) {
      @if (advice.isTooSmall) {
        <aside class="hint" role="status">
          <mat-icon aria-hidden="true">scale</mat-icon>
          <!-- The minimum stands out in bold, so the sentence comes in three keys: before, the minimum, after. -->
          <p>
            {{ 'ui.sampleMassHint.lead' | transloco: {
              mass: (massKg() | hsNumber: '1.0-2'),
              target: (targetRelativeSd() * 100 | hsNumber: '1.0-0'),
              topSize: (topSizeMm() | hsNumber: '1.0-2')
            } }}
            <strong>{{ 'ui.sampleMassHint.minimum' | transloco: { minimum: (advice.minimumMassKg | hsNumber: '1.0-2') } }}</strong>{{
              'ui.sampleMassHint.asTaken' | transloco: { error: (advice.relativeSd * 100 | hsNumber: '1.0-0') } }}
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
