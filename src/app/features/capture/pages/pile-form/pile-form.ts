import { Component, computed, inject, signal, type OnDestroy, type OnInit } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { Router } from '@angular/router';
import { TranslocoPipe } from '@jsverse/transloco';
import { HAZARDS, cautionFor, type Hazard } from '../../../../../../shared/safety/cautions';
import { PILE_MATERIALS, SHAPE_MODELS, parseEntityData, type PileData } from '../../../../../../shared/sync/protocol';
import { CautionCard } from '../../../../shared/ui/caution-card/caution-card';
import { keepFormIfStorageFull } from '../../../../core/db/storage-full';
import { CaptureStore } from '../../capture.store';
import { FootprintMap } from '../../components/footprint-map';
import { SpotHeightsEditor, type SpotHeightPoint } from '../../components/spot-heights-editor/spot-heights-editor';
import { checkSpotHeights, estimateSurveyedPile, measurePileFootprint } from '../../engine-adapter';
import { LOCALE_FORMAT_PIPES } from '../../../../i18n/locale-format.pipes';

/** GPS fixes worse than this (m) are dropped while walking the toe. */
const MAX_FIX_ACCURACY_M = 10;
const DRAFT_KEY = 'pile-form';
/**
 * Our own rule, not a standard: a surveyed pile is saved only with at least 3 spot heights inside its
 * footprint. Fewer gives a surface of one or two ridges over the toe, which says little about the pile.
 */
const MIN_SURVEYED_SPOT_HEIGHTS = 3;

