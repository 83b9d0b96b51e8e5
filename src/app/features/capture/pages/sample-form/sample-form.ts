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
import { parseHumanCode } from '../../../../../../shared/sync/human-code';
import { SAMPLE_TYPES, parseEntityData, type SampleData } from '../../../../../../shared/sync/protocol';
import { LabelScanner } from '../../../../shared/ui/label-scanner/label-scanner';
import { keepFormIfStorageFull } from '../../../../core/db/storage-full';
import { CaptureStore } from '../../capture.store';

/** A message by translation key, translated when drawn (so a language switch redraws it). */
interface TranslatedText {
  readonly key: string;
  readonly params: Record<string, unknown>;
}

/** A new sample of a pile: type, increments, wet mass, moisture, position, GPS point and photos. */
@Component({
  selector: 'hs-sample-form',
  imports: [ReactiveFormsModule, LabelScanner, MatButtonModule, MatFormFieldModule, MatIconModule, MatInputModule, MatSelectModule, TranslocoPipe],
  template: `
    <section class="hs-page">
      <h1>{{ 'sampleForm.title' | transloco }}</h1>
      <form [formGroup]="form" (ngSubmit)="submit()">
        <mat-form-field><mat-label>{{ 'sampleForm.pile' | transloco }}</mat-label>
          <mat-select formControlName="pileId">@for (pile of store.livePiles(); track pile.id) { <mat-option [value]="pile.id">{{ pile.code }}</mat-option> }</mat-select>
        </mat-form-field>
        <mat-form-field><mat-label>{{ 'sampleForm.sampleType' | transloco }}</mat-label>
          <mat-select formControlName="sampleType">@for (type of types; track type) { <mat-option [value]="type">{{ 'common.terms.sampleType.' + type | transloco }}</mat-option> }</mat-select>
        </mat-form-field>
        @if (sampleType() === 'duplicate') {
          <mat-form-field><mat-label>{{ 'sampleForm.duplicateOf' | transloco }}</mat-label>
            <mat-select formControlName="duplicateOfId">@for (sample of samplesOfPile(); track sample.id) { <mat-option [value]="sample.id">{{ sample.code }}</mat-option> }</mat-select>
          </mat-form-field>
        }
        @if (sampleType() === 'standard') {
          <mat-form-field><mat-label>{{ 'sampleForm.standard' | transloco }}</mat-label><input matInput formControlName="standardId" /></mat-form-field>
        }
        <div class="label-code">
          <mat-form-field subscriptSizing="dynamic"><mat-label>{{ 'sampleForm.labelCode' | transloco }}</mat-label>
            <input matInput formControlName="labelCode" autocapitalize="characters" autocomplete="off" spellcheck="false" data-testid="label-code" />
            <mat-hint>{{ 'sampleForm.labelCodeHint' | transloco }}</mat-hint>
          </mat-form-field>
          @if (!isScanning()) {
            <button mat-stroked-button type="button" (click)="startScanning()" data-testid="scan-label"><mat-icon aria-hidden="true">qr_code_scanner</mat-icon> {{ 'sampleForm.scanLabel' | transloco }}</button>
          }
        </div>
        @if (isScanning()) {
          <hs-label-scanner (codeRead)="useScannedCode($event)" (cancelled)="isScanning.set(false)" />
        }
        @if (labelProblem(); as problem) { <p class="error" role="alert" data-testid="label-problem">{{ problem.key | transloco: problem.params }}</p> }
        <mat-form-field><mat-label>{{ 'sampleForm.increments' | transloco }}</mat-label><input matInput type="number" inputmode="numeric" formControlName="increments" /></mat-form-field>
        <mat-form-field><mat-label>{{ 'sampleForm.wetMass' | transloco }}</mat-label><input matInput type="number" inputmode="decimal" formControlName="wetMassKg" /></mat-form-field>
        <mat-form-field><mat-label>{{ 'sampleForm.moisture' | transloco }}</mat-label><input matInput type="number" inputmode="decimal" formControlName="moisturePct" /></mat-form-field>
        <mat-form-field><mat-label>{{ 'sampleForm.position' | transloco }}</mat-label><input matInput formControlName="position" /></mat-form-field>
        <label class="photo"><mat-icon aria-hidden="true">photo_camera</mat-icon> {{ 'sampleForm.addPhoto' | transloco }}
          <input class="hs-file" type="file" accept="image/*" capture="environment" (change)="keepPhoto($event)" /></label>
        <p role="status">{{ 'common.terms.photoCount' | transloco: { count: photos().length } }} · @if (accuracyM(); as accuracy) { {{ 'sampleForm.gpsAccuracy' | transloco: { metres: accuracy } }} } @else { {{ 'sampleForm.gpsWaiting' | transloco }} }</p>
        @for (error of errors(); track error) { <p class="error" role="alert">{{ error.key | transloco: error.params }}</p> }
        <button mat-flat-button type="submit"><mat-icon aria-hidden="true">save</mat-icon> {{ 'sampleForm.save' | transloco }}</button>
      </form>
    </section>
  `,
  styles: `
    form { display: flex; flex-direction: column; gap: 4px; } button { min-height: 48px; } button[type=submit] { min-height: 56px; }
    .photo { display: inline-flex; align-items: center; justify-content: center; gap: 8px; min-height: 48px; padding: 0 20px; border-radius: 24px;
      border: 1px solid var(--mat-sys-outline); color: var(--mat-sys-primary); font: var(--mat-sys-label-large); cursor: pointer; align-self: flex-start; }
    .photo:focus-within { outline: 3px solid var(--mat-sys-primary); outline-offset: 2px; }
    .hs-file { position: absolute; width: 1px; height: 1px; opacity: 0; overflow: hidden; }
    .error { color: var(--mat-sys-error); }
    .label-code { display: flex; flex-wrap: wrap; gap: 8px; align-items: flex-start; } .label-code mat-form-field { flex: 1 1 200px; }
  `,
})
export default class SampleForm {
  protected readonly store = inject(CaptureStore);
  private readonly router = inject(Router);
  protected readonly types = SAMPLE_TYPES;
  protected readonly photos = signal<Blob[]>([]);
  protected readonly errors = signal<TranslatedText[]>([]);
  protected readonly form = inject(NonNullableFormBuilder).group({
    pileId: ['', Validators.required],
    sampleType: ['routine' as SampleData['sampleType']],
    increments: [8],
    wetMassKg: [null as number | null],
    moisturePct: [null as number | null],
    position: [''],
    duplicateOfId: [null as string | null],
    standardId: [''],
    labelCode: [''],
  });
  protected readonly sampleType = toSignal(this.form.controls.sampleType.valueChanges, { initialValue: this.form.controls.sampleType.value });
  private readonly pileId = toSignal(this.form.controls.pileId.valueChanges, { initialValue: '' });
  /** Samples of the chosen pile, for "Duplicate of". */
  protected readonly samplesOfPile = computed(() => this.store.samples().filter((sample) => sample.pileId === this.pileId()));
  protected readonly accuracyM = signal<number | null>(null);
  protected readonly isScanning = signal(false);
  protected readonly labelProblem = signal<TranslatedText | null>(null);
  private location: SampleData['location'] = null;

