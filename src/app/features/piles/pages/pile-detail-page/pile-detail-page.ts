import { Component, computed, inject, input, signal, type OnDestroy, type OnInit } from '@angular/core';
import { TranslocoPipe, TranslocoService } from '@jsverse/transloco';
import { FormsModule } from '@angular/forms';
import { RouterLink } from '@angular/router';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { cautionFor } from '../../../../../../shared/safety/cautions';
import type { SampleData } from '../../../../../../shared/sync/protocol';
import { AuthSession } from '../../../../core/auth/auth-session';
import { AppLanguage } from '../../../../i18n/app-language';
import { LOCALE_FORMAT_PIPES } from '../../../../i18n/locale-format.pipes';
import { CautionCard } from '../../../../shared/ui/caution-card/caution-card';
import { FootprintPreview } from '../../components/footprint-preview';
import { warningText } from '../../estimate-warnings';
import { PilesStore, isUnreachable, type PileEstimateView, type PileView } from '../../piles.store';

/** Why there is no estimate: a translation key with its parameters, or the server's own words. */
type EstimateProblem = { readonly key: string; readonly params?: Record<string, unknown>; readonly text?: undefined } | { readonly key?: undefined; readonly params?: undefined; readonly text: string };

/** One pile: its footprint, photos, samples, the engine's estimate with method and warnings, and its cautions. */
@Component({
  selector: 'hs-pile-detail-page',
  imports: [TranslocoPipe, LOCALE_FORMAT_PIPES, FormsModule, RouterLink, MatButtonModule, MatFormFieldModule, MatIconModule, MatInputModule, CautionCard, FootprintPreview],
  templateUrl: './pile-detail-page.html',
  styleUrl: './pile-detail-page.scss',
})
export default class PileDetailPage implements OnInit, OnDestroy {
  /** The pile id from the route. */
  readonly id = input.required<string>();
  private readonly store = inject(PilesStore);
  private readonly session = inject(AuthSession);
  private readonly transloco = inject(TranslocoService);
  private readonly language = inject(AppLanguage);
  protected readonly pile = signal<PileView | null>(null);
  protected readonly estimate = signal<PileEstimateView | null>(null);
  protected readonly estimateProblem = signal<EstimateProblem | null>(null);
  /** Samples this device holds with no pan test yet, left out of an estimate made here. */
  protected readonly ungradedOnDevice = signal(0);
  /** The engine's warnings in the active language (by their codes; a code the app does not know is shown as the engine wrote it). */
  protected readonly warningTexts = computed(() => {
    const locale = this.language.locale();
    return (this.estimate()?.warnings ?? []).map((warning) => warningText(warning, (key, params) => this.transloco.translate(key, params), locale));
  });
  /** True when the estimate shown was worked out on this device because the server could not be reached. */
  protected readonly isEstimateFromDevice = signal(false);
  /** True when the pile record shown is this device's copy (offline). */
  protected readonly isPileFromDevice = signal(false);
  protected readonly samples = signal<readonly (SampleData & { revision: number })[]>([]);
  protected readonly photoUrls = signal<readonly string[]>([]);
  /** Translation keys of the page's messages. */
  protected readonly problem = signal<string | null>(null);
  protected readonly savedNote = signal<string | null>(null);
  protected readonly cautions = computed(() => (this.pile()?.hazards ?? []).map((hazard) => cautionFor(hazard)));
  protected readonly points = computed(() => this.samples().flatMap((sample) => (sample.location ? [sample.location.coordinates as [number, number]] : [])));
  protected readonly gradeOf = computed(() => new Map((this.estimate()?.sampleGrades ?? []).map((grade) => [grade.sampleId, grade])));
  protected readonly canEdit = computed(() => ['geologist', 'sampler'].includes(this.session.role() ?? ''));
  protected edit = { heightM: null as number | null, angleOfReposeDeg: null as number | null, bulkDensityTPerM3: null as number | null, moisturePct: null as number | null, notes: '' };

  async ngOnInit(): Promise<void> {
    let pile: PileView | null;
    try {
      pile = await this.store.pile(this.id());
    } catch (error) {
      pile = isUnreachable(error) ? await this.store.heldPile(this.id()) : null;
      this.isPileFromDevice.set(pile !== null);
    }
    if (!pile) {
      this.problem.set('piles.detail.loadProblem');
      return;
    }
    this.pile.set(pile);
    this.edit = { heightM: pile.heightM, angleOfReposeDeg: pile.angleOfReposeDeg, bulkDensityTPerM3: pile.bulkDensityTPerM3, moisturePct: pile.moisturePct, notes: pile.notes };
    await Promise.all([this.loadEstimate(), this.loadSamples(), this.loadPhotos()]);
  }

  ngOnDestroy(): void {
    this.photoUrls().forEach((url) => URL.revokeObjectURL(url));
  }

  protected async saveEdit(): Promise<void> {
    const pile = this.pile();
    if (!pile) return;
    await this.store.savePileEdit(pile, { ...this.edit });
    this.savedNote.set('piles.detail.saved');
  }

  private async loadEstimate(): Promise<void> {
    try {
      this.estimate.set(await this.store.estimate(this.id()));
    } catch (error) {
      if (isUnreachable(error) && (await this.estimateFromDevice())) {
        return;
      }
      const details = (error as { error?: { error?: { details?: { message: string }[] } } }).error?.error?.details ?? [];
      this.estimateProblem.set(details.length > 0 ? { text: details.map((detail) => detail.message).join('; ') } : { key: 'piles.detail.estimateProblem' });
    }
  }

  /** Offline: the same engine on the pile, samples and pan tests this device holds. False when it holds too little. */
  private async estimateFromDevice(): Promise<boolean> {
    const result = await this.store.estimateOnThisDevice(this.id());
    if (!result) {
      return false;
    }
    if (!result.ok) {
      this.estimateProblem.set({ key: 'piles.detail.deviceCannotEstimate', params: { reasons: result.errors.map((error) => error.message).join('; ') } });
      return true;
    }
    this.estimate.set({ ...result.value.estimate, sampleGrades: result.value.sampleGrades });
    this.ungradedOnDevice.set(result.value.ungradedCount);
    this.isEstimateFromDevice.set(true);
    return true;
  }

  private async loadSamples(): Promise<void> {
    try {
      this.samples.set((await this.store.samples(this.id())).items);
    } catch (error) {
      this.samples.set(isUnreachable(error) ? await this.store.heldSamples(this.id()) : []);
    }
  }

  private async loadPhotos(): Promise<void> {
    const photos = (await this.store.photos(this.id()).catch(() => ({ items: [] }))).items.filter((photo) => photo.storedSizes.length > 0);
    this.photoUrls.set(await Promise.all(photos.map((photo) => this.store.photoUrl(photo.id))));
  }
}