/** A new pile: material, shape, height, hazards with their cautions, footprint walked or drawn, photos. */
@Component({
  selector: 'hs-pile-form',
  imports: [ReactiveFormsModule, MatButtonModule, MatCheckboxModule, MatFormFieldModule, MatIconModule, MatInputModule, MatSelectModule, CautionCard, FootprintMap, SpotHeightsEditor, TranslocoPipe, ...LOCALE_FORMAT_PIPES],
  template: `
    <section class="hs-page">
      <h1>{{ 'pileForm.title' | transloco }}</h1>
      <form [formGroup]="form" (ngSubmit)="submit()">
        <mat-form-field><mat-label>{{ 'pileForm.site' | transloco }}</mat-label>
          <mat-select formControlName="siteId">@for (site of store.sites(); track site.id) { <mat-option [value]="site.id">{{ site.code }} {{ site.name }}</mat-option> }</mat-select>
        </mat-form-field>
        <mat-form-field><mat-label>{{ 'pileForm.material' | transloco }}</mat-label>
          <mat-select formControlName="material">@for (material of materials; track material) { <mat-option [value]="material">{{ 'common.terms.material.' + material | transloco }}</mat-option> }</mat-select>
        </mat-form-field>
        <mat-form-field><mat-label>{{ 'pileForm.shapeModel' | transloco }}</mat-label>
          <mat-select formControlName="shapeModel">@for (shape of shapes; track shape) { <mat-option [value]="shape">{{ 'common.terms.shapeModel.' + shape | transloco }}</mat-option> }</mat-select>
        </mat-form-field>
        @if (shapeModel() === 'sacks') {
          <mat-form-field><mat-label>{{ 'pileForm.sackCount' | transloco }}</mat-label><input matInput type="number" inputmode="numeric" formControlName="sackCount" /></mat-form-field>
          <mat-form-field><mat-label>{{ 'pileForm.sackMass' | transloco }}</mat-label><input matInput type="number" inputmode="decimal" formControlName="sackMassKg" /></mat-form-field>
        } @else {
          <mat-form-field><mat-label>{{ 'pileForm.height' | transloco }}</mat-label><input matInput type="number" inputmode="decimal" formControlName="heightM" /></mat-form-field>
        }
        @if (shapeModel() === 'flat-topped') {
          <mat-form-field><mat-label>{{ 'pileForm.angleOfRepose' | transloco }}</mat-label><input matInput type="number" inputmode="decimal" formControlName="angleOfReposeDeg" /></mat-form-field>
        }
        <mat-form-field><mat-label>{{ 'pileForm.moisture' | transloco }}</mat-label><input matInput type="number" inputmode="decimal" formControlName="moisturePct" /></mat-form-field>

        <fieldset><legend>{{ 'pileForm.hazards' | transloco }}</legend>
          @for (hazard of hazards; track hazard) {
            <mat-checkbox [checked]="hasHazard(hazard)" (change)="toggleHazard(hazard)">{{ 'ui.caution.hazards.' + hazard + '.title' | transloco }}</mat-checkbox>
            @if (hasHazard(hazard)) { <hs-caution-card [caution]="cautionFor(hazard)" /> }
          }
        </fieldset>
        <mat-form-field><mat-label>{{ 'pileForm.notes' | transloco }}</mat-label><textarea matInput formControlName="notes"></textarea></mat-form-field>

        <h2>{{ 'pileForm.footprint' | transloco }}</h2>
        <hs-footprint-map [corners]="corners()" (cornerAdded)="addCorner($event)" />
        <div class="row">
          <button mat-stroked-button type="button" (click)="toggleWalking()"><mat-icon aria-hidden="true">directions_walk</mat-icon> {{ (isWalking() ? 'pileForm.stopWalking' : 'pileForm.walkTheToe') | transloco }}</button>
          <button mat-stroked-button type="button" (click)="clearCorners()"><mat-icon aria-hidden="true">undo</mat-icon> {{ 'pileForm.clear' | transloco }}</button>
        </div>
        <p role="status">{{ 'pileForm.corners' | transloco: { count: corners().length } }}
          @if (lastAccuracyM() !== null) { · {{ 'pileForm.lastFix' | transloco: { metres: lastAccuracyM(), limit: maxAccuracy } }} }
          @if (footprintMeasure(); as measure) { @if ('areaM2' in measure) { · {{ 'pileForm.area' | transloco: { area: (measure.areaM2 | hsNumber: '1.0-0') } }} } @else { · {{ footprintProblemKey(measure.code) | transloco }} } }
        </p>
        @if (shapeModel() === 'surveyed') {
          <h2>{{ 'pileForm.spotHeights' | transloco }}</h2>
          <hs-spot-heights-editor [footprint]="footprint()" [points]="spotHeights()" (pointsChange)="setSpotHeights($event)" />
          <p role="status" data-testid="surveyed-estimate">
            @if (surveyedEstimate(); as estimate) {
              @if ('volumeM3' in estimate) {
                {{ 'pileForm.surveyedEstimate' | transloco: { volume: (estimate.volumeM3 | hsNumber: '1.0-1'), tonnes: (estimate.dryTonnes | hsNumber: '1.0-1') } }}
              } @else { {{ 'pileForm.surveyedNoEstimate' | transloco }} }
            }
            @if (countedSpotHeights() < minimumSpotHeights) { · {{ 'pileForm.spotHeightsNeeded' | transloco: { minimum: minimumSpotHeights, counted: countedSpotHeights() } }} }
          </p>
        }
        <p class="hs-muted">{{ 'common.planningStatement' | transloco }}</p>

        <label class="photo"><mat-icon aria-hidden="true">photo_camera</mat-icon> {{ 'pileForm.addPhoto' | transloco }}
          <input class="hs-file" type="file" accept="image/*" capture="environment" (change)="keepPhoto($event)" /></label>
        <p role="status">{{ 'common.terms.photoCount' | transloco: { count: pendingPhotos().length } }}</p>
        @for (error of errors(); track error) { <p class="error" role="alert">{{ error.key | transloco: error.params }}</p> }
        <button mat-flat-button type="submit"><mat-icon aria-hidden="true">save</mat-icon> {{ 'pileForm.save' | transloco }}</button>
      </form>
    </section>
  `,
  styles: `
    form { display: flex; flex-direction: column; gap: 4px; }
    fieldset { border: 1px solid var(--mat-sys-outline-variant); border-radius: 12px; display: flex; flex-direction: column; gap: 8px; }
    .row { display: flex; gap: 8px; margin-top: 8px; } button { min-height: 48px; }
    .photo { display: inline-flex; align-items: center; justify-content: center; gap: 8px; min-height: 48px; padding: 0 20px; border-radius: 24px;
      border: 1px solid var(--mat-sys-outline); color: var(--mat-sys-primary); font: var(--mat-sys-label-large); cursor: pointer; align-self: flex-start; }
    .photo:focus-within { outline: 3px solid var(--mat-sys-primary); outline-offset: 2px; }
    .hs-file { position: absolute; width: 1px; height: 1px; opacity: 0; overflow: hidden; }
    .error { color: var(--mat-sys-error); } button[type=submit] { min-height: 56px; }
  `,
})
export default class PileForm implements OnInit, OnDestroy {
  protected readonly store = inject(CaptureStore);
  private readonly router = inject(Router);
  protected readonly materials = PILE_MATERIALS;
  protected readonly shapes = SHAPE_MODELS;
  protected readonly hazards = HAZARDS;
  protected readonly cautionFor = cautionFor;
  protected readonly maxAccuracy = MAX_FIX_ACCURACY_M;
  protected readonly minimumSpotHeights = MIN_SURVEYED_SPOT_HEIGHTS;
  protected readonly form = inject(NonNullableFormBuilder).group({
    siteId: ['', Validators.required],
    material: ['sluice-tailings' as PileData['material']],
    shapeModel: ['cone' as PileData['shapeModel']],
    heightM: [2 as number | null],
    angleOfReposeDeg: [34 as number | null],
    moisturePct: [null as number | null],
    sackCount: [null as number | null],
    sackMassKg: [null as number | null],
    hazards: [[] as Hazard[]],
    notes: [''],
  });
  protected readonly shapeModel = toSignal(this.form.controls.shapeModel.valueChanges, { initialValue: this.form.controls.shapeModel.value });
  protected readonly corners = signal<[number, number][]>([]);
  protected readonly spotHeights = signal<readonly SpotHeightPoint[]>([]);
  private readonly material = toSignal(this.form.controls.material.valueChanges, { initialValue: this.form.controls.material.value });
  private readonly moisturePct = toSignal(this.form.controls.moisturePct.valueChanges, { initialValue: this.form.controls.moisturePct.value });
  /** Spot heights the surveyed volume will count: inside the footprint and not a repeat. */
  protected readonly countedSpotHeights = computed(() => checkSpotHeights(this.footprint(), this.spotHeights()).filter((check) => check.status === 'counted').length);
  protected readonly surveyedEstimate = computed(() => {
    if (this.shapeModel() !== 'surveyed' || this.countedSpotHeights() === 0) return null;
    return estimateSurveyedPile({ material: this.material(), footprint: this.footprint(), moisturePct: this.moisturePct(), spotHeights: this.spotHeights() });
  });
  protected readonly isWalking = signal(false);
  protected readonly lastAccuracyM = signal<number | null>(null);
  protected readonly pendingPhotos = signal<Blob[]>([]);
  protected readonly errors = signal<{ key: string; params: Record<string, unknown> }[]>([]);
  protected readonly footprint = computed<PileData['footprint']>(() => {
    const corners = this.corners();
    return corners.length >= 3 ? { type: 'Polygon', coordinates: [[...corners, corners[0]]] } : null;
  });
  protected readonly footprintMeasure = computed(() => {
    const footprint = this.footprint();
    return footprint ? measurePileFootprint(footprint) : null;
  });
  private watchId: number | null = null;

