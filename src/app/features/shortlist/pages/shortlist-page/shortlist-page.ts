import { formatNumber, formatPercent } from '@angular/common';
import { Component, computed, effect, inject, signal } from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { MatSliderModule } from '@angular/material/slider';
import { TranslocoPipe, TranslocoService } from '@jsverse/transloco';
import { buildShortlist, type ShortlistEntry } from '../../../../../../shared/engine';
import { CAUTIONS } from '../../../../../../shared/safety/cautions';
import { AuthSession } from '../../../../core/auth/auth-session';
import { toApiProblem, type ApiProblem } from '../../../../core/http/api-error';
import { AppLanguage } from '../../../../i18n/app-language';
import { LOCALE_FORMAT_PIPES } from '../../../../i18n/locale-format.pipes';
import { CautionCard } from '../../../../shared/ui/caution-card/caution-card';
import { SensitivityChart, type SensitivityEntry } from '../../components/sensitivity-chart/sensitivity-chart';
import { PARAMETER_NAMES, assumption, thinDataReason, type ServerText, type ServerTextFormat } from '../../server-text';
import { ShortlistStore, type EconomicParameters, type Overrides, type ShortlistRow } from '../../shortlist.store';

/** Something the screen says: a translation key and the values it holds. */
interface Message {
  readonly key: string;
  readonly params?: Readonly<Record<string, string | number>>;
}

/** A row as the screen shows it: the server's figures, or the device's what-if recompute of them. */
type DisplayRow = ShortlistRow & { readonly isWhatIf: boolean };

/** The parameters the manager edits, with fractions shown as percent. */
interface ParameterField {
  readonly name: keyof EconomicParameters;
  /** The translation key of its label. */
  readonly label: string;
  readonly isPercent: boolean;
  readonly step: number;
}

const PARAMETER_FIELDS: readonly ParameterField[] = [
  { name: 'goldPricePerTroyOz', label: 'shortlist.parameters.fields.goldPricePerTroyOz', isPercent: false, step: 10 },
  { name: 'payableFraction', label: 'shortlist.parameters.fields.payableFraction', isPercent: true, step: 1 },
  { name: 'haulCostPerTKm', label: 'shortlist.parameters.fields.haulCostPerTKm', isPercent: false, step: 0.05 },
  { name: 'roadFactor', label: 'shortlist.parameters.fields.roadFactor', isPercent: false, step: 0.05 },
  { name: 'processingCostPerT', label: 'shortlist.parameters.fields.processingCostPerT', isPercent: false, step: 1 },
  { name: 'fixedCostPerPile', label: 'shortlist.parameters.fields.fixedCostPerPile', isPercent: false, step: 10 },
  { name: 'ownerShareOfGross', label: 'shortlist.parameters.fields.ownerShareOfGross', isPercent: true, step: 1 },
  { name: 'confidenceLevel', label: 'shortlist.parameters.fields.confidenceLevel', isPercent: true, step: 1 },
  { name: 'defaultRecovery', label: 'shortlist.parameters.fields.defaultRecovery', isPercent: true, step: 1 },
  { name: 'discrepancyTolerance', label: 'shortlist.parameters.fields.discrepancyTolerance', isPercent: true, step: 0.5 },
  { name: 'minSamplesToRank', label: 'shortlist.parameters.fields.minSamplesToRank', isPercent: false, step: 1 },
];

const SAFETY_HAZARDS = ['mercury', 'silica-dust', 'unstable-face', 'cyanide'];

/** `Shortlist` (manager): piles ranked by money with a conservative value, sensitivity, what-if and the report. */
@Component({
  selector: 'hs-shortlist-page',
  imports: [
    TranslocoPipe, LOCALE_FORMAT_PIPES, FormsModule, MatButtonModule, MatFormFieldModule, MatIconModule, MatInputModule, MatProgressBarModule,
    MatSelectModule, MatSliderModule, CautionCard, SensitivityChart,
  ],
  templateUrl: './shortlist-page.html',
  styleUrl: './shortlist-page.scss',
})
export default class ShortlistPage {
  protected readonly store = inject(ShortlistStore);
  private readonly session = inject(AuthSession);
  private readonly transloco = inject(TranslocoService);
  private readonly language = inject(AppLanguage);
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
  protected readonly saveProblem = signal<Message | null>(null);
  protected readonly saveDetails = signal<ApiProblem['details']>([]);
  protected readonly isSaving = signal(false);
  protected readonly mailTo = signal('');
  protected readonly mailStatus = signal<Message | null>(null);
  protected readonly downloadProblem = signal<Message | null>(null);
  /** Why the shortlist could not be loaded, in the person's language. */
  protected readonly loadProblem = computed<Message | null>(() => {
    const problem = this.store.problem();
    return problem ? this.problemMessage(problem, 'shortlist.problems.load') : null;
  });

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

