import { DecimalPipe } from '@angular/common';
import { Component, computed, effect, inject, signal } from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { evaluateTrial } from '../../../../../../shared/engine';
import { PLANNING_ESTIMATE_STATEMENT, cautionFor } from '../../../../../../shared/safety/cautions';
import { AuthSession } from '../../../../core/auth/auth-session';
import { toApiProblem } from '../../../../core/http/api-error';
import { CautionCard } from '../../../../shared/ui/caution-card/caution-card';
import { TrialsStore, type TrialStatus } from '../../trials.store';

const NUMBER_FIELDS = ['feedMassKg', 'feedGradeGpt', 'concentrateMassKg', 'concentrateGradeGpt', 'tailingsGradeGpt', 'middlingsMassKg', 'middlingsGradeGpt'] as const;
type NumberField = (typeof NUMBER_FIELDS)[number];

const STATUS_ICONS: Record<TrialStatus, string> = { accepted: 'check_circle', pending: 'hourglass_top', rejected: 'block' };

/** `Trials`: test runs over the table, with recovery by the two-product formula and from weighed masses. */
@Component({
  selector: 'hs-trials-page',
  imports: [DecimalPipe, FormsModule, MatButtonModule, MatFormFieldModule, MatIconModule, MatInputModule, MatProgressBarModule, MatSelectModule, CautionCard],
  templateUrl: './trials-page.html',
  styleUrl: './trials-page.scss',
})
export default class TrialsPage {
  protected readonly store = inject(TrialsStore);
  private readonly session = inject(AuthSession);
  protected readonly planningStatement = PLANNING_ESTIMATE_STATEMENT;
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
  protected readonly saved = signal<string | null>(null);

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
    this.saved.set(null);
    try {
      await this.store.recordTrial({
        siteId, pileIds: this.pileIds(), trialDate: this.trialDate(), equipmentNote: this.equipmentNote(),
        feedMassKg: value.feedMassKg as number, feedGradeGpt: value.feedGradeGpt as number, concentrateMassKg: value.concentrateMassKg as number,
        concentrateGradeGpt: value.concentrateGradeGpt as number, tailingsGradeGpt: value.tailingsGradeGpt as number,
        middlingsMassKg: value.middlingsMassKg ?? null, middlingsGradeGpt: value.middlingsGradeGpt ?? null, status: this.status(),
      });
      this.values.set({});
      this.equipmentNote.set('');
      this.saved.set('Trial recorded.');
    } catch (error) {
      const problem = toApiProblem(error);
      this.problem.set(problem.message);
      this.details.set(problem.details.map((detail) => `${detail.path}: ${detail.message}`));
    }
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