  async ngOnInit(): Promise<void> {
    const draft = await this.store.draft<{ form: Partial<ReturnType<PileForm["form"]["getRawValue"]>>; corners: [number, number][]; spotHeights?: SpotHeightPoint[] }>(DRAFT_KEY);
    if (draft) {
      this.form.patchValue(draft.form);
      this.corners.set(draft.corners);
      // Drafts kept before spot heights were captured have none.
      this.spotHeights.set(draft.spotHeights ?? []);
    }
    if (!this.form.value.siteId && this.store.sites()[0]) {
      this.form.patchValue({ siteId: this.store.sites()[0].id });
    }
    this.form.valueChanges.subscribe(() => void this.keepDraft());
  }

  ngOnDestroy(): void {
    this.stopWalking();
  }

  /** Why the footprint cannot be measured, in the crew's language, from the engine's error code. */
  protected footprintProblemKey(code: string | null): string {
    if (code === 'self-intersection') return 'pileForm.footprintProblems.crosses';
    if (code === 'degenerate-ring') return 'pileForm.footprintProblems.noArea';
    return 'pileForm.footprintProblems.other';
  }

  protected setSpotHeights(points: readonly SpotHeightPoint[]): void {
    this.spotHeights.set(points);
    void this.keepDraft();
  }

