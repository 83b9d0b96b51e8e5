import { Component, OnInit, computed, inject, signal } from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { MatSlideToggleModule } from '@angular/material/slide-toggle';
import { MatTableModule } from '@angular/material/table';
import { Router } from '@angular/router';
import { TranslocoPipe, TranslocoService } from '@jsverse/transloco';
import { AuthSession } from '../../../../core/auth/auth-session';
import { toApiProblem } from '../../../../core/http/api-error';
import { LOCALE_FORMAT_PIPES } from '../../../../i18n/locale-format.pipes';
import { problemText } from '../../../sign-in/problem-text';
import { LAB_BATCH_PROBLEMS, LabBatchesStore, type CandidateSample, type ReferenceStandard } from '../../lab-batches.store';

/** Type letters beside the words, so the type never rests on colour; each language has its own (translation keys). */
const TYPE_LETTER_KEYS: Record<string, string> = {
  routine: 'labBatches.newBatch.letter.routine', duplicate: 'labBatches.newBatch.letter.duplicate',
  blank: 'labBatches.newBatch.letter.blank', standard: 'labBatches.newBatch.letter.standard',
};

/** The form's fields by the name the API gives them in a refusal, so a refused field is named in the reader's words. */
const FIELD_KEYS: Record<string, string> = {
  siteId: 'labBatches.newBatch.site', sampleIds: 'labBatches.newBatch.col.sample', labName: 'labBatches.newBatch.labName',
  labContactEmail: 'labBatches.newBatch.labEmail', method: 'labBatches.newBatch.method', chargeMassG: 'labBatches.newBatch.chargeMass',
  detectionLimitGpt: 'labBatches.newBatch.detectionLimit', upperLimitGpt: 'labBatches.newBatch.upperLimit',
  blankEvery: 'labBatches.newBatch.blankEvery', standardEvery: 'labBatches.newBatch.standardEvery',
  duplicateEvery: 'labBatches.newBatch.duplicateEvery', standardCodes: 'labBatches.newBatch.standards', seed: 'labBatches.newBatch.seed',
};

