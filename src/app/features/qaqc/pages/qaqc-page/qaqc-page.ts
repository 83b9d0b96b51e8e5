import { Component, OnInit, computed, inject, signal } from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatSelectModule } from '@angular/material/select';
import { RouterLink } from '@angular/router';
import { AuthSession } from '../../../../core/auth/auth-session';
import { toApiProblem } from '../../../../core/http/api-error';
import { openingSite, rememberSiteId, rememberedSiteId } from '../../../../core/site-choice/remembered-site';
import { ChartCanvas } from '../../components/chart/chart-canvas';
import { blankChart, duplicateChart, standardChart } from '../../qaqc-charts';
import { QaqcStore, VERDICT_LABELS, type SiteQaqc } from '../../qaqc.store';

/** `QA/QC` (geologist): duplicate pairs, blank and standard control charts, flagged batches. */
@Component({
  selector: 'hs-qaqc-page',
  imports: [ChartCanvas, FormsModule, MatButtonModule, MatFormFieldModule, MatIconModule, MatSelectModule, RouterLink],
  template: `
    <section class="hs-page">
      <h1><mat-icon aria-hidden="true">rule</mat-icon> QA/QC</h1>
      <div class="row">
        <mat-form-field>
          <mat-label>Site</mat-label>
          <mat-select [ngModel]="siteId()" (ngModelChange)="choose($event)" name="site">
            @for (site of sites(); track site.id) { <mat-option [value]="site.id">{{ site.code }} · {{ site.name }}</mat-option> }
          </mat-select>
        </mat-form-field>
        <a mat-stroked-button routerLink="/qaqc/calibration" class="touch"><mat-icon>show_chart</mat-icon> Calibration</a>
      </div>
      @if (problem(); as text) { <p class="problem" role="alert"><mat-icon aria-hidden="true">error</mat-icon> {{ text }}</p> }
      @if (data(); as data) {
        <h2>Flagged batches</h2>
        <ul class="list" aria-label="Batches and their verdicts">
          @for (batch of data.batches; track batch.batchId) {
            <li><mat-icon aria-hidden="true">{{ labels[batch.verdict].icon }}</mat-icon> <strong>{{ batch.batchCode }}</strong>: {{ labels[batch.verdict].text }}{{ batch.reasons.length ? ' — ' + batch.reasons.join('; ') : '' }}</li>
          } @empty { <li class="hs-muted">No batches with results yet.</li> }
        </ul>
        <p class="hs-muted">Points: circle = pass, triangle = warn, cross = fail.</p>
        <h2>Duplicate pairs</h2>
        <hs-chart-canvas [config]="duplicates()" [label]="'Duplicate against original, ' + data.duplicates.length + ' pairs, with y = x and HARD 30 % lines'" />
        <h2>Blanks</h2>
        <hs-chart-canvas [config]="blanks()" [label]="'Blank results by batch order, ' + data.blanks.length + ' blanks, fail line at 5 × detection limit'" />
        @for (chart of standards(); track chart.code) {
          <h2>Standard {{ chart.code }} ({{ chart.expectedGpt }} ± {{ chart.sdGpt }} g/t)</h2>
          <hs-chart-canvas [config]="chart.config" [label]="'Control chart of ' + chart.code + ' with ±2 and ±3 SD lines'" />
        }
      }
    </section>
  `,
  styles: `
    .row { display: flex; flex-wrap: wrap; gap: 0 12px; align-items: center; }
    .touch { min-height: 48px; }
    .list { list-style: none; padding: 0; display: flex; flex-direction: column; gap: 4px; }
    .list li { display: flex; align-items: center; gap: 6px; flex-wrap: wrap; }
    .problem { display: flex; gap: 8px; padding: 12px; border-radius: 12px; background: var(--mat-sys-error-container); color: var(--mat-sys-on-error-container); }
  `,
})
export default class QaqcPage implements OnInit {
  private readonly session = inject(AuthSession);
  private readonly store = inject(QaqcStore);
  protected readonly labels = VERDICT_LABELS;
  protected readonly sites = computed(() => this.session.user()?.sites ?? []);
  protected readonly siteId = signal('');
  protected readonly data = signal<SiteQaqc | null>(null);
  protected readonly problem = signal<string | null>(null);
  protected readonly duplicates = computed(() => duplicateChart(this.data()?.duplicates ?? []));
  protected readonly blanks = computed(() => blankChart(this.data()?.blanks ?? []));
  protected readonly standards = computed(() => {
    const data = this.data();
    if (!data) return [];
    const codes = [...new Set(data.standards.map((entry) => entry.standardCode))];
    return codes.flatMap((code) => {
      const standard = data.standardsOnRecord.find((candidate) => candidate.code === code);
      return standard ? [{ code, expectedGpt: standard.expectedGpt, sdGpt: standard.sdGpt, config: standardChart(code, data.standards, standard.expectedGpt, standard.sdGpt) }] : [];
    });
  });

  /** Opens on the site last chosen here on this device, else the first of the user's sites with data. */
  async ngOnInit(): Promise<void> {
    const opening = await openingSite(this.sites().map((site) => site.id), rememberedSiteId('qaqc'), (siteId) => this.store.qaqc(siteId), (data) => data.batches.length > 0 || data.blanks.length > 0 || data.standards.length > 0 || data.duplicates.length > 0);
    if (!opening) return;
    if (opening.data) {
      this.siteId.set(opening.siteId);
      this.data.set(opening.data);
    } else {
      await this.load(opening.siteId);
    }
  }

  /** The site picker: loads the site and remembers it on this device. */
  protected async choose(siteId: string): Promise<void> {
    rememberSiteId('qaqc', siteId);
    await this.load(siteId);
  }

  private async load(siteId: string): Promise<void> {
    this.siteId.set(siteId);
    this.problem.set(null);
    this.data.set(null);
    try {
      this.data.set(await this.store.qaqc(siteId));
    } catch (error) {
      this.problem.set(toApiProblem(error).message);
    }
  }
}
