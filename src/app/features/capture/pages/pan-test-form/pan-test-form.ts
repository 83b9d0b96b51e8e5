import { Component, computed, inject, signal } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { Router } from '@angular/router';
import { TranslocoPipe } from '@jsverse/transloco';
import { LOCALE_FORMAT_PIPES } from '../../../../i18n/locale-format.pipes';
import { COLOUR_SIZE_CLASSES, parseEntityData, type PanTestData } from '../../../../../../shared/sync/protocol';
import { keepFormIfStorageFull } from '../../../../core/db/storage-full';
import { CaptureStore } from '../../capture.store';
import { estimatePanGrade } from '../../engine-adapter';

type SizeClass = (typeof COLOUR_SIZE_CLASSES)[number];

/** A pan test: mass panned, colours per size class with big +/− counters (or weighed gold), live grade. */
@Component({
  selector: 'hs-pan-test-form',
  imports: [ReactiveFormsModule, MatButtonModule, MatFormFieldModule, MatIconModule, MatInputModule, MatSelectModule, TranslocoPipe, ...LOCALE_FORMAT_PIPES],
  template: `
    <section class="hs-page">
      <h1>{{ 'panTestForm.title' | transloco }}</h1>
      <form [formGroup]="form" (ngSubmit)="submit()">
        <mat-form-field><mat-label>{{ 'panTestForm.sample' | transloco }}</mat-label>
          <mat-select formControlName="sampleId">@for (sample of store.samples(); track sample.id) { <mat-option [value]="sample.id">{{ sample.code }}</mat-option> }</mat-select>
        </mat-form-field>
        <mat-form-field><mat-label>{{ 'panTestForm.massPanned' | transloco }}</mat-label><input matInput type="number" inputmode="decimal" formControlName="massPannedKg" /></mat-form-field>
        <h2>{{ 'panTestForm.coloursHeading' | transloco }}</h2>
        @for (sizeClass of sizeClasses; track sizeClass) {
          <div class="counter">
            <span>{{ 'common.terms.sizeClass.' + sizeClass | transloco }}</span>
            <button mat-stroked-button type="button" [attr.aria-label]="'panTestForm.fewer.' + sizeClass | transloco" (click)="count(sizeClass, -1)"><mat-icon aria-hidden="true">remove</mat-icon></button>
            <output [attr.aria-label]="'panTestForm.count.' + sizeClass | transloco">{{ counts()[sizeClass] }}</output>
            <button mat-flat-button type="button" [attr.aria-label]="'panTestForm.more.' + sizeClass | transloco" (click)="count(sizeClass, 1)"><mat-icon aria-hidden="true">add</mat-icon></button>
          </div>
        }
        <mat-form-field><mat-label>{{ 'panTestForm.weighedGold' | transloco }}</mat-label><input matInput type="number" inputmode="decimal" formControlName="goldMassMg" /></mat-form-field>
        <p class="grade" role="status">
          @if (grade(); as estimate) { @if ('gradeGpt' in estimate) { {{ 'panTestForm.estimatedGrade' | transloco: { grade: (estimate.gradeGpt | hsNumber: '1.2-2') } }} } @else { {{ reasonKey(estimate) | transloco }} } }
        </p>
        <p class="hs-muted">{{ 'common.planningStatement' | transloco }}</p>
        @for (error of errors(); track error) { <p class="error" role="alert">{{ error }}</p> }
        <button mat-flat-button type="submit"><mat-icon>save</mat-icon> {{ 'panTestForm.save' | transloco }}</button>
      </form>
    </section>
  `,
  styles: `
    form { display: flex; flex-direction: column; gap: 4px; }
    .counter { display: grid; grid-template-columns: minmax(0, 1fr) 56px 36px 56px; align-items: center; gap: 6px; min-height: 56px; }
    .counter button { min-height: 48px; min-width: 56px; width: 56px; padding: 0; } output { text-align: center; font: var(--mat-sys-title-large); }
    .grade { font: var(--mat-sys-title-medium); } .error { color: var(--mat-sys-error); } button[type=submit] { min-height: 56px; }
  `,
})
export default class PanTestForm {
  protected readonly store = inject(CaptureStore);
  private readonly router = inject(Router);
  protected readonly sizeClasses = COLOUR_SIZE_CLASSES;
  protected readonly errors = signal<string[]>([]);
  protected readonly counts = signal<Record<SizeClass, number>>({ 'very-coarse': 0, coarse: 0, medium: 0, fine: 0, 'very-fine': 0 });
  protected readonly form = inject(NonNullableFormBuilder).group({
    sampleId: ['', Validators.required],
    massPannedKg: [2 as number | null],
    goldMassMg: [null as number | null],
  });
  private readonly formValue = toSignal(this.form.valueChanges, { initialValue: this.form.getRawValue() });
  protected readonly grade = computed(() => {
    const value = this.formValue();
    const sample = this.store.samples().find((candidate) => candidate.id === value.sampleId);
    if (!value.massPannedKg) {
      return null;
    }
    return estimatePanGrade({ massPannedKg: value.massPannedKg, colours: this.colours(), goldMassMg: value.goldMassMg ?? null, panEfficiency: null }, sample?.moisturePct ?? null);
  });

  /** Why no grade can be shown yet, in the crew's language (the engine's English stays for the record). */
  protected reasonKey(estimate: { code: string | null; field: string | null }): string {
    if (estimate.code === 'missing' && estimate.field === 'goldMassMg') return 'panTestForm.reason.noGold';
    if (estimate.field === 'massPannedKg') return 'panTestForm.reason.mass';
    return 'panTestForm.reason.other';
  }

  protected count(sizeClass: SizeClass, step: number): void {
    this.counts.update((counts) => ({ ...counts, [sizeClass]: Math.max(0, counts[sizeClass] + step) }));
  }

  /** Save; on a full phone the notice shows and the form stays as it is. */
  protected submit(): Promise<void> {
    return keepFormIfStorageFull(() => this.savePanTest());
  }

  private async savePanTest(): Promise<void> {
    const value = this.form.getRawValue();
    const panTest: PanTestData = {
      id: crypto.randomUUID(), sampleId: value.sampleId, massPannedKg: value.massPannedKg ?? 0, colours: this.colours(),
      goldMassMg: value.goldMassMg, panEfficiency: null, testedAt: new Date().toISOString(),
    };
    const checked = parseEntityData('panTest', panTest);
    if (!checked.ok) {
      this.errors.set(checked.errors.map((error) => `${error.path}: ${error.message}`));
      return;
    }
    await this.store.savePanTest(panTest);
    await this.router.navigateByUrl('/capture');
  }

  private colours(): PanTestData['colours'] {
    return COLOUR_SIZE_CLASSES.filter((sizeClass) => this.counts()[sizeClass] > 0).map((sizeClass) => ({ sizeClass, count: this.counts()[sizeClass] }));
  }
}