/** A new lab batch: pick samples (filters, select all), QA/QC rates, lab and method. */
@Component({
  selector: 'hs-new-batch-page',
  imports: [FormsModule, LOCALE_FORMAT_PIPES, MatButtonModule, MatCheckboxModule, MatFormFieldModule, MatIconModule, MatInputModule, MatSelectModule, MatSlideToggleModule, MatTableModule, TranslocoPipe],
  template: `
    <section class="hs-page">
      <h1><mat-icon aria-hidden="true">add_box</mat-icon> {{ 'labBatches.newBatch.title' | transloco }}</h1>
      <div class="row">
        <mat-form-field>
          <mat-label>{{ 'labBatches.newBatch.site' | transloco }}</mat-label>
          <mat-select [ngModel]="siteId()" (ngModelChange)="chooseSite($event)" name="site">
            @for (site of sites(); track site.id) { <mat-option [value]="site.id">{{ site.code }} · {{ site.name }}</mat-option> }
          </mat-select>
        </mat-form-field>
        <mat-form-field>
          <mat-label>{{ 'labBatches.newBatch.codeFilter' | transloco }}</mat-label>
          <input matInput [ngModel]="codeFilter()" (ngModelChange)="codeFilter.set($event)" name="codeFilter" autocomplete="off" />
        </mat-form-field>
        <mat-form-field>
          <mat-label>{{ 'labBatches.newBatch.typeFilter' | transloco }}</mat-label>
          <mat-select [ngModel]="typeFilter()" (ngModelChange)="typeFilter.set($event)" name="typeFilter">
            <mat-option value="">{{ 'labBatches.newBatch.anyType' | transloco }}</mat-option>
            @for (type of sampleTypes; track type) { <mat-option [value]="type">{{ 'common.terms.sampleType.' + type | transloco }}</mat-option> }
          </mat-select>
        </mat-form-field>
        <mat-slide-toggle [ngModel]="onlyUnassayed()" (ngModelChange)="onlyUnassayed.set($event)" name="onlyUnassayed" class="touch">{{ 'labBatches.newBatch.onlyUnassayed' | transloco }}</mat-slide-toggle>
      </div>

      <div class="table-wrap">
        <table mat-table [dataSource]="visible()" [attr.aria-label]="'labBatches.newBatch.tableLabel' | transloco">
          <ng-container matColumnDef="select">
            <th mat-header-cell *matHeaderCellDef>
              <mat-checkbox [checked]="isAllVisibleSelected()" [indeterminate]="isSomeVisibleSelected()" (change)="toggleAllVisible()" [aria-label]="'labBatches.newBatch.selectAll' | transloco" />
            </th>
            <td mat-cell *matCellDef="let sample">
              <mat-checkbox [checked]="selected().has(sample.id)" (change)="toggle(sample.id)" [aria-label]="'labBatches.newBatch.selectOne' | transloco: { code: sample.code }" />
            </td>
          </ng-container>
          <ng-container matColumnDef="code"><th mat-header-cell *matHeaderCellDef>{{ 'labBatches.newBatch.col.sample' | transloco }}</th><td mat-cell *matCellDef="let sample">{{ sample.code }}</td></ng-container>
          <ng-container matColumnDef="pile"><th mat-header-cell *matHeaderCellDef>{{ 'labBatches.newBatch.col.pile' | transloco }}</th><td mat-cell *matCellDef="let sample">{{ sample.pileCode }}</td></ng-container>
          <ng-container matColumnDef="type"><th mat-header-cell *matHeaderCellDef>{{ 'labBatches.newBatch.col.type' | transloco }}</th><td mat-cell *matCellDef="let sample"><span class="letter">{{ letterKeys[sample.sampleType] | transloco }}</span> {{ 'common.terms.sampleType.' + sample.sampleType | transloco }}</td></ng-container>
          <ng-container matColumnDef="pan"><th mat-header-cell *matHeaderCellDef>{{ 'labBatches.newBatch.col.pan' | transloco }}</th><td mat-cell *matCellDef="let sample">{{ sample.panGpt === null ? '—' : (sample.panGpt | hsNumber: '1.2-2') }}</td></ng-container>
          <ng-container matColumnDef="assay"><th mat-header-cell *matHeaderCellDef>{{ 'labBatches.newBatch.col.assay' | transloco }}</th><td mat-cell *matCellDef="let sample">{{ sample.assayGpt === null ? '—' : (sample.assayGpt | hsNumber: '1.3-3') }}</td></ng-container>
          <ng-container matColumnDef="batches"><th mat-header-cell *matHeaderCellDef>{{ 'labBatches.newBatch.col.batches' | transloco }}</th><td mat-cell *matCellDef="let sample">{{ sample.batchCodes.join(', ') || '—' }}</td></ng-container>
          <tr mat-header-row *matHeaderRowDef="columns"></tr>
          <tr mat-row *matRowDef="let row; columns: columns"></tr>
        </table>
      </div>
      <p data-testid="chosen">{{ 'labBatches.newBatch.chosen' | transloco: { count: selected().size, total: candidates().length } }}</p>

      <form (ngSubmit)="create()" class="form">
        <h2>{{ 'labBatches.newBatch.qaqcTitle' | transloco }}</h2>
        <div class="row">
          <mat-form-field><mat-label>{{ 'labBatches.newBatch.blankEvery' | transloco }}</mat-label><input matInput type="number" min="0" [(ngModel)]="blankEvery" name="blankEvery" /></mat-form-field>
          <mat-form-field><mat-label>{{ 'labBatches.newBatch.standardEvery' | transloco }}</mat-label><input matInput type="number" min="0" [(ngModel)]="standardEvery" name="standardEvery" /></mat-form-field>
          <mat-form-field><mat-label>{{ 'labBatches.newBatch.duplicateEvery' | transloco }}</mat-label><input matInput type="number" min="0" [(ngModel)]="duplicateEvery" name="duplicateEvery" /></mat-form-field>
          <mat-form-field>
            <mat-label>{{ 'labBatches.newBatch.standards' | transloco }}</mat-label>
            <mat-select multiple [(ngModel)]="standardCodes" name="standardCodes">
              @for (standard of standards(); track standard.code) {
                <mat-option [value]="standard.code">{{ 'labBatches.newBatch.standardOption' | transloco: { code: standard.code, expected: (standard.expectedGpt | hsNumber: '1.0-4'), sd: (standard.sdGpt | hsNumber: '1.0-4') } }}</mat-option>
              }
            </mat-select>
          </mat-form-field>
          <mat-form-field><mat-label>{{ 'labBatches.newBatch.seed' | transloco }}</mat-label><input matInput type="number" min="0" [(ngModel)]="seed" name="seed" /></mat-form-field>
          <mat-slide-toggle [(ngModel)]="isBlind" name="isBlind" class="touch">{{ 'labBatches.newBatch.blind' | transloco }}</mat-slide-toggle>
        </div>
        <h2>{{ 'labBatches.newBatch.labTitle' | transloco }}</h2>
        <div class="row">
          <mat-form-field><mat-label>{{ 'labBatches.newBatch.labName' | transloco }}</mat-label><input matInput required [(ngModel)]="labName" name="labName" /></mat-form-field>
          <mat-form-field><mat-label>{{ 'labBatches.newBatch.labEmail' | transloco }}</mat-label><input matInput required type="email" [(ngModel)]="labContactEmail" name="labContactEmail" /></mat-form-field>
          <mat-form-field><mat-label>{{ 'labBatches.newBatch.method' | transloco }}</mat-label><input matInput required [(ngModel)]="method" name="method" /></mat-form-field>
          <mat-form-field><mat-label>{{ 'labBatches.newBatch.chargeMass' | transloco }}</mat-label><input matInput type="number" min="1" [(ngModel)]="chargeMassG" name="chargeMassG" /></mat-form-field>
          <mat-form-field><mat-label>{{ 'labBatches.newBatch.detectionLimit' | transloco }}</mat-label><input matInput type="number" step="0.001" [(ngModel)]="detectionLimitGpt" name="detectionLimitGpt" /></mat-form-field>
          <mat-form-field><mat-label>{{ 'labBatches.newBatch.upperLimit' | transloco }}</mat-label><input matInput type="number" [(ngModel)]="upperLimitGpt" name="upperLimitGpt" /></mat-form-field>
        </div>
        @if (problem(); as text) {
          <div class="problem" role="alert"><mat-icon aria-hidden="true">error</mat-icon>
            <div>{{ text }}@for (detail of details(); track $index) {<br />{{ detail }}}</div>
          </div>
        }
        <button mat-flat-button type="submit" class="touch" [disabled]="selected().size === 0 || isSaving()"><mat-icon>inventory_2</mat-icon> {{ 'labBatches.newBatch.submit' | transloco }}</button>
      </form>
    </section>
  `,
  styles: `
    .row { display: flex; flex-wrap: wrap; gap: 0 12px; align-items: center; }
    .row mat-form-field { flex: 1 1 200px; }
    .touch { min-height: 48px; }
    .table-wrap { overflow-x: auto; max-height: 60vh; }
    td .mat-mdc-checkbox, th .mat-mdc-checkbox { display: inline-flex; min-width: 48px; min-height: 48px; align-items: center; }
    .letter { display: inline-block; min-width: 1.5em; font-weight: 500; border: 1px solid currentColor; border-radius: 4px; text-align: center; }
    .problem { display: flex; gap: 8px; padding: 12px; border-radius: 12px; background: var(--mat-sys-error-container); color: var(--mat-sys-on-error-container); }
  `,
})
export default class NewBatchPage implements OnInit {
  private readonly session = inject(AuthSession);
  private readonly store = inject(LabBatchesStore);
  private readonly router = inject(Router);
  private readonly transloco = inject(TranslocoService);
  protected readonly letterKeys = TYPE_LETTER_KEYS;
  protected readonly sampleTypes = ['routine', 'duplicate', 'blank', 'standard'] as const;
  protected readonly columns = ['select', 'code', 'pile', 'type', 'pan', 'assay', 'batches'];
  protected readonly sites = computed(() => this.session.user()?.sites ?? []);
  protected readonly siteId = signal<string>('');
  protected readonly candidates = signal<readonly CandidateSample[]>([]);
  protected readonly standards = signal<readonly ReferenceStandard[]>([]);
  protected readonly selected = signal<ReadonlySet<string>>(new Set());
  protected readonly codeFilter = signal('');
  protected readonly typeFilter = signal('');
  protected readonly onlyUnassayed = signal(false);
  protected readonly problem = signal<string | null>(null);
  protected readonly details = signal<readonly string[]>([]);
  protected readonly isSaving = signal(false);
  protected readonly visible = computed(() => {
    const text = this.codeFilter().trim().toUpperCase();
    return this.candidates().filter((sample) =>
      (!text || sample.code.includes(text) || (sample.pileCode ?? '').includes(text)) &&
      (!this.typeFilter() || sample.sampleType === this.typeFilter()) &&
      (!this.onlyUnassayed() || sample.assayGpt === null));
  });
  protected readonly isAllVisibleSelected = computed(() => this.visible().length > 0 && this.visible().every((sample) => this.selected().has(sample.id)));
  protected readonly isSomeVisibleSelected = computed(() => !this.isAllVisibleSelected() && this.visible().some((sample) => this.selected().has(sample.id)));

