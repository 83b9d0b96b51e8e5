import { DatePipe, DecimalPipe } from '@angular/common';
import { Component, computed, effect, inject, signal } from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { MatSliderModule } from '@angular/material/slider';
import { buildShortlist, type ShortlistEntry } from '../../../../../../shared/engine';
import { CAUTIONS, PLANNING_ESTIMATE_STATEMENT } from '../../../../../../shared/safety/cautions';
import { AuthSession } from '../../../../core/auth/auth-session';
import { toApiProblem } from '../../../../core/http/api-error';
import { CautionCard } from '../../../../shared/ui/caution-card/caution-card';
import { SensitivityChart, type SensitivityEntry } from '../../components/sensitivity-chart/sensitivity-chart';
import { ShortlistStore, type EconomicParameters, type Overrides, type ShortlistRow } from '../../shortlist.store';

/** A row as the screen shows it: the server's figures, or the device's what-if recompute of them. */
type DisplayRow = ShortlistRow & { readonly isWhatIf: boolean };

/** The parameters the manager edits, with fractions shown as percent. */
interface ParameterField {
  readonly name: keyof EconomicParameters;
  readonly label: string;
  readonly isPercent: boolean;
  readonly step: number;
}

const PARAMETER_FIELDS: readonly ParameterField[] = [
  { name: 'goldPricePerTroyOz', label: 'Gold price per troy ounce', isPercent: false, step: 10 },
  { name: 'payableFraction', label: 'Payable by the buyer (%)', isPercent: true, step: 1 },
  { name: 'haulCostPerTKm', label: 'Load and haul per t·km', isPercent: false, step: 0.05 },
  { name: 'roadFactor', label: 'Road factor (road ÷ straight line)', isPercent: false, step: 0.05 },
  { name: 'processingCostPerT', label: 'Processing per tonne', isPercent: false, step: 1 },
  { name: 'fixedCostPerPile', label: 'Fixed cost per pile', isPercent: false, step: 10 },
  { name: 'ownerShareOfGross', label: 'Owner and crew share of gross (%)', isPercent: true, step: 1 },
  { name: 'confidenceLevel', label: 'Confidence level (%)', isPercent: true, step: 1 },
  { name: 'defaultRecovery', label: 'Recovery until a trial is accepted (%)', isPercent: true, step: 1 },
  { name: 'discrepancyTolerance', label: 'Trial discrepancy tolerance (%)', isPercent: true, step: 0.5 },
  { name: 'minSamplesToRank', label: 'Fewest samples to rank a pile', isPercent: false, step: 1 },
];

const SAFETY_HAZARDS = ['mercury', 'silica-dust', 'unstable-face', 'cyanide'];

/** `Shortlist` (manager): piles ranked by money with a conservative value, sensitivity, what-if and the report. */
@Component({
  selector: 'hs-shortlist-page',
  imports: [
    DatePipe, DecimalPipe, FormsModule, MatButtonModule, MatFormFieldModule, MatIconModule, MatInputModule, MatProgressBarModule,
    MatSelectModule, MatSliderModule, CautionCard, SensitivityChart,
  ],
  templateUrl: './shortlist-page.html',
  styleUrl: './shortlist-page.scss',
})
export default class ShortlistPage {
  protected readonly store = inject(ShortlistStore);
  private readonly session = inject(AuthSession);
  protected readonly planningStatement = PLANNING_ESTIMATE_STATEMENT;
  protected readonly cautions = CAUTIONS.filter((caution) => SAFETY_HAZARDS.includes(caution.hazard));
  protected readonly parameterFields = PARAMETER_FIELDS;
  protected readonly Math = Math;
  protected readonly sites = computed(() => this.session.user()?.sites ?? []);
  protected readonly siteId = signal<string | null>(this.session.user()?.sites[0]?.id ?? null);
  protected readonly isManager = computed(() => this.session.role() === 'manager');

  /** What-if values; null means "as the server has it". */
  protected readonly whatIfPrice = signal<number | null>(null);
  protected readonly whatIfRecoveryPercent = signal<number | null>(null);
  protected readonly whatIfHaulCost = signal<number | null>(null);
  protected readonly isWhatIf = computed(() => this.whatIfPrice() !== null || this.whatIfRecoveryPercent() !== null || this.whatIfHaulCost() !== null);

  protected readonly draft = signal<Record<string, number | string>>({});
  protected readonly saveProblem = signal<string | null>(null);
  protected readonly saveDetails = signal<readonly string[]>([]);
  protected readonly isSaving = signal(false);
  protected readonly mailTo = signal('');
  protected readonly mailStatus = signal<string | null>(null);
  protected readonly downloadProblem = signal<string | null>(null);

  protected readonly overrides = computed<Overrides>(() => {
    const overrides: Record<string, number> = {};
    if (this.whatIfPrice() !== null) overrides['goldPricePerTroyOz'] = this.whatIfPrice() as number;
    if (this.whatIfRecoveryPercent() !== null) overrides['recovery'] = (this.whatIfRecoveryPercent() as number) / 100;
    if (this.whatIfHaulCost() !== null) overrides['haulCostPerTKm'] = this.whatIfHaulCost() as number;
    return overrides;
  });

  protected readonly price = computed(() => this.whatIfPrice() ?? this.store.view()?.parameters.goldPricePerTroyOz ?? 0);
  protected readonly recoveryPercent = computed(() => this.whatIfRecoveryPercent() ?? Math.round((this.store.view()?.parameters.recovery ?? 0) * 1000) / 10);
  protected readonly haulCost = computed(() => this.whatIfHaulCost() ?? this.store.view()?.parameters.haulCostPerTKm ?? 0);

