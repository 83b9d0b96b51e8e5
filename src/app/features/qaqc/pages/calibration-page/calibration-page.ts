import { DecimalPipe } from '@angular/common';
import { Component, OnInit, computed, inject, signal } from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatSelectModule } from '@angular/material/select';
import { MatSlideToggleModule } from '@angular/material/slide-toggle';
import { AuthSession } from '../../../../core/auth/auth-session';
import { toApiProblem } from '../../../../core/http/api-error';
import { openingSite, rememberSiteId, rememberedSiteId } from '../../../../core/site-choice/remembered-site';
import { ChartCanvas } from '../../components/chart/chart-canvas';
import { calibrationChart } from '../../qaqc-charts';
import { QaqcStore, type SiteCalibration } from '../../qaqc.store';

/** `Calibration` (geologist): pan estimate against assay with the fitted line, n and R², and the switch that applies it. */
@Component({
  selector: 'hs-calibration-page',
  imports: [ChartCanvas, DecimalPipe, FormsModule, MatFormFieldModule, MatIconModule, MatSelectModule, MatSlideToggleModule],
  template: `
    <section class="hs-page">
      <h1><mat-icon aria-hidden="true">show_chart</mat-icon> Calibration</h1>
      <mat-form-field>
        <mat-label>Site</mat-label>
        <mat-select [ngModel]="siteId()" (ngModelChange)="choose($event)" name="site">
          @for (site of sites(); track site.id) { <mat-option [value]="site.id">{{ site.code }} · {{ site.name }}</mat-option> }
        </mat-select>
      </mat-form-field>
      @if (problem(); as text) { <p class="problem" role="alert"><mat-icon aria-hidden="true">error</mat-icon> {{ text }}</p> }
      @if (data(); as data) {
        @if (data.fit; as fit) {
          <p data-testid="fit">n = {{ fit.n }} · R² = {{ fit.r2 | number: '1.2-2' }} · assay = {{ fit.interceptGpt | number: '1.3-3' }} + {{ fit.slope | number: '1.3-3' }} × pan</p>
          @for (warning of fit.warnings; track warning.code) { <p class="with-icon"><mat-icon aria-hidden="true">warning</mat-icon> {{ warning.message }}</p> }
        } @else {
          @for (refusal of data.refusals; track $index) { <p class="with-icon"><mat-icon aria-hidden="true">info</mat-icon> No line yet: {{ refusal.message }}</p> }
        }
        <mat-slide-toggle class="touch" [checked]="data.isApplied" [disabled]="!data.fit && !data.isApplied" (change)="setApplied($event.checked)">
          Apply to samples without an assay
        </mat-slide-toggle>
        <hs-chart-canvas [config]="chart()" [label]="'Assay against pan estimate, ' + data.points.length + ' samples, with the fitted line'" />
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
  protected readonly sites = computed(() => this.session.user()?.sites ?? []);
  protected readonly siteId = signal('');
  protected readonly data = signal<SiteCalibration | null>(null);
  protected readonly problem = signal<string | null>(null);
  protected readonly chart = computed(() => calibrationChart(this.data() ?? { siteId: '', isApplied: false, fit: null, refusals: [], points: [] }));

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
      this.problem.set(toApiProblem(error).message);
    }
  }

  protected async setApplied(isApplied: boolean): Promise<void> {
    try {
      this.data.set(await this.store.setApplied(this.siteId(), isApplied));
    } catch (error) {
      this.problem.set(toApiProblem(error).message);
    }
  }
}