  // Form fields: common practice defaults (a blank and a standard every 20, fire assay 30 g).
  protected blankEvery = 20;
  protected standardEvery = 20;
  protected duplicateEvery = 20;
  protected standardCodes: string[] = [];
  protected seed = Math.floor(Math.random() * 1_000_000);
  protected isBlind = true;
  protected labName = 'Kestrel Analytical';
  protected labContactEmail = 'assays@kestrel.lab.test';
  protected method = 'Fire assay, AAS finish';
  protected chargeMassG = 30;
  protected detectionLimitGpt = 0.005;
  protected upperLimitGpt: number | null = 100;

  async ngOnInit(): Promise<void> {
    const first = this.sites()[0];
    try {
      this.standards.set(await this.store.standards());
      this.standardCodes = this.standards().slice(0, 1).map((standard) => standard.code);
    } catch (error) {
      this.problem.set(problemText(this.transloco, toApiProblem(error), LAB_BATCH_PROBLEMS));
    }
    if (first) {
      await this.chooseSite(first.id);
    }
  }

  protected async chooseSite(siteId: string): Promise<void> {
    this.siteId.set(siteId);
    this.selected.set(new Set());
    try {
      this.candidates.set(await this.store.candidates(siteId));
    } catch (error) {
      this.problem.set(problemText(this.transloco, toApiProblem(error), LAB_BATCH_PROBLEMS));
    }
  }