  protected hasHazard(hazard: Hazard): boolean {
    return this.form.controls.hazards.value.includes(hazard);
  }

  protected toggleHazard(hazard: Hazard): void {
    const current = this.form.controls.hazards.value;
    this.form.controls.hazards.setValue(current.includes(hazard) ? current.filter((item) => item !== hazard) : [...current, hazard]);
  }

  protected addCorner(corner: [number, number]): void {
    this.corners.update((corners) => [...corners, corner]);
    void this.keepDraft();
  }

  protected clearCorners(): void {
    this.corners.set([]);
    void this.keepDraft();
  }

  protected toggleWalking(): void {
    if (this.isWalking()) {
      this.stopWalking();
      return;
    }
    this.isWalking.set(true);
    this.watchId = navigator.geolocation.watchPosition((position) => {
      this.lastAccuracyM.set(Math.round(position.coords.accuracy));
      if (position.coords.accuracy <= MAX_FIX_ACCURACY_M) {
        this.addCorner([position.coords.longitude, position.coords.latitude]);
      }
    }, () => this.stopWalking(), { enableHighAccuracy: true });
  }

  protected keepPhoto(event: Event): void {
    const file = (event.target as HTMLInputElement).files?.[0];
    if (file) {
      this.pendingPhotos.update((photos) => [...photos, file]);
    }
  }

  /** Save; on a full phone the notice shows and the form stays as it is. */
  protected submit(): Promise<void> {
    return keepFormIfStorageFull(() => this.savePile());
  }

  private async savePile(): Promise<void> {
    const value = this.form.getRawValue();
    const site = this.store.sites().find((candidate) => candidate.id === value.siteId);
    if (!site) {
      this.errors.set([{ key: 'pileForm.problems.chooseSite', params: {} }]);
      return;
    }
    const isSacks = value.shapeModel === 'sacks';
    const isSurveyed = value.shapeModel === 'surveyed';
    if (isSurveyed && this.countedSpotHeights() < MIN_SURVEYED_SPOT_HEIGHTS) {
      this.errors.set([{ key: 'pileForm.problems.fewSpotHeights', params: { minimum: MIN_SURVEYED_SPOT_HEIGHTS, counted: this.countedSpotHeights() } }]);
      return;
    }
    const pile: PileData = {
      id: crypto.randomUUID(), siteId: site.id, code: await this.store.nextCode(site.code, 'pile'), material: value.material,
      footprint: this.footprint(), heightM: isSacks ? null : value.heightM, shapeModel: value.shapeModel,
      angleOfReposeDeg: value.shapeModel === 'flat-topped' ? value.angleOfReposeDeg : null, bulkDensityTPerM3: null, moisturePct: value.moisturePct, // Every point kept is saved, flagged ones too (the estimate leaves them out with a warning): nothing measured is lost.
      spotHeights: isSurveyed ? this.spotHeights().map(({ lon, lat, heightM }) => ({ lon, lat, heightM })) : null,
      sackCount: isSacks ? value.sackCount : null, sackMassKg: isSacks ? value.sackMassKg : null, hazards: value.hazards, notes: value.notes,
    };
    const checked = parseEntityData('pile', pile);
    if (!checked.ok) {
      this.errors.set(checked.errors.map((error) => ({ key: 'pileForm.problems.notAccepted', params: { field: error.path, message: error.message } })));
      return;
    }
    // The pile and its photos in one device write: a full phone or a closed page keeps both or neither.
    await this.store.savePile(pile, this.pendingPhotos());
    await this.store.clearDraft(DRAFT_KEY);
    await this.router.navigateByUrl('/capture');
  }

  private stopWalking(): void {
    if (this.watchId !== null) {
      navigator.geolocation.clearWatch(this.watchId);
      this.watchId = null;
    }
    this.isWalking.set(false);
  }

  private keepDraft(): Promise<void> {
    return this.store.saveDraft(DRAFT_KEY, { form: this.form.getRawValue(), corners: this.corners(), spotHeights: this.spotHeights() });
  }
}
