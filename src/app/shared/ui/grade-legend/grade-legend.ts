import { Component, computed, input } from '@angular/core';
import { TranslocoPipe } from '@jsverse/transloco';
import { LOCALE_FORMAT_PIPES } from '../../../i18n/locale-format.pipes';
import { rampGradientCss } from '../colour-ramp/colour-ramp';

/** The heat-map legend: the ramp with grade numbers under it (never colour alone), in the reader's language. */
@Component({
  selector: 'hs-grade-legend',
  imports: [TranslocoPipe, LOCALE_FORMAT_PIPES],
  template: `
    @let heading = title() ?? ('ui.gradeLegend.title' | transloco);
    <figure class="legend" role="img"
      [attr.aria-label]="'ui.gradeLegend.label' | transloco: { title: heading, min: (minValue() | hsNumber: '1.2-2'), max: (maxValue() | hsNumber: '1.2-2'), unit: unit() }">
      <figcaption>{{ heading }}</figcaption>
      <div class="bar" [style.background]="gradient"></div>
      <div class="ticks">
        @for (tick of ticks(); track $index) {
          <span>{{ tick | hsNumber: '1.0-2' }}</span>
        }
      </div>
      <div class="ends"><span>{{ 'ui.gradeLegend.low' | transloco }}</span><span>{{ unit() }}</span><span>{{ 'ui.gradeLegend.high' | transloco }}</span></div>
    </figure>
  `,
  styles: `
    .legend { margin: 0; padding: 8px 12px; background: var(--mat-sys-surface); border: 1px solid var(--mat-sys-outline); border-radius: 8px; min-width: 200px; }
    figcaption { font: var(--mat-sys-label-large); margin-bottom: 4px; }
    .bar { height: 16px; border-radius: 4px; border: 1px solid var(--mat-sys-outline); }
    .ticks, .ends { display: flex; justify-content: space-between; font: var(--mat-sys-body-small); font-variant-numeric: tabular-nums; }
    .ends { color: var(--mat-sys-on-surface-variant); }
  `,
})
export class GradeLegend {
  readonly minValue = input.required<number>();
  readonly maxValue = input.required<number>();
  /** The caption, already in the reader's language; without one the legend says "Grade". */
  readonly title = input<string | null>(null);
  readonly unit = input('g/t');
  /** Number of labelled ticks, ends included. */
  readonly tickCount = input(5);
  protected readonly gradient = rampGradientCss();
  protected readonly ticks = computed(() => {
    const count = Math.max(2, this.tickCount());
    const low = this.minValue();
    const high = this.maxValue();
    return Array.from({ length: count }, (_unused, index) => low + ((high - low) * index) / (count - 1));
  });
}
