import { DecimalPipe } from '@angular/common';
import { Component, computed, signal } from '@angular/core';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { meshToApertureUm, minimumSampleMass } from '../../../../../../shared/engine';

/** The sample-mass advisor: Gy's minimum sample mass for a material, with every factor shown. */
@Component({
  selector: 'hs-sample-mass-page',
  imports: [DecimalPipe, MatFormFieldModule, MatInputModule],
  template: `
    <section class="hs-page">
      <h1>Sample mass advisor</h1>
      <p class="hs-muted">How much material a sample must weigh so that the grain-by-grain luck of which gold particles fall into it stays within the error you accept.</p>
      <form class="form" (submit)="$event.preventDefault()">
        <fieldset>
          <legend>Top size (95 % passing)</legend>
          <label class="unit"><input type="radio" name="unit" [checked]="topUnit() === 'mm'" (change)="topUnit.set('mm')" /> mm</label>
          <label class="unit"><input type="radio" name="unit" [checked]="topUnit() === 'mesh'" (change)="topUnit.set('mesh')" /> mesh (ASTM E11)</label>
          <mat-form-field><mat-label>{{ topUnit() === 'mm' ? 'Top size, mm' : 'Top size, mesh' }}</mat-label>
            <input matInput type="number" inputmode="decimal" [value]="topSize()" (input)="topSize.set(+$any($event.target).value)" /></mat-form-field>
        </fieldset>
        <mat-form-field><mat-label>Gold liberation size, mm</mat-label><input matInput type="number" inputmode="decimal" [value]="liberationSizeMm()" (input)="liberationSizeMm.set(+$any($event.target).value)" /></mat-form-field>
        <mat-form-field><mat-label>Expected grade, g/t</mat-label><input matInput type="number" inputmode="decimal" [value]="gradeGpt()" (input)="gradeGpt.set(+$any($event.target).value)" /></mat-form-field>
        <mat-form-field><mat-label>Target error, % (1 SD)</mat-label><input matInput type="number" inputmode="decimal" [value]="targetPct()" (input)="targetPct.set(+$any($event.target).value)" /></mat-form-field>
      </form>

      @if (advice(); as advice) {
        @if (advice.ok) {
          <article class="answer" data-testid="sample-mass-answer">
            <h2>At least {{ advice.value.minimumMassKg | number: '1.0-2' }} kg</h2>
            <p>{{ advice.value.formula }}, solved for the sample mass Ms with a lot much larger than the sample.</p>
            <dl>
              <dt>d, top size</dt><dd>{{ advice.value.factors.topSizeCm | number: '1.0-4' }} cm</dd>
              <dt>f, shape factor</dt><dd>{{ advice.value.factors.shapeFactor }}</dd>
              <dt>g, size-range factor</dt><dd>{{ advice.value.factors.granulometricFactor }}</dd>
              <dt>c, mineralogical factor</dt><dd>{{ advice.value.factors.mineralogicalFactorGPerCm3 | number: '1.0-0' }} g/cm³ (gold fraction {{ advice.value.factors.mineralFraction | number: '1.0-8' }})</dd>
              <dt>ℓ, liberation factor</dt><dd>{{ advice.value.factors.liberationFactor | number: '1.0-4' }} (√(liberation size ÷ top size), 1 once liberated)</dd>
              <dt>f·g·c·ℓ·d³</dt><dd>{{ advice.value.factors.constantG | number: '1.0-2' }} g</dd>
            </dl>
            <p class="hs-muted">Halving the top size by crushing before splitting cuts the mass needed about eightfold (d³), until the gold is liberated.</p>
          </article>
        } @else {
          <ul class="problems" role="alert">
            @for (error of advice.errors; track $index) { <li>{{ error.message }}</li> }
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
}
