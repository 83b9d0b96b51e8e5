import { Component, ElementRef, OnDestroy, effect, input, viewChild } from '@angular/core';
import { BarController, BarElement, CategoryScale, Chart, Legend, LinearScale, Tooltip } from 'chart.js';
import type { ScenarioRanks } from '../../../../../../shared/engine';

Chart.register(BarController, BarElement, CategoryScale, LinearScale, Legend, Tooltip);

/** One ranked pile as the chart needs it. */
export interface SensitivityEntry {
  readonly code: string;
  readonly ranks: ScenarioRanks;
  readonly netValueByScenario: Readonly<Record<keyof ScenarioRanks, number>>;
}

const SCENARIOS: readonly { key: keyof ScenarioRanks; label: (step: number) => string; colour: string }[] = [
  { key: 'priceDown', label: (step) => `Price −${step} %`, colour: '#8d5a00' },
  { key: 'recoveryDown', label: (step) => `Recovery −${step} %`, colour: '#c9872b' },
  { key: 'base', label: () => 'As set', colour: '#1d3b53' },
  { key: 'recoveryUp', label: (step) => `Recovery +${step} %`, colour: '#5b8fb9' },
  { key: 'priceUp', label: (step) => `Price +${step} %`, colour: '#2e6b34' },
];

/** Net value of each ranked pile with gold price and recovery moved ±step, as bars, with the ranks as a table. */
@Component({
  selector: 'hs-sensitivity-chart',
  template: `
    <div class="chart"><canvas #canvas role="img" [attr.aria-label]="'Net value per pile, ' + currency() + ', as set and with price and recovery moved'"></canvas></div>
    <table class="ranks">
      <caption>Rank under each case (1 = best)</caption>
      <thead><tr><th scope="col">Pile</th>@for (scenario of scenarios; track scenario.key) { <th scope="col">{{ scenario.label(stepPercent()) }}</th> }</tr></thead>
      <tbody>
        @for (entry of entries(); track entry.code) {
          <tr><th scope="row">{{ entry.code }}</th>@for (scenario of scenarios; track scenario.key) { <td>#{{ entry.ranks[scenario.key] }}</td> }</tr>
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
  protected readonly stepPercent = () => Math.round(this.step() * 100);
  private readonly canvas = viewChild.required<ElementRef<HTMLCanvasElement>>('canvas');
  private chart: Chart | null = null;

  constructor() {
    effect(() => {
      const entries = this.entries();
      const step = this.stepPercent();
      const data = {
        labels: entries.map((entry) => entry.code),
        datasets: SCENARIOS.map((scenario) => ({
          label: scenario.label(step), backgroundColor: scenario.colour, data: entries.map((entry) => Math.round(entry.netValueByScenario[scenario.key])),
        })),
      };
      if (this.chart) {
        this.chart.data = data;
        this.chart.update('none');
      } else {
        this.chart = new Chart(this.canvas().nativeElement, {
          type: 'bar', data,
          options: {
            responsive: true, maintainAspectRatio: false, animation: false,
            plugins: { legend: { position: 'bottom', labels: { boxWidth: 12 } } },
            scales: { y: { title: { display: true, text: `Net value (${this.currency()})` } } },
          },
        });
      }
    });
  }

  ngOnDestroy(): void {
    this.chart?.destroy();
  }
}