  constructor() {
    navigator.geolocation?.getCurrentPosition((position) => {
      this.location = { type: 'Point', coordinates: [position.coords.longitude, position.coords.latitude] };
      this.accuracyM.set(Math.round(position.coords.accuracy));
    }, () => undefined, { enableHighAccuracy: true, timeout: 10_000 });
  }

  protected startScanning(): void {
    this.labelProblem.set(null);
    this.isScanning.set(true);
  }

  /** A code read from a label: refused at once when this device already used it. */
  protected async useScannedCode(code: string): Promise<void> {
    this.isScanning.set(false);
    const problem = await this.labelCodeProblem(code, null);
    this.labelProblem.set(problem);
    if (!problem) {
      this.form.controls.labelCode.setValue(code);
    }
  }

  /** Why a label code cannot be this sample's code, or null when it can. */
  private async labelCodeProblem(code: string, siteCode: string | null): Promise<TranslatedText | null> {
    const parts = parseHumanCode(code);
    if (!parts || parts.kind !== 'sample') {
      return { key: 'sampleForm.problems.notASampleCode', params: { code } };
    }
    if (siteCode !== null && parts.siteCode !== siteCode) {
      return { key: 'sampleForm.problems.otherSite', params: { code, labelSite: parts.siteCode, pileSite: siteCode } };
    }
    if (await this.store.isSampleCodeTaken(code)) {
      return { key: 'sampleForm.problems.codeUsed', params: { code } };
    }
    return null;
  }

  protected keepPhoto(event: Event): void {
    const file = (event.target as HTMLInputElement).files?.[0];
    if (file) {
      this.photos.update((photos) => [...photos, file]);
    }
  }

  /** Save; on a full phone the notice shows and the form stays as it is. */
  protected submit(): Promise<void> {
    return keepFormIfStorageFull(() => this.saveSample());
  }

  private async saveSample(): Promise<void> {
    const value = this.form.getRawValue();
    const pile = this.store.livePiles().find((candidate) => candidate.id === value.pileId);
    const site = this.store.sites().find((candidate) => candidate.id === pile?.siteId);
    if (!pile || !site) {
      this.errors.set([{ key: 'sampleForm.problems.choosePile', params: {} }]);
      return;
    }
    const labelCode = value.labelCode.trim().toUpperCase();
    const labelProblem = labelCode ? await this.labelCodeProblem(labelCode, site.code) : null;
    if (labelProblem) {
      this.labelProblem.set(labelProblem);
      return;
    }
    const sample: SampleData = {
      id: crypto.randomUUID(), pileId: pile.id, code: labelCode || (await this.store.nextCode(site.code, 'sample')), sampleType: value.sampleType,
      duplicateOfId: value.sampleType === 'duplicate' ? value.duplicateOfId : null,
      standardId: value.sampleType === 'standard' ? value.standardId.trim() || null : null, location: this.location, gpsAccuracyM: this.accuracyM(), wetMassKg: value.wetMassKg,
      moisturePct: value.moisturePct, increments: value.increments, position: value.position, collectedAt: new Date().toISOString(),
      collectorId: this.store.userId(), deviceId: await this.store.deviceId(),
    };
    const checked = parseEntityData('sample', sample);
    if (!checked.ok) {
      this.errors.set(checked.errors.map((error) => ({ key: 'sampleForm.problems.notAccepted', params: { field: error.path, message: error.message } })));
      return;
    }
    // The sample and its photos in one device write: a full phone or a closed page keeps both or neither.
    await this.store.saveSample(sample, this.photos());
    await this.router.navigateByUrl('/capture');
  }
}
