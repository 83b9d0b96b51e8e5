import { Component, computed, input } from '@angular/core';
import { DecimalPipe } from '@angular/common';
import { rampGradientCss } from '../colour-ramp/colour-ramp';

/** The heat-map legend: the ramp with grade numbers under it (never colour alone). */
@Component({
  selector: 'hs-grade-legend',
  imports: [DecimalPipe],
  template: `
    <figure class="legend" role="img" [attr.aria-label]="label()">
      <figcaption>{{ title() }}</figcaption>
      <div class="bar" [style.background]="gradient"></div>
      <div class="ticks">
        @for (tick of ticks(); track $index) {
          <span>{{ tick | number: '1.0-2' }}</span>
        }
      </div>
      <div class="ends"><span>low</span><span>{{ unit() }}</span><span>high</span></div>
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
  readonly title = input('Grade');
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
  protected readonly label = computed(() => `${this.title()} legend from ${this.minValue().toFixed(2)} to ${this.maxValue().toFixed(2)} ${this.unit()}, light low to dark high`);
}
