import { Component, computed, inject, signal } from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { TranslocoPipe, TranslocoService } from '@jsverse/transloco';
import { AuthSession } from '../../../../core/auth/auth-session';
import { toApiProblem } from '../../../../core/http/api-error';
import { problemText, type ProblemKeys } from '../../../sign-in/problem-text';
import { LabelsStore, type PrintedSheet } from '../../labels.store';

/** Labels on one A4 sheet (3 across, 8 down); the server lays them out the same way. */
const LABELS_PER_SHEET = 24;
/** The server's limit per download (ten sheets). */
const MOST_LABELS = 240;

/** Why a sheet was refused, in words for this screen; other refusals keep the server's words. */
const DOWNLOAD_PROBLEMS: ProblemKeys = {
  offline: 'labels.problems.offline',
  not_found: 'labels.problems.noSuchSite',
  conflict: 'labels.problems.usedUp',
  forbidden: 'labels.problems.forbidden',
  validation_failed: 'labels.problems.count',
  unauthenticated: 'labels.problems.signIn',
  token_expired: 'labels.problems.signIn',
  internal: 'labels.problems.internal',
};

/** Labels: print a sheet of pre-numbered sample labels (QR code and large code) to stick on bags. */
@Component({
  selector: 'hs-labels-page',
  imports: [FormsModule, MatButtonModule, MatFormFieldModule, MatIconModule, MatInputModule, MatSelectModule, TranslocoPipe],
  template: `
    <section class="hs-page">
      <h1>{{ 'labels.page.title' | transloco }}</h1>
      <p class="hs-muted">{{ 'labels.page.intro' | transloco }}</p>
      <form class="form" (submit)="$event.preventDefault(); download()">
        <mat-form-field>
          <mat-label>{{ 'labels.page.site' | transloco }}</mat-label>
          <mat-select [ngModel]="siteId()" (ngModelChange)="siteId.set($event)" name="site" data-testid="labels-site">
            @for (site of sites(); track site.id) { <mat-option [value]="site.id">{{ site.name }} ({{ site.code }})</mat-option> }
          </mat-select>
        </mat-form-field>
        <mat-form-field>
          <mat-label>{{ 'labels.page.count' | transloco }}</mat-label>
          <input matInput type="number" inputmode="numeric" min="1" [max]="mostLabels" name="count" data-testid="labels-count"
            [ngModel]="count()" (ngModelChange)="count.set(+$event)" />
          <mat-hint>{{ (sheets() === 1 ? 'labels.page.sheetsOne' : 'labels.page.sheetsOther') | transloco: { sheets: sheets(), perSheet: perSheet, most: mostLabels } }}</mat-hint>
        </mat-form-field>
        <div class="presets" role="group" [attr.aria-label]="'labels.page.quickCounts' | transloco">
          @for (preset of presets; track preset) {
            <button mat-stroked-button type="button" (click)="count.set(preset)" [attr.aria-pressed]="count() === preset">{{ preset }}</button>
          }
        </div>
        <button mat-flat-button type="submit" class="go" [disabled]="!canDownload()" data-testid="labels-download">
          <mat-icon>download</mat-icon> {{ (isBusy() ? 'labels.page.preparing' : 'labels.page.download') | transloco }}
        </button>
      </form>
      @if (problem(); as problem) { <p class="problem" role="alert">{{ problem }}</p> }
      @if (printed(); as printed) {
        <p class="printed" role="status" data-testid="labels-printed">
          <mat-icon aria-hidden="true">check_circle</mat-icon> {{ 'labels.page.printed' | transloco: { count: printed.count, first: printed.firstCode, last: printed.lastCode } }}
        </p>
      }
      <p class="hs-muted">{{ 'labels.page.needsConnection' | transloco }}</p>
    </section>
  `,
  styles: `
    .form { display: grid; gap: 12px; max-width: 520px; }
    .presets { display: flex; gap: 8px; flex-wrap: wrap; }
    .presets button, .go { min-height: 48px; min-width: 64px; }
    .problem { color: var(--hs-fail); font-weight: 500; }
    .printed { display: flex; gap: 8px; align-items: center; font-weight: 500; } .printed mat-icon { flex: none; }
  `,
})
export default class LabelsPage {
  private readonly store = inject(LabelsStore);
  private readonly session = inject(AuthSession);
  private readonly transloco = inject(TranslocoService);

  protected readonly mostLabels = MOST_LABELS;
  protected readonly perSheet = LABELS_PER_SHEET;
  protected readonly presets = [24, 48, 96] as const;
  protected readonly sites = computed(() => this.session.user()?.sites ?? []);
  protected readonly siteId = signal<string | null>(this.session.user()?.sites[0]?.id ?? null);
  protected readonly count = signal(LABELS_PER_SHEET);
  protected readonly sheets = computed(() => Math.max(1, Math.ceil(this.count() / LABELS_PER_SHEET)));
  protected readonly isBusy = signal(false);
  protected readonly problem = signal<string | null>(null);
  protected readonly printed = signal<PrintedSheet | null>(null);
  protected readonly canDownload = computed(() =>
    !this.isBusy() && this.siteId() !== null && Number.isInteger(this.count()) && this.count() >= 1 && this.count() <= MOST_LABELS);

  protected async download(): Promise<void> {
    const siteId = this.siteId();
    if (!siteId || !this.canDownload()) return;
    this.isBusy.set(true);
    this.problem.set(null);
    try {
      this.printed.set(await this.store.downloadSheet(siteId, this.count()));
    } catch (error) {
      this.problem.set(problemText(this.transloco, toApiProblem(error), DOWNLOAD_PROBLEMS, { most: MOST_LABELS }));
    } finally {
      this.isBusy.set(false);
    }
  }
}