  /** The figures the server wrote into its reasons and assumptions, in this language's digits. */
  private readonly serverTextFormat = computed<ServerTextFormat>(() => {
    const locale = this.language.locale();
    return {
      number: (value) => formatNumber(value, locale, '1.0-2'),
      percent: (value) => formatPercent(value, locale, '1.0-1'),
      field: (name) => this.transloco.translate(`shortlist.parameters.fields.${name}`),
    };
  });

  /** Why each pile too thin to rank is not ranked, joined, by pile id. */
  protected readonly thinReasons = computed<ReadonlyMap<string, string>>(() => {
    const format = this.serverTextFormat();
    return new Map((this.store.view()?.rows ?? []).map((row) => [row.pileId, row.thinDataReasons.map((reason) => this.say(thinDataReason(reason, format))).join('; ')]));
  });

  /** The assumptions the shortlist rests on, said in the person's language. */
  protected readonly assumptions = computed<readonly string[]>(() => {
    const format = this.serverTextFormat();
    return (this.store.view()?.assumptions ?? []).map((sentence) => this.say(assumption(sentence, format)));
  });

  /** A slider's thumb label in the locale's digits. */
  protected readonly sliderLabel = (value: number): string => formatNumber(value, this.language.locale(), '1.0-2');

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
      this.saveProblem.set({ key: 'shortlist.problems.nothingChanged' });
      return;
    }
    this.isSaving.set(true);
    try {
      await this.store.saveEconomics(siteId, changes);
      this.resetWhatIf();
    } catch (error) {
      const problem = toApiProblem(error);
      this.saveProblem.set(this.problemMessage(problem, 'shortlist.problems.save'));
      this.saveDetails.set(problem.details);
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
      this.downloadProblem.set(this.problemMessage(toApiProblem(error), 'shortlist.problems.download'));
    }
  }

  protected async sendReport(): Promise<void> {
    const siteId = this.siteId();
    const to = this.mailTo().split(/[,;\s]+/).filter(Boolean);
    if (!siteId || to.length === 0) {
      this.mailStatus.set({ key: 'shortlist.report.needAddress' });
      return;
    }
    this.mailStatus.set({ key: 'shortlist.report.sending' });
    try {
      const sent = await this.store.sendReport(siteId, to, this.overrides());
      this.mailStatus.set(sent.status === 'sent'
        ? { key: 'shortlist.report.sent', params: { to: to.join(', ') } }
        : { key: 'shortlist.report.notSent', params: { reason: sent.errorMessage ?? sent.status } });
    } catch (error) {
      const problem = toApiProblem(error);
      const withDetails = { ...problem, message: [problem.message, ...problem.details.map((detail) => detail.message)].join(': ') };
      this.mailStatus.set(this.problemMessage(withDetails, 'shortlist.report.sendProblem'));
    }
  }

  /** A parameter's label in the person's language; a name the screen does not know stays as the server gave it. */
  protected labelOf(name: string): string {
    this.language.active();
    return PARAMETER_NAMES.includes(name as keyof EconomicParameters) ? this.transloco.translate(`shortlist.parameters.fields.${name}`) : name;
  }

  /**
   * A recorded value in the locale's digits: a fraction as a percent, a number without grouping
   * (as the manager typed it, so "2000 → 1600"), a currency code as written.
   */
  protected formatChange(name: string, value: string | number | null): string {
    const field = PARAMETER_FIELDS.find((candidate) => candidate.name === name);
    if (typeof value !== 'number') return String(value ?? '—');
    const locale = this.language.locale();
    if (field?.isPercent) return formatPercent(value, locale, '1.0-1');
    return new Intl.NumberFormat(locale, { useGrouping: false, maximumFractionDigits: 6 }).format(value);
  }

  /** A refusal from the API: no signal said as such; otherwise the screen's words with the server's reason. */
  private problemMessage(problem: ApiProblem, key: string): Message {
    return problem.code === 'offline' ? { key: 'shortlist.problems.offline' } : { key, params: { message: problem.message } };
  }

  private say(text: ServerText): string {
    return 'key' in text ? this.transloco.translate(text.key, text.params) : text.text;
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
