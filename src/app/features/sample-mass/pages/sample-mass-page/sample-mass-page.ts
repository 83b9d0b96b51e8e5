import { Component, computed, inject, signal } from '@angular/core';
import { TranslocoPipe, TranslocoService } from '@jsverse/transloco';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { meshToApertureUm, minimumSampleMass, type EngineError } from '../../../../../../shared/engine';
import { LOCALE_FORMAT_PIPES } from '../../../../i18n/locale-format.pipes';

/** The inputs the engine may refuse, by the name their labels give them. */
const FIELD_NAMES: Readonly<Record<string, string>> = {
  topSizeMm: 'sampleMass.fieldNames.topSize',
  mesh: 'sampleMass.fieldNames.mesh',
  liberationSizeMm: 'sampleMass.fieldNames.liberationSize',
  gradeGpt: 'sampleMass.fieldNames.expectedGrade',
  targetRelativeSd: 'sampleMass.fieldNames.targetError',
};

/** The engine's number rules, by its error codes. */
const NUMBER_RULES: Partial<Record<EngineError['code'], string>> = {
  'not-a-number': 'sampleMass.errors.notANumber',
  negative: 'sampleMass.errors.negative',
  'not-positive': 'sampleMass.errors.notPositive',
};

/** The sample-mass advisor: Gy's minimum sample mass for a material, with every factor shown. */
@Component({
  selector: 'hs-sample-mass-page',
  imports: [TranslocoPipe, LOCALE_FORMAT_PIPES, MatFormFieldModule, MatInputModule],
  template: `
    <section class="hs-page">
      <h1>{{ 'sampleMass.title' | transloco }}</h1>
      <p class="hs-muted">{{ 'sampleMass.intro' | transloco }}</p>
      <form class="form" (submit)="$event.preventDefault()">
        <fieldset>
          <legend>{{ 'sampleMass.topSizeLegend' | transloco }}</legend>
          <label class="unit"><input type="radio" name="unit" [checked]="topUnit() === 'mm'" (change)="topUnit.set('mm')" /> {{ 'sampleMass.unitMm' | transloco }}</label>
          <label class="unit"><input type="radio" name="unit" [checked]="topUnit() === 'mesh'" (change)="topUnit.set('mesh')" /> {{ 'sampleMass.unitMesh' | transloco }}</label>
          <mat-form-field><mat-label>{{ (topUnit() === 'mm' ? 'sampleMass.topSizeMm' : 'sampleMass.topSizeMesh') | transloco }}</mat-label>
            <input matInput type="number" inputmode="decimal" [value]="topSize()" (input)="topSize.set(+$any($event.target).value)" /></mat-form-field>
        </fieldset>
        <mat-form-field><mat-label>{{ 'sampleMass.liberationSize' | transloco }}</mat-label><input matInput type="number" inputmode="decimal" [value]="liberationSizeMm()" (input)="liberationSizeMm.set(+$any($event.target).value)" /></mat-form-field>
        <mat-form-field><mat-label>{{ 'sampleMass.expectedGrade' | transloco }}</mat-label><input matInput type="number" inputmode="decimal" [value]="gradeGpt()" (input)="gradeGpt.set(+$any($event.target).value)" /></mat-form-field>
        <mat-form-field><mat-label>{{ 'sampleMass.targetError' | transloco }}</mat-label><input matInput type="number" inputmode="decimal" [value]="targetPct()" (input)="targetPct.set(+$any($event.target).value)" /></mat-form-field>
      </form>

      @if (advice(); as advice) {
        @if (advice.ok) {
          <article class="answer" data-testid="sample-mass-answer">
            <h2>{{ 'sampleMass.answer' | transloco: { kg: advice.value.minimumMassKg | hsNumber: '1.0-2' } }}</h2>
            <p>{{ 'sampleMass.formula' | transloco: { formula: advice.value.formula } }}</p>
            <dl>
              <dt>{{ 'sampleMass.factors.topSize' | transloco }}</dt><dd>{{ 'sampleMass.factors.topSizeValue' | transloco: { cm: advice.value.factors.topSizeCm | hsNumber: '1.0-4' } }}</dd>
              <dt>{{ 'sampleMass.factors.shape' | transloco }}</dt><dd>{{ advice.value.factors.shapeFactor | hsNumber: '1.0-4' }}</dd>
              <dt>{{ 'sampleMass.factors.sizeRange' | transloco }}</dt><dd>{{ advice.value.factors.granulometricFactor | hsNumber: '1.0-4' }}</dd>
              <dt>{{ 'sampleMass.factors.mineralogical' | transloco }}</dt><dd>{{ 'sampleMass.factors.mineralogicalValue' | transloco: { value: advice.value.factors.mineralogicalFactorGPerCm3 | hsNumber: '1.0-0', fraction: advice.value.factors.mineralFraction | hsNumber: '1.0-8' } }}</dd>
              <dt>{{ 'sampleMass.factors.liberation' | transloco }}</dt><dd>{{ 'sampleMass.factors.liberationValue' | transloco: { value: advice.value.factors.liberationFactor | hsNumber: '1.0-4' } }}</dd>
              <dt>{{ 'sampleMass.factors.constant' | transloco }}</dt><dd>{{ 'sampleMass.factors.constantValue' | transloco: { g: advice.value.factors.constantG | hsNumber: '1.0-2' } }}</dd>
            </dl>
            <p class="hs-muted">{{ 'sampleMass.crushing' | transloco }}</p>
          </article>
        } @else {
          <ul class="problems" role="alert">
            @for (error of advice.errors; track $index) { <li>{{ errorText(error) }}</li> }
          </ul>
        }
      }
    </section>
  `,
  styles: `
    .form { display: grid; gap: 8px; grid-template-columns: repeat(auto-fit, minmax(220px, 1fr)); align-items: start; }
    fieldset { border: 1px solid var(--mat-sys-outline-variant); border-radius: 12px; padding: 8px 12px; }
    .unit { display: inline-flex; align-items: center; gap: 6px; min-height: 48px; margin-right: 16px; }
    .unit input { width: 24px; height: 24px; }
    .answer { border: 2px solid var(--mat-sys-primary); border-radius: 12px; padding: 12px 16px; margin-top: 12px; }
    dl { display: grid; grid-template-columns: auto 1fr; gap: 4px 16px; }
    dd { margin: 0; font-variant-numeric: tabular-nums; }
    .problems li { color: var(--hs-fail); }
  `,
})
export default class SampleMassPage {
  private readonly transloco = inject(TranslocoService);
  protected readonly topUnit = signal<'mm' | 'mesh'>('mm');
  protected readonly topSize = signal(2);
  protected readonly liberationSizeMm = signal(0.075);
  protected readonly gradeGpt = signal(1.5);
  protected readonly targetPct = signal(10);

  protected readonly advice = computed(() => {
    let topSizeMm = this.topSize();
    if (this.topUnit() === 'mesh') {
      const sieve = meshToApertureUm(this.topSize());
      if (!sieve.ok) return sieve;
      topSizeMm = sieve.value.apertureUm / 1000;
    }
    return minimumSampleMass({ topSizeMm, liberationSizeMm: this.liberationSizeMm(), gradeGpt: this.gradeGpt(), targetRelativeSd: this.targetPct() / 100 });
  });

  /**
   * The engine's refusal in the reader's language, by its code and field; a refusal the page has no
   * words for is shown as the engine wrote it.
   */
  protected errorText(error: EngineError): string {
    if (error.code === 'unknown-value' && error.field === 'mesh') {
      return this.transloco.translate('sampleMass.errors.unknownMesh', { mesh: this.topSize() });
    }
    if (error.code === 'out-of-range' && error.field === 'mineralFraction') {
      return this.transloco.translate('sampleMass.errors.wholeSample');
    }
    const rule = NUMBER_RULES[error.code];
    const field = FIELD_NAMES[error.field];
    return rule && field ? this.transloco.translate(rule, { field: this.transloco.translate(field) }) : error.message;
  }
}
