import { Component, computed, model, input, signal } from '@angular/core';
import { FormControl, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { TranslocoPipe } from '@jsverse/transloco';
import type { PileData } from '../../../../../../shared/sync/protocol';
import { LOCALE_FORMAT_PIPES } from '../../../../i18n/locale-format.pipes';
import { checkSpotHeights, measurePileFootprint } from '../../engine-adapter';

/** A height measured on the pile, m above its base, where it was taken, and how good that fix was. */
export interface SpotHeightPoint {
  readonly lon: number;
  readonly lat: number;
  readonly heightM: number;
  /** GPS accuracy of the fix, m (null when not known). */
  readonly accuracyM: number | null;
}

/** Fixes worse than this (m) are refused: a spot height a pace off lands on the wrong slope. */
export const MAX_SPOT_FIX_ACCURACY_M = 10;
/** The sync schema keeps at most this many spot heights per pile. */
export const MAX_SPOT_HEIGHTS = 500;
const MAX_HEIGHT_M = 100;
// 30 s: a phone coming out of a pocket can take that long to reach a good fix under open sky.
const FIX_TIMEOUT_MS = 30_000;

type Notice = { readonly key: string; readonly params: Record<string, unknown> };

/** The spot heights of a surveyed pile: stand on a point, take a GPS fix, enter the height; each checked against the footprint. */
@Component({
  selector: 'hs-spot-heights-editor',
  imports: [ReactiveFormsModule, MatButtonModule, MatFormFieldModule, MatIconModule, MatInputModule, TranslocoPipe, ...LOCALE_FORMAT_PIPES],
  template: `
    <p class="hs-muted">{{ 'spotHeights.intro' | transloco }}</p>
    @if (!hasFootprint()) { <p class="hint" data-testid="no-footprint">{{ 'spotHeights.noFootprint' | transloco }}</p> }
    <ol class="points" [attr.aria-label]="'spotHeights.listLabel' | transloco">
      @for (point of points(); track $index; let index = $index) {
        <li [class.flagged]="checks()[index].status === 'outside' || checks()[index].status === 'repeated'">
          <span class="what">{{ 'spotHeights.point' | transloco: { number: index + 1, height: (point.heightM | hsNumber: '1.0-2') } }}
            @if (point.accuracyM !== null) { <span class="hs-muted">{{ 'spotHeights.accuracy' | transloco: { metres: point.accuracyM } }}</span> }
            @switch (checks()[index].status) {
              @case ('outside') { <span class="flag" data-testid="flag-outside"><mat-icon aria-hidden="true">wrong_location</mat-icon> {{ 'spotHeights.outside' | transloco }}</span> }
              @case ('repeated') { <span class="flag" data-testid="flag-repeated"><mat-icon aria-hidden="true">content_copy</mat-icon> {{ repeatedKey(index) | transloco: { number: repeatedOf(index) } }}</span> }
            }
          </span>
          <button mat-icon-button type="button" (click)="removePoint(index)" [attr.aria-label]="'spotHeights.remove' | transloco: { number: index + 1 }"><mat-icon aria-hidden="true">delete</mat-icon></button>
        </li>
      }
    </ol>
    <p role="status" data-testid="spot-summary">{{ 'spotHeights.summary' | transloco: { counted: countedCount(), count: points().length } }}</p>

    @if (pendingFix(); as fix) {
      <div class="pending">
        <p>{{ 'spotHeights.fixTaken' | transloco: { metres: fix.accuracyM } }}</p>
        <mat-form-field>
          <mat-label>{{ 'spotHeights.height' | transloco }}</mat-label>
          <input matInput type="number" inputmode="decimal" min="0" max="100" step="0.1" [formControl]="height" data-testid="spot-height-input" (keydown.enter)="$event.preventDefault(); keepPoint()" />
          <mat-hint>{{ 'spotHeights.heightHint' | transloco }}</mat-hint>
          @if (height.invalid && height.touched) { <mat-error>{{ 'spotHeights.heightRange' | transloco: { max: maxHeight } }}</mat-error> }
        </mat-form-field>
        <div class="row">
          <button mat-flat-button type="button" (click)="keepPoint()"><mat-icon aria-hidden="true">check</mat-icon> {{ 'spotHeights.keep' | transloco }}</button>
          <button mat-stroked-button type="button" (click)="cancelFix()"><mat-icon aria-hidden="true">close</mat-icon> {{ 'spotHeights.cancel' | transloco }}</button>
        </div>
      </div>
    } @else {
      <button mat-stroked-button type="button" class="add" (click)="takeFix()" [disabled]="isLocating() || points().length >= maxPoints">
        <mat-icon aria-hidden="true">my_location</mat-icon> {{ (isLocating() ? 'spotHeights.locating' : 'spotHeights.addHere') | transloco }}
      </button>
    }
    @if (points().length >= maxPoints) { <p class="hs-muted">{{ 'spotHeights.full' | transloco: { max: maxPoints } }}</p> }
    @if (notice(); as notice) { <p class="error" role="alert" data-testid="spot-notice">{{ notice.key | transloco: notice.params }}</p> }
  `,
  styles: `
    :host { display: flex; flex-direction: column; gap: 8px; }
    .points { margin: 0; padding-left: 24px; display: flex; flex-direction: column; gap: 4px; }
    .points li { display: flex; align-items: center; justify-content: space-between; gap: 8px; min-height: 48px; }
    .what { display: flex; flex-wrap: wrap; gap: 4px 12px; align-items: center; }
    .flag { display: inline-flex; align-items: center; gap: 4px; color: var(--mat-sys-error); font-weight: 500; }
    .pending { display: flex; flex-direction: column; gap: 4px; padding: 8px 12px; border: 1px solid var(--mat-sys-outline); border-radius: 12px; }
    .row { display: flex; gap: 8px; flex-wrap: wrap; }
    button { min-height: 48px; } button[mat-icon-button] { width: 48px; height: 48px; }
    .add { align-self: stretch; }
    .error { color: var(--mat-sys-error); }
  `,
})
export class SpotHeightsEditor {
  /** The footprint the points are checked against (null while the toe is not walked yet). */
  readonly footprint = input<PileData['footprint']>(null);
  /** The points, in the order taken; the editor writes back through `pointsChange`. */
  readonly points = model<readonly SpotHeightPoint[]>([]);
  protected readonly maxPoints = MAX_SPOT_HEIGHTS;
  protected readonly maxHeight = MAX_HEIGHT_M;
  protected readonly height = new FormControl<number | null>(null, [Validators.required, Validators.min(0), Validators.max(MAX_HEIGHT_M)]);
  protected readonly pendingFix = signal<{ lon: number; lat: number; accuracyM: number } | null>(null);
  protected readonly isLocating = signal(false);
  protected readonly notice = signal<Notice | null>(null);
  protected readonly checks = computed(() => checkSpotHeights(this.footprint(), this.points()));
  protected readonly hasFootprint = computed(() => {
    const footprint = this.footprint();
    return footprint !== null && 'areaM2' in measurePileFootprint(footprint);
  });
  protected readonly countedCount = computed(() => this.checks().filter((check) => check.status === 'counted').length);

  /** Asks the phone for one high-accuracy fix; a fix worse than ±10 m is refused with its accuracy. */
  protected takeFix(): void {
    this.notice.set(null);
    if (!navigator.geolocation) {
      this.notice.set({ key: 'spotHeights.problems.noGps', params: {} });
      return;
    }
    this.isLocating.set(true);
    navigator.geolocation.getCurrentPosition((position) => {
      this.isLocating.set(false);
      const accuracyM = Math.round(position.coords.accuracy * 10) / 10;
      if (!(position.coords.accuracy <= MAX_SPOT_FIX_ACCURACY_M)) {
        this.notice.set({ key: 'spotHeights.problems.poorFix', params: { metres: accuracyM, limit: MAX_SPOT_FIX_ACCURACY_M } });
        return;
      }
      this.height.reset(null);
      this.pendingFix.set({ lon: position.coords.longitude, lat: position.coords.latitude, accuracyM });
    }, (error) => {
      this.isLocating.set(false);
      const key = error.code === 1 ? 'spotHeights.problems.denied' : error.code === 3 ? 'spotHeights.problems.timeout' : 'spotHeights.problems.unavailable';
      this.notice.set({ key, params: {} });
    }, { enableHighAccuracy: true, timeout: FIX_TIMEOUT_MS, maximumAge: 0 });
  }

  /** Keeps the pending fix with the height typed, when the height is 0–100 m. */
  protected keepPoint(): void {
    const fix = this.pendingFix();
    const heightM = this.height.value;
    this.height.markAsTouched();
    if (!fix || heightM === null || this.height.invalid || !Number.isFinite(heightM)) {
      this.notice.set({ key: 'spotHeights.problems.height', params: { max: MAX_HEIGHT_M } });
      return;
    }
    this.notice.set(null);
    this.points.update((points) => [...points, { lon: fix.lon, lat: fix.lat, heightM, accuracyM: fix.accuracyM }]);
    this.pendingFix.set(null);
  }

  protected cancelFix(): void {
    this.pendingFix.set(null);
    this.notice.set(null);
  }

  protected removePoint(index: number): void {
    this.points.update((points) => points.filter((_, position) => position !== index));
  }

  protected repeatedKey(index: number): string {
    const check = this.checks()[index];
    return check.status === 'repeated' && check.ofPoint === null ? 'spotHeights.onToeCorner' : 'spotHeights.repeated';
  }

  protected repeatedOf(index: number): number | null {
    const check = this.checks()[index];
    return check.status === 'repeated' && check.ofPoint !== null ? check.ofPoint + 1 : null;
  }
}