  /** The rows to show: the server's, or recomputed on this device by the same engine for the what-if. */
  protected readonly rows = computed<readonly DisplayRow[]>(() => {
    const view = this.store.view();
    if (!view) return [];
    if (!this.isWhatIf() || !view.site.processingPoint) return view.rows.map((row) => ({ ...row, isWhatIf: false }));
    const rankable = view.rows.filter((row) => row.isRankable && row.rank !== null);
    const result = buildShortlist(
      rankable.map((row) => ({ pileId: row.pileId, code: row.code, dryTonnes: row.dryTonnes ?? 0, centroid: row.centroid ?? { lon: 0, lat: 0 }, gradeGpt: row.gradeGpt ?? 0, gradeLowGpt: row.gradeLowGpt ?? 0 })),
      { ...view.parameters, processingPoint: view.site.processingPoint, goldPricePerTroyOz: this.price(), recovery: this.recoveryPercent() / 100, haulCostPerTKm: this.haulCost() },
    );
    if (!result.ok) return view.rows.map((row) => ({ ...row, isWhatIf: false }));
    const byId = new Map<string, ShortlistEntry>(result.value.entries.map((entry) => [entry.pileId, entry]));
    const recomputed = view.rows.map((row) => {
      const entry = byId.get(row.pileId);
      return entry ? { ...row, ...entry, breakEvenGradeGpt: Number.isFinite(entry.breakEvenGradeGpt) ? entry.breakEvenGradeGpt : null, isWhatIf: true } : { ...row, isWhatIf: false };
    });
    return recomputed.sort((a, b) => (a.rank ?? Infinity) - (b.rank ?? Infinity) || a.code.localeCompare(b.code));
  });

  protected readonly sensitivityEntries = computed<SensitivityEntry[]>(() =>
    this.rows().filter((row) => row.ranks && row.netValueByScenario).map((row) => ({ code: row.code, ranks: row.ranks!, netValueByScenario: row.netValueByScenario! })),
  );

  constructor() {
    effect(() => {
      const siteId = this.siteId();
      if (siteId) void this.store.load(siteId);
    });
    effect(() => {
      const economics = this.store.economics();
      if (economics) this.draft.set(this.toDraft(economics.parameters));
    });
  }

  protected chooseSite(siteId: string): void {
    this.resetWhatIf();
    this.siteId.set(siteId);
  }

  protected resetWhatIf(): void {
    this.whatIfPrice.set(null);
    this.whatIfRecoveryPercent.set(null);
    this.whatIfHaulCost.set(null);
  }

  protected setDraft(name: string, value: number | string): void {
    this.draft.update((draft) => ({ ...draft, [name]: value }));
  }

  protected async saveParameters(): Promise<void> {
    const siteId = this.siteId();
    const economics = this.store.economics();
    if (!siteId || !economics) return;
    const changes: Record<string, number | string> = {};
    const draft = this.draft();
    for (const field of PARAMETER_FIELDS) {
      const shown = Number(draft[field.name]);
      const value = field.isPercent ? Math.round(shown * 1000) / 100000 : shown;
      if (value !== economics.parameters[field.name]) changes[field.name] = value;
    }
    if (draft['currency'] !== economics.parameters.currency) changes['currency'] = String(draft['currency']).toUpperCase();
    this.saveProblem.set(null);
    this.saveDetails.set([]);
    if (Object.keys(changes).length === 0) {
      this.saveProblem.set('Nothing changed.');
      return;
    }
    this.isSaving.set(true);
    try {
      await this.store.saveEconomics(siteId, changes);
      this.resetWhatIf();
    } catch (error) {
      const problem = toApiProblem(error);
      this.saveProblem.set(problem.message);
      this.saveDetails.set(problem.details.map((detail) => `${this.labelOf(detail.path)}: ${detail.message}`));
    } finally {
      this.isSaving.set(false);
    }
  }

  protected async download(format: 'pdf' | 'csv'): Promise<void> {
    const siteId = this.siteId();
    if (!siteId) return;
    this.downloadProblem.set(null);
    try {
      await this.store.downloadReport(siteId, format, this.overrides());
    } catch (error) {
      this.downloadProblem.set(toApiProblem(error).message);
    }
  }

  protected async sendReport(): Promise<void> {
    const siteId = this.siteId();
    const to = this.mailTo().split(/[,;\s]+/).filter(Boolean);
    if (!siteId || to.length === 0) {
      this.mailStatus.set('Give at least one e-mail address.');
      return;
    }
    this.mailStatus.set('Sending…');
    try {
      const sent = await this.store.sendReport(siteId, to, this.overrides());
      this.mailStatus.set(sent.status === 'sent' ? `Sent to ${to.join(', ')}.` : `Not sent: ${sent.errorMessage ?? sent.status}. It is kept in the Outbox.`);
    } catch (error) {
      const problem = toApiProblem(error);
      this.mailStatus.set([problem.message, ...problem.details.map((detail) => detail.message)].join(': '));
    }
  }

  protected labelOf(name: string): string {
    return PARAMETER_FIELDS.find((field) => field.name === name)?.label ?? name;
  }

  protected formatChange(name: string, value: string | number | null): string {
    const field = PARAMETER_FIELDS.find((candidate) => candidate.name === name);
    if (typeof value !== 'number') return String(value ?? '—');
    return field?.isPercent ? `${Math.round(value * 1000) / 10} %` : String(value);
  }

  private toDraft(parameters: EconomicParameters): Record<string, number | string> {
    const draft: Record<string, number | string> = { currency: parameters.currency };
    for (const field of PARAMETER_FIELDS) {
      const value = parameters[field.name] as number;
      draft[field.name] = field.isPercent ? Math.round(value * 100000) / 1000 : value;
    }
    return draft;
  }
}
