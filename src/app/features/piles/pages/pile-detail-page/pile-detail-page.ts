import { DecimalPipe, PercentPipe } from '@angular/common';
import { Component, computed, inject, input, signal, type OnDestroy, type OnInit } from '@angular/core';
import { FormsModule } from '@angular/forms';
import { RouterLink } from '@angular/router';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { cautionFor, PLANNING_ESTIMATE_STATEMENT } from '../../../../../../shared/safety/cautions';
import type { SampleData } from '../../../../../../shared/sync/protocol';
import { AuthSession } from '../../../../core/auth/auth-session';
import { CautionCard } from '../../../../shared/ui/caution-card/caution-card';
import { FootprintPreview } from '../../components/footprint-preview';
import { PilesStore, isUnreachable, type PileEstimateView, type PileView } from '../../piles.store';

/** One pile: its footprint, photos, samples, the engine's estimate with method and warnings, and its cautions. */
@Component({
  selector: 'hs-pile-detail-page',
  imports: [DecimalPipe, PercentPipe, FormsModule, RouterLink, MatButtonModule, MatFormFieldModule, MatIconModule, MatInputModule, CautionCard, FootprintPreview],
  templateUrl: './pile-detail-page.html',
  styleUrl: './pile-detail-page.scss',
})
export default class PileDetailPage implements OnInit, OnDestroy {
  /** The pile id from the route. */
  readonly id = input.required<string>();
  private readonly store = inject(PilesStore);
  private readonly session = inject(AuthSession);
  protected readonly statement = PLANNING_ESTIMATE_STATEMENT;
  protected readonly pile = signal<PileView | null>(null);
  protected readonly estimate = signal<PileEstimateView | null>(null);
  protected readonly estimateProblem = signal<string | null>(null);
  /** True when the estimate shown was worked out on this device because the server could not be reached. */
  protected readonly isEstimateFromDevice = signal(false);
  /** True when the pile record shown is this device's copy (offline). */
  protected readonly isPileFromDevice = signal(false);
  protected readonly samples = signal<readonly (SampleData & { revision: number })[]>([]);
  protected readonly photoUrls = signal<readonly string[]>([]);
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
      this.problem.set('This pile could not be loaded (it may belong to a site you are not a member of, or you are offline and this device does not hold it).');
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
    this.savedNote.set('Saved on this device and queued for sync; the estimate updates once the server has it.');
  }

  private async loadEstimate(): Promise<void> {
    try {
      this.estimate.set(await this.store.estimate(this.id()));
    } catch (error) {
      if (isUnreachable(error) && (await this.estimateFromDevice())) {
        return;
      }
      const details = (error as { error?: { error?: { details?: { message: string }[] } } }).error?.error?.details ?? [];
      this.estimateProblem.set(details.length > 0 ? details.map((detail) => detail.message).join('; ') : 'The estimate could not be loaded.');
    }
  }

  /** Offline: the same engine on the pile, samples and pan tests this device holds. False when it holds too little. */
  private async estimateFromDevice(): Promise<boolean> {
    const result = await this.store.estimateOnThisDevice(this.id());
    if (!result) {
      return false;
    }
    if (!result.ok) {
      this.estimateProblem.set(`offline, and the samples this device holds cannot be estimated: ${result.errors.map((error) => error.message).join('; ')}`);
      return true;
    }
    this.estimate.set({ ...result.value.estimate, sampleGrades: result.value.sampleGrades });
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