  protected toggle(id: string): void {
    const next = new Set(this.selected());
    if (next.has(id)) next.delete(id); else next.add(id);
    this.selected.set(next);
  }

  protected toggleAllVisible(): void {
    const next = new Set(this.selected());
    const isAll = this.isAllVisibleSelected();
    for (const sample of this.visible()) {
      if (isAll) next.delete(sample.id); else next.add(sample.id);
    }
    this.selected.set(next);
  }

  protected async create(): Promise<void> {
    this.isSaving.set(true);
    this.problem.set(null);
    this.details.set([]);
    try {
      const batch = await this.store.create({
        siteId: this.siteId(), sampleIds: this.candidates().filter((sample) => this.selected().has(sample.id)).map((sample) => sample.id),
        labName: this.labName, labContactEmail: this.labContactEmail, method: this.method, chargeMassG: Number(this.chargeMassG),
        detectionLimitGpt: Number(this.detectionLimitGpt), upperLimitGpt: this.upperLimitGpt === null || this.upperLimitGpt === undefined ? null : Number(this.upperLimitGpt),
        isBlind: this.isBlind, blankEvery: Number(this.blankEvery), standardEvery: Number(this.standardEvery), duplicateEvery: Number(this.duplicateEvery),
        standardCodes: this.standardCodes, seed: Number(this.seed), notes: '',
      });
      await this.router.navigate(['/lab-batches', batch.id]);
    } catch (error) {
      const problem = toApiProblem(error);
      this.problem.set(problemText(this.transloco, problem, LAB_BATCH_PROBLEMS));
      this.details.set(problem.details.map((detail) => `${this.fieldName(detail.path)}: ${detail.message}`));
    } finally {
      this.isSaving.set(false);
    }
  }

  /** A refused field in the reader's words (the first part of the API's path), else the path as sent. */
  private fieldName(path: string): string {
    const key = FIELD_KEYS[path.split(/[.[]/)[0]];
    return key ? this.transloco.translate(key) : path;
  }
}
