import { formatNumber } from '@angular/common';
import { Component, computed, effect, inject, signal } from '@angular/core';
import { TranslocoPipe, TranslocoService } from '@jsverse/transloco';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { evaluateTrial, type EngineError, type EngineWarning } from '../../../../../../shared/engine';
import { cautionFor } from '../../../../../../shared/safety/cautions';
import { AuthSession } from '../../../../core/auth/auth-session';
import { toApiProblem } from '../../../../core/http/api-error';
import { AppLanguage } from '../../../../i18n/app-language';
import { LOCALE_FORMAT_PIPES } from '../../../../i18n/locale-format.pipes';
import { CautionCard } from '../../../../shared/ui/caution-card/caution-card';
import { TrialsStore, type TrialStatus, type TrialView } from '../../trials.store';

const NUMBER_FIELDS = ['feedMassKg', 'feedGradeGpt', 'concentrateMassKg', 'concentrateGradeGpt', 'tailingsGradeGpt', 'middlingsMassKg', 'middlingsGradeGpt'] as const;
type NumberField = (typeof NUMBER_FIELDS)[number];

const STATUS_ICONS: Record<TrialStatus, string> = { accepted: 'check_circle', pending: 'hourglass_top', rejected: 'block' };

/** `Trials`: test runs over the table, with recovery by the two-product formula and from weighed masses. */
@Component({
  selector: 'hs-trials-page',
  imports: [TranslocoPipe, LOCALE_FORMAT_PIPES, FormsModule, MatButtonModule, MatFormFieldModule, MatIconModule, MatInputModule, MatProgressBarModule, MatSelectModule, CautionCard],
  templateUrl: './trials-page.html',
  styleUrl: './trials-page.scss',
})
export default class TrialsPage {
  protected readonly store = inject(TrialsStore);
  private readonly session = inject(AuthSession);
  private readonly transloco = inject(TranslocoService);
  private readonly language = inject(AppLanguage);
  protected readonly numberFields = NUMBER_FIELDS;
  protected readonly cautions = [cautionFor('mercury'), cautionFor('silica-dust')];
  protected readonly statusIcons = STATUS_ICONS;
  protected readonly sites = computed(() => this.session.user()?.sites ?? []);
  protected readonly siteId = signal<string | null>(this.session.user()?.sites[0]?.id ?? null);
  protected readonly mayRecord = computed(() => ['manager', 'geologist'].includes(this.session.role() ?? ''));

  protected readonly pileIds = signal<string[]>([]);
  protected readonly trialDate = signal(new Date().toISOString().slice(0, 10));
  protected readonly equipmentNote = signal('');
  protected readonly values = signal<Partial<Record<NumberField, number | null>>>({});
  protected readonly status = signal<TrialStatus>('accepted');
  protected readonly problem = signal<string | null>(null);
  protected readonly details = signal<readonly string[]>([]);
  protected readonly saved = signal(false);

  /** The figures on this device as the numbers are typed; the server computes them again on save. */
  protected readonly preview = computed(() => {
    const value = this.values();
    if ([value.feedGradeGpt, value.concentrateGradeGpt, value.tailingsGradeGpt].some((entry) => entry === undefined || entry === null)) return null;
    return evaluateTrial({
      feedGradeGpt: Number(value.feedGradeGpt), concentrateGradeGpt: Number(value.concentrateGradeGpt), tailingsGradeGpt: Number(value.tailingsGradeGpt),
      feedMassKg: value.feedMassKg ?? null, concentrateMassKg: value.concentrateMassKg ?? null,
    });
  });

  constructor() {
    effect(() => {
      const siteId = this.siteId();
      if (siteId) void this.store.load(siteId);
    });
  }

  protected setValue(field: NumberField, value: number | string | null): void {
    const parsed = value === null || value === '' ? null : Number(value);
    this.values.update((values) => ({ ...values, [field]: parsed }));
  }

