import { formatNumber } from '@angular/common';
import { Component, OnInit, computed, inject, signal } from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatSelectModule } from '@angular/material/select';
import { MatSlideToggleModule } from '@angular/material/slide-toggle';
import { TranslocoPipe, TranslocoService } from '@jsverse/transloco';
import { AuthSession } from '../../../../core/auth/auth-session';
import { toApiProblem } from '../../../../core/http/api-error';
import { openingSite, rememberSiteId, rememberedSiteId } from '../../../../core/site-choice/remembered-site';
import { AppLanguage } from '../../../../i18n/app-language';
import { LOCALE_FORMAT_PIPES } from '../../../../i18n/locale-format.pipes';
import { problemText } from '../../../sign-in/problem-text';
import { ChartCanvas } from '../../components/chart/chart-canvas';
import { calibrationChart, type ChartWords } from '../../qaqc-charts';
import { QAQC_PROBLEMS, QaqcStore, type SiteCalibration } from '../../qaqc.store';

/** Calibration warnings and refusals this page words itself, by the engine's code (others keep the server's words). */
const WARNING_KEYS: Record<string, string> = {
  'slope-not-positive': 'qaqc.calibration.warnings.slopeNotPositive',
  'weak-fit': 'qaqc.calibration.warnings.weakFit',
};
const REFUSAL_KEYS: Record<string, string> = {
  'too-few': 'qaqc.calibration.refusals.tooFew',
  'no-variation': 'qaqc.calibration.refusals.noVariation',
};

/** `Calibration` (geologist): pan estimate against assay with the fitted line, n and R², and the switch that applies it. */
@Component({
  selector: 'hs-calibration-page',
  imports: [ChartCanvas, FormsModule, LOCALE_FORMAT_PIPES, MatFormFieldModule, MatIconModule, MatSelectModule, MatSlideToggleModule, TranslocoPipe],
  template: `
    <section class="hs-page">
      <h1><mat-icon aria-hidden="true">show_chart</mat-icon> {{ 'qaqc.calibration.title' | transloco }}</h1>
      <mat-form-field>
        <mat-label>{{ 'qaqc.calibration.site' | transloco }}</mat-label>
        <mat-select [ngModel]="siteId()" (ngModelChange)="choose($event)" name="site">
          @for (site of sites(); track site.id) { <mat-option [value]="site.id">{{ site.code }} · {{ site.name }}</mat-option> }
        </mat-select>
      </mat-form-field>
      @if (problem(); as text) { <p class="problem" role="alert"><mat-icon aria-hidden="true">error</mat-icon> {{ text }}</p> }
      @if (data(); as data) {
        @if (data.fit; as fit) {
          <p data-testid="fit">{{ 'qaqc.calibration.fit' | transloco: { n: fit.n, r2: (fit.r2 | hsNumber: '1.2-2'), intercept: (fit.interceptGpt | hsNumber: '1.3-3'), slope: (fit.slope | hsNumber: '1.3-3') } }}</p>
          @for (warning of fit.warnings; track warning.code) { <p class="with-icon"><mat-icon aria-hidden="true">warning</mat-icon> {{ warningText(warning, fit.r2) }}</p> }
        } @else {
          @for (refusal of data.refusals; track $index) { <p class="with-icon"><mat-icon aria-hidden="true">info</mat-icon> {{ 'qaqc.calibration.noLine' | transloco: { reason: refusalText(refusal, data.points.length) } }}</p> }
        }
        <mat-slide-toggle class="touch" [checked]="data.isApplied" [disabled]="!data.fit && !data.isApplied" (change)="setApplied($event.checked)">
          {{ 'qaqc.calibration.apply' | transloco }}
        </mat-slide-toggle>
        <hs-chart-canvas [config]="chart()" [label]="'qaqc.calibration.chartLabel' | transloco: { count: data.points.length }" />
      }
    </section>
  `,
  styles: `
    .touch { min-height: 48px; display: flex; align-items: center; }
    .with-icon { display: flex; align-items: center; gap: 6px; }
    .problem { display: flex; gap: 8px; padding: 12px; border-radius: 12px; background: var(--mat-sys-error-container); color: var(--mat-sys-on-error-container); }
  `,
})
export default class CalibrationPage implements OnInit {
  private readonly session = inject(AuthSession);
  private readonly store = inject(QaqcStore);
  private readonly transloco = inject(TranslocoService);
  private readonly language = inject(AppLanguage);
  protected readonly sites = computed(() => this.session.user()?.sites ?? []);
  protected readonly siteId = signal('');
  protected readonly data = signal<SiteCalibration | null>(null);
  protected readonly problem = signal<string | null>(null);
  /** The chart's words in the active language: reading the language here redraws the chart on a switch. */
  private readonly words = computed<ChartWords>(() => {
    this.language.active();
    return { translate: (key, params) => this.transloco.translate(key, params), locale: this.language.locale() };
  });
  protected readonly chart = computed(() => calibrationChart(this.data() ?? { siteId: '', isApplied: false, fit: null, refusals: [], points: [] }, this.words()));

  /** Opens on the site last chosen here on this device, else the first of the user's sites with data. */
  async ngOnInit(): Promise<void> {
    const opening = await openingSite(this.sites().map((site) => site.id), rememberedSiteId('calibration'), (siteId) => this.store.calibration(siteId), (data) => data.points.length > 0);
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
    rememberSiteId('calibration', siteId);
    await this.load(siteId);
  }

  private async load(siteId: string): Promise<void> {
    this.siteId.set(siteId);
    this.problem.set(null);
    this.data.set(null);
    try {
      this.data.set(await this.store.calibration(siteId));
    } catch (error) {
      this.problem.set(problemText(this.transloco, toApiProblem(error), QAQC_PROBLEMS));
    }
  }

  protected async setApplied(isApplied: boolean): Promise<void> {
    try {
      this.data.set(await this.store.setApplied(this.siteId(), isApplied));
    } catch (error) {
      this.problem.set(problemText(this.transloco, toApiProblem(error), QAQC_PROBLEMS));
    }
  }

  /** A fit warning in the reader's words; a warning this page does not know keeps the server's words. */
  protected warningText(warning: { code: string; message: string }, r2: number): string {
    const key = WARNING_KEYS[warning.code];
    return key ? this.transloco.translate(key, { r2: formatNumber(r2, this.language.locale(), '1.2-2') }) : warning.message;
  }

  /** Why there is no line yet, in the reader's words; a refusal this page does not know keeps the server's words. */
  protected refusalText(refusal: SiteCalibration['refusals'][number], pairCount: number): string {
    const key = REFUSAL_KEYS[refusal.code];
    const minPairs = refusal.details?.['minPairs'];
    if (!key || (refusal.code === 'too-few' && typeof minPairs !== 'number')) return refusal.message;
    return this.transloco.translate(key, { min: minPairs, count: pairCount });
  }
}
