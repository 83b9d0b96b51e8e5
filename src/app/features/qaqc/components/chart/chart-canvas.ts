import { Component, ElementRef, OnDestroy, effect, input, viewChild } from '@angular/core';
import { Chart, registerables, type ChartConfiguration } from 'chart.js';

Chart.register(...registerables);

/** A chart.js chart on a canvas, redrawn when its configuration changes; `label` describes it for screen readers. */
@Component({
  selector: 'hs-chart-canvas',
  template: `<div class="frame"><canvas #canvas role="img" [attr.aria-label]="label()"></canvas></div>`,
  styles: `.frame { position: relative; width: 100%; height: 320px; } canvas { max-width: 100%; }`,
})
export class ChartCanvas implements OnDestroy {
  readonly config = input.required<ChartConfiguration>();
  readonly label = input.required<string>();
  private readonly canvas = viewChild.required<ElementRef<HTMLCanvasElement>>('canvas');
  private chart: Chart | null = null;

  constructor() {
    effect(() => {
      const config = this.config();
      this.chart?.destroy();
      this.chart = new Chart(this.canvas().nativeElement, { ...config, options: { responsive: true, maintainAspectRatio: false, animation: false, ...config.options } });
    });
  }

  ngOnDestroy(): void {
    this.chart?.destroy();
  }
}
