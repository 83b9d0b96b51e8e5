import { formatPercent } from '@angular/common';
import { Component, ElementRef, OnDestroy, computed, effect, inject, input, viewChild } from '@angular/core';
import { TranslocoPipe, TranslocoService } from '@jsverse/transloco';
import { BarController, BarElement, CategoryScale, Chart, Legend, LinearScale, Tooltip, type ChartData } from 'chart.js';
import type { ScenarioRanks } from '../../../../../../shared/engine';
import { AppLanguage } from '../../../../i18n/app-language';
import { LOCALE_FORMAT_PIPES } from '../../../../i18n/locale-format.pipes';

Chart.register(BarController, BarElement, CategoryScale, LinearScale, Legend, Tooltip);

/** One ranked pile as the chart needs it. */
export interface SensitivityEntry {
  readonly code: string;
  readonly ranks: ScenarioRanks;
  readonly netValueByScenario: Readonly<Record<keyof ScenarioRanks, number>>;
}

/** The five cases, in order; each label is `shortlist.sensitivity.<key>` with the step as a percent. */
const SCENARIOS: readonly { key: keyof ScenarioRanks; colour: string }[] = [
  { key: 'priceDown', colour: '#8d5a00' },
  { key: 'recoveryDown', colour: '#c9872b' },
  { key: 'base', colour: '#1d3b53' },
  { key: 'recoveryUp', colour: '#5b8fb9' },
  { key: 'priceUp', colour: '#2e6b34' },
];

/** Net value of each ranked pile with gold price and recovery moved ±step, as bars, with the ranks as a table. */
@Component({
  selector: 'hs-sensitivity-chart',
  imports: [TranslocoPipe, LOCALE_FORMAT_PIPES],
  template: `
    <div class="chart"><canvas #canvas role="img" [attr.aria-label]="'shortlist.sensitivity.chartLabel' | transloco: { currency: currency() }"></canvas></div>
    <table class="ranks">
      <caption>{{ 'shortlist.sensitivity.caption' | transloco }}</caption>
      <thead><tr><th scope="col">{{ 'shortlist.sensitivity.pile' | transloco }}</th>@for (scenario of scenarios; track scenario.key) { <th scope="col">{{ 'shortlist.sensitivity.' + scenario.key | transloco: { step: stepLabel() } }}</th> }</tr></thead>
      <tbody>
        @for (entry of entries(); track entry.code) {
          <tr><th scope="row">{{ entry.code }}</th>@for (scenario of scenarios; track scenario.key) { <td>#{{ entry.ranks[scenario.key] | hsNumber }}</td> }</tr>
        }
      </tbody>
    </table>
  `,
  styles: `
    .chart { position: relative; height: 260px; }
    .ranks { width: 100%; border-collapse: collapse; margin-top: 12px; font: var(--mat-sys-body-small); }
    .ranks th, .ranks td { padding: 6px 4px; border-bottom: 1px solid var(--mat-sys-outline-variant); text-align: center; }
    .ranks th[scope='row'] { text-align: left; }
    caption { text-align: left; font: var(--mat-sys-title-small); padding-bottom: 4px; }
  `,
})
export class SensitivityChart implements OnDestroy {
  readonly entries = input.required<readonly SensitivityEntry[]>();
  readonly step = input(0.2);
  readonly currency = input('USD');
  protected readonly scenarios = SCENARIOS;
  private readonly transloco = inject(TranslocoService);
  private readonly language = inject(AppLanguage);
  /** The step as the locale writes a percent: "20%" in English, "20 %" in French. */
  protected readonly stepLabel = computed(() => formatPercent(Math.round(this.step() * 100) / 100, this.language.locale(), '1.0-0'));
  private readonly canvas = viewChild.required<ElementRef<HTMLCanvasElement>>('canvas');
  private chart: Chart | null = null;

  constructor() {
    // Re-drawn when the figures or the language change: the legend, the axis title and the tick
    // numbers (Chart.js formats them with Intl for the locale given) follow the language.
    effect(() => {
      const entries = this.entries();
      const step = this.stepLabel();
      const locale = this.language.locale();
      const axisTitle = this.transloco.translate('shortlist.sensitivity.axis', { currency: this.currency() });
      const data: ChartData<'bar'> = {
        labels: entries.map((entry) => entry.code),
        datasets: SCENARIOS.map((scenario) => ({
          label: this.transloco.translate(`shortlist.sensitivity.${scenario.key}`, { step }),
          backgroundColor: scenario.colour,
          data: entries.map((entry) => Math.round(entry.netValueByScenario[scenario.key])),
        })),
      };
      if (this.chart) {
        this.chart.data = data;
        this.chart.options.locale = locale;
        const y = this.chart.options.scales?.['y'];
        if (y && 'title' in y && y.title) y.title.text = axisTitle;
        this.chart.update('none');
      } else {
        // No 2D canvas (a locked-down browser, a test's DOM): the rank table below still says it all.
        const context = this.canvas().nativeElement.getContext('2d');
        if (!context) return;
        this.chart = new Chart(context, {
          type: 'bar', data,
          options: {
            responsive: true, maintainAspectRatio: false, animation: false, locale,
            plugins: { legend: { position: 'bottom', labels: { boxWidth: 12 } } },
            scales: { y: { title: { display: true, text: axisTitle } } },
          },
        });
      }
    });
  }

  ngOnDestroy(): void {
    this.chart?.destroy();
  }
}