  protected async recordTrial(): Promise<void> {
    const siteId = this.siteId();
    if (!siteId) return;
    const value = this.values();
    this.problem.set(null);
    this.details.set([]);
    this.saved.set(false);
    try {
      await this.store.recordTrial({
        siteId, pileIds: this.pileIds(), trialDate: this.trialDate(), equipmentNote: this.equipmentNote(),
        feedMassKg: value.feedMassKg as number, feedGradeGpt: value.feedGradeGpt as number, concentrateMassKg: value.concentrateMassKg as number,
        concentrateGradeGpt: value.concentrateGradeGpt as number, tailingsGradeGpt: value.tailingsGradeGpt as number,
        middlingsMassKg: value.middlingsMassKg ?? null, middlingsGradeGpt: value.middlingsGradeGpt ?? null, status: this.status(),
      });
      this.values.set({});
      this.equipmentNote.set('');
      this.saved.set(true);
    } catch (error) {
      const problem = toApiProblem(error);
      this.problem.set(problem.message);
      // The server's reasons are its own words; the field they concern is named as the form names it.
      this.details.set(problem.details.map((detail) => `${this.fieldName(detail.path)}: ${detail.message}`));
    }
  }

  /** A figure as the engine's sentences write it (one decimal), in the locale's digits. */
  private figure(value: number): string {
    return formatNumber(value, this.language.locale(), '1.1-1');
  }

  /** A form field by the name its label gives it, for the server's reasons (the path as sent when unknown). */
  private fieldName(path: string): string {
    const field = NUMBER_FIELDS.find((name) => path === name || path.endsWith(`.${name}`));
    return field ? this.transloco.translate(`trials.fieldNames.${field}`) : path;
  }

  /**
   * A trial's warning in the reader's language, by its code, with the figures taken from the trial
   * itself; a code the app does not know is shown as the server wrote it.
   */
  protected warningText(trial: TrialView, warning: EngineWarning, tolerance: number): string {
    switch (warning.code) {
      case 'recovery-uncertain':
        return this.transloco.translate('trials.warnings.recoveryUncertain', { recovery: this.figure(trial.recoveryTwoProduct * 100), sd: this.figure(trial.recoverySd * 100) });
      case 'recovery-above-one':
        return this.transloco.translate('trials.warnings.recoveryAboveOne');
      case 'discrepancy-over-tolerance':
        return trial.discrepancy === null
          ? warning.message
          : this.transloco.translate('trials.warnings.discrepancyOverTolerance', { points: this.figure(trial.discrepancy * 100), tolerance: this.figure(tolerance * 100) });
      default:
        return warning.message;
    }
  }

  /** The engine's refusal of the typed figures in the reader's language, by its code and field. */
  protected errorText(error: EngineError | undefined): string {
    if (!error) return '';
    const value = this.values();
    const gpt = (field: NumberField) => formatNumber(Number(value[field]), this.language.locale(), '1.0-6');
    if (error.code === 'grade-order' && error.field === 'tailingsGradeGpt') {
      return this.transloco.translate('trials.errors.tailingsBelowFeed', { tailings: gpt('tailingsGradeGpt'), feed: gpt('feedGradeGpt') });
    }
    if (error.code === 'grade-order' && error.field === 'concentrateGradeGpt') {
      return this.transloco.translate('trials.errors.concentrateAboveFeed', { concentrate: gpt('concentrateGradeGpt'), feed: gpt('feedGradeGpt') });
    }
    if (error.code === 'out-of-range' && error.field === 'concentrateMassKg') {
      return this.transloco.translate('trials.errors.concentrateHeavier');
    }
    const isField = (NUMBER_FIELDS as readonly string[]).includes(error.field);
    const byCode: Partial<Record<EngineError['code'], string>> = { 'not-a-number': 'notANumber', negative: 'negative', 'not-positive': 'notPositive' };
    const key = byCode[error.code];
    return isField && key ? this.transloco.translate(`trials.errors.${key}`, { field: this.fieldName(error.field) }) : error.message;
  }

  protected async setStatus(id: string, status: TrialStatus): Promise<void> {
    const siteId = this.siteId();
    if (!siteId) return;
    try {
      await this.store.setStatus(siteId, id, status);
    } catch (error) {
      this.store.problem.set(toApiProblem(error).message);
    }
  }
}
