import { Component, OnInit, computed, inject, signal } from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatSelectModule } from '@angular/material/select';
import { RouterLink } from '@angular/router';
import { TranslocoPipe, TranslocoService } from '@jsverse/transloco';
import { AuthSession } from '../../../../core/auth/auth-session';
import { toApiProblem } from '../../../../core/http/api-error';
import { openingSite, rememberSiteId, rememberedSiteId } from '../../../../core/site-choice/remembered-site';
import { AppLanguage } from '../../../../i18n/app-language';
import { LOCALE_FORMAT_PIPES } from '../../../../i18n/locale-format.pipes';
import { problemText } from '../../../sign-in/problem-text';
import { ChartCanvas } from '../../components/chart/chart-canvas';
import { blankChart, duplicateChart, standardChart, type ChartWords } from '../../qaqc-charts';
import { QAQC_PROBLEMS, QaqcStore, VERDICT_LABELS, type QcVerdict, type SiteQaqc } from '../../qaqc.store';

/** `QA/QC` (geologist): duplicate pairs, blank and standard control charts, flagged batches. */
@Component({
  selector: 'hs-qaqc-page',
  imports: [ChartCanvas, FormsModule, LOCALE_FORMAT_PIPES, MatButtonModule, MatFormFieldModule, MatIconModule, MatSelectModule, RouterLink, TranslocoPipe],
  template: `
    <section class="hs-page">
      <h1><mat-icon aria-hidden="true">rule</mat-icon> {{ 'qaqc.page.title' | transloco }}</h1>
      <div class="row">
        <mat-form-field>
          <mat-label>{{ 'qaqc.page.site' | transloco }}</mat-label>
          <mat-select [ngModel]="siteId()" (ngModelChange)="choose($event)" name="site">
            @for (site of sites(); track site.id) { <mat-option [value]="site.id">{{ site.code }} · {{ site.name }}</mat-option> }
          </mat-select>
        </mat-form-field>
        <a mat-stroked-button routerLink="/qaqc/calibration" class="touch"><mat-icon>show_chart</mat-icon> {{ 'qaqc.page.calibration' | transloco }}</a>
      </div>
      @if (problem(); as text) { <p class="problem" role="alert"><mat-icon aria-hidden="true">error</mat-icon> {{ text }}</p> }
      @if (data(); as data) {
        <h2>{{ 'qaqc.page.flaggedTitle' | transloco }}</h2>
        <ul class="list" [attr.aria-label]="'qaqc.page.batchesLabel' | transloco">
          @for (batch of data.batches; track batch.batchId) {
            <li><mat-icon aria-hidden="true">{{ labels[batch.verdict].icon }}</mat-icon> <strong>{{ batch.batchCode }}</strong>: {{ labels[batch.verdict].key | transloco }}{{ reasons().get(batch.batchCode) ? ' — ' + reasons().get(batch.batchCode) : '' }}</li>
          } @empty { <li class="hs-muted">{{ 'qaqc.page.noBatches' | transloco }}</li> }
        </ul>
        <p class="hs-muted">{{ 'qaqc.page.pointShapes' | transloco }}</p>
        <h2>{{ 'qaqc.page.duplicatesTitle' | transloco }}</h2>
        <hs-chart-canvas [config]="duplicates()" [label]="'qaqc.page.duplicatesChart' | transloco: { count: data.duplicates.length, percent: hardPercent() }" />
        <h2>{{ 'qaqc.page.blanksTitle' | transloco }}</h2>
        <hs-chart-canvas [config]="blanks()" [label]="'qaqc.page.blanksChart' | transloco: { count: data.blanks.length }" />
        @for (chart of standards(); track chart.code) {
          <h2>{{ 'qaqc.page.standardTitle' | transloco: { code: chart.code, expected: (chart.expectedGpt | hsNumber: '1.0-4'), sd: (chart.sdGpt | hsNumber: '1.0-4') } }}</h2>
          <hs-chart-canvas [config]="chart.config" [label]="'qaqc.page.standardChart' | transloco: { code: chart.code }" />
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
  private readonly transloco = inject(TranslocoService);
  private readonly language = inject(AppLanguage);
  protected readonly labels = VERDICT_LABELS;
  protected readonly sites = computed(() => this.session.user()?.sites ?? []);
  protected readonly siteId = signal('');
  protected readonly data = signal<SiteQaqc | null>(null);
  protected readonly problem = signal<string | null>(null);
  /** The charts' words in the active language: reading the language here redraws the charts on a switch. */
  private readonly words = computed<ChartWords>(() => {
    this.language.active();
    return { translate: (key, params) => this.transloco.translate(key, params), locale: this.language.locale() };
  });
  protected readonly duplicates = computed(() => duplicateChart(this.data()?.duplicates ?? [], this.words()));
  protected readonly blanks = computed(() => blankChart(this.data()?.blanks ?? [], this.words()));
  protected readonly hardPercent = computed(() => Math.round((this.data()?.duplicates[0]?.tolerance ?? 0.3) * 100));
  /** Why each batch is flagged, by batch code, written from the checks themselves in the active language. */
  protected readonly reasons = computed(() => flaggedReasons(this.data(), this.words()));
  protected readonly standards = computed(() => {
    const data = this.data();
    if (!data) return [];
    const codes = [...new Set(data.standards.map((entry) => entry.standardCode))];
    return codes.flatMap((code) => {
      const standard = data.standardsOnRecord.find((candidate) => candidate.code === code);
      return standard ? [{ code, expectedGpt: standard.expectedGpt, sdGpt: standard.sdGpt, config: standardChart(code, data.standards, standard.expectedGpt, standard.sdGpt, this.words()) }] : [];
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
      this.problem.set(problemText(this.transloco, toApiProblem(error), QAQC_PROBLEMS));
    }
  }
}

const FLAGGED_VERDICT_KEYS: Partial<Record<QcVerdict, string>> = {
  fail: 'qaqc.reasons.fail', warn: 'qaqc.reasons.warn', 'unknown-standard': 'qaqc.reasons.unknownStandard',
};

/**
 * The flagged checks of each batch (`blank …: fail; standard … (…): warn`), in batch order: blanks,
 * then standards, then duplicates, as the server lists them in its own reasons.
 */
export function flaggedReasons(data: SiteQaqc | null, words: ChartWords): ReadonlyMap<string, string> {
  const byBatch = new Map<string, string[]>();
  if (!data) return new Map();
  const note = (batchCode: string, verdict: QcVerdict, what: string) => {
    const key = FLAGGED_VERDICT_KEYS[verdict];
    if (!key) return;
    byBatch.set(batchCode, [...(byBatch.get(batchCode) ?? []), words.translate('qaqc.reasons.line', { what, verdict: words.translate(key) })]);
  };
  for (const entry of data.blanks) note(entry.batchCode, entry.verdict, words.translate('qaqc.reasons.blank', { code: entry.labCode }));
  for (const entry of data.standards) note(entry.batchCode, entry.verdict, words.translate('qaqc.reasons.standard', { standard: entry.standardCode, code: entry.labCode }));
  for (const entry of data.duplicates) note(entry.batchCode, entry.verdict, words.translate('qaqc.reasons.duplicate', { code: entry.labCode, original: entry.originalLabCode }));
  return new Map([...byBatch].map(([batchCode, reasons]) => [batchCode, reasons.join(words.translate('qaqc.reasons.separator'))]));
}
