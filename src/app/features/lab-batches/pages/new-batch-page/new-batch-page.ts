import { DecimalPipe } from '@angular/common';
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
import { AuthSession } from '../../../../core/auth/auth-session';
import { toApiProblem } from '../../../../core/http/api-error';
import { LabBatchesStore, type CandidateSample, type ReferenceStandard } from '../../lab-batches.store';

/** Type letters beside the words, so the type never rests on colour. */
const TYPE_LETTERS: Record<string, string> = { routine: 'R', duplicate: 'D', blank: 'B', standard: 'S' };

/** A new lab batch: pick samples (filters, select all), QA/QC rates, lab and method. */
@Component({
  selector: 'hs-new-batch-page',
  imports: [DecimalPipe, FormsModule, MatButtonModule, MatCheckboxModule, MatFormFieldModule, MatIconModule, MatInputModule, MatSelectModule, MatSlideToggleModule, MatTableModule],
  template: `
    <section class="hs-page">
      <h1><mat-icon aria-hidden="true">add_box</mat-icon> New lab batch</h1>
      <div class="row">
        <mat-form-field>
          <mat-label>Site</mat-label>
          <mat-select [ngModel]="siteId()" (ngModelChange)="chooseSite($event)" name="site">
            @for (site of sites(); track site.id) { <mat-option [value]="site.id">{{ site.code }} · {{ site.name }}</mat-option> }
          </mat-select>
        </mat-form-field>
        <mat-form-field>
          <mat-label>Find sample or pile code</mat-label>
          <input matInput [ngModel]="codeFilter()" (ngModelChange)="codeFilter.set($event)" name="codeFilter" autocomplete="off" />
        </mat-form-field>
        <mat-form-field>
          <mat-label>Sample type</mat-label>
          <mat-select [ngModel]="typeFilter()" (ngModelChange)="typeFilter.set($event)" name="typeFilter">
            <mat-option value="">Any</mat-option>
            <mat-option value="routine">Routine</mat-option><mat-option value="duplicate">Field duplicate</mat-option>
            <mat-option value="blank">Blank</mat-option><mat-option value="standard">Reference standard</mat-option>
          </mat-select>
        </mat-form-field>
        <mat-slide-toggle [ngModel]="onlyUnassayed()" (ngModelChange)="onlyUnassayed.set($event)" name="onlyUnassayed" class="touch">Only samples without an assay</mat-slide-toggle>
      </div>

      <div class="table-wrap">
        <table mat-table [dataSource]="visible()" aria-label="Samples to choose from">
          <ng-container matColumnDef="select">
            <th mat-header-cell *matHeaderCellDef>
              <mat-checkbox [checked]="isAllVisibleSelected()" [indeterminate]="isSomeVisibleSelected()" (change)="toggleAllVisible()" aria-label="Select all shown samples" />
            </th>
            <td mat-cell *matCellDef="let sample">
              <mat-checkbox [checked]="selected().has(sample.id)" (change)="toggle(sample.id)" [aria-label]="'Select ' + sample.code" />
            </td>
          </ng-container>
          <ng-container matColumnDef="code"><th mat-header-cell *matHeaderCellDef>Sample</th><td mat-cell *matCellDef="let sample">{{ sample.code }}</td></ng-container>
          <ng-container matColumnDef="pile"><th mat-header-cell *matHeaderCellDef>Pile</th><td mat-cell *matCellDef="let sample">{{ sample.pileCode }}</td></ng-container>
          <ng-container matColumnDef="type"><th mat-header-cell *matHeaderCellDef>Type</th><td mat-cell *matCellDef="let sample"><span class="letter">{{ letters[sample.sampleType] }}</span> {{ sample.sampleType }}</td></ng-container>
          <ng-container matColumnDef="pan"><th mat-header-cell *matHeaderCellDef>Pan g/t</th><td mat-cell *matCellDef="let sample">{{ sample.panGpt === null ? '—' : (sample.panGpt | number: '1.2-2') }}</td></ng-container>
          <ng-container matColumnDef="assay"><th mat-header-cell *matHeaderCellDef>Assay g/t</th><td mat-cell *matCellDef="let sample">{{ sample.assayGpt === null ? '—' : (sample.assayGpt | number: '1.3-3') }}</td></ng-container>
          <ng-container matColumnDef="batches"><th mat-header-cell *matHeaderCellDef>In batches</th><td mat-cell *matCellDef="let sample">{{ sample.batchCodes.join(', ') || '—' }}</td></ng-container>
          <tr mat-header-row *matHeaderRowDef="columns"></tr>
          <tr mat-row *matRowDef="let row; columns: columns"></tr>
        </table>
      </div>
      <p><strong>{{ selected().size }}</strong> samples chosen of {{ candidates().length }}.</p>

      <form (ngSubmit)="create()" class="form">
        <h2>QA/QC inserted</h2>
        <div class="row">
          <mat-form-field><mat-label>A blank every … samples</mat-label><input matInput type="number" min="0" [(ngModel)]="blankEvery" name="blankEvery" /></mat-form-field>
          <mat-form-field><mat-label>A standard every … samples</mat-label><input matInput type="number" min="0" [(ngModel)]="standardEvery" name="standardEvery" /></mat-form-field>
          <mat-form-field><mat-label>A split duplicate every … samples</mat-label><input matInput type="number" min="0" [(ngModel)]="duplicateEvery" name="duplicateEvery" /></mat-form-field>
          <mat-form-field>
            <mat-label>Reference standards</mat-label>
            <mat-select multiple [(ngModel)]="standardCodes" name="standardCodes">
              @for (standard of standards(); track standard.code) { <mat-option [value]="standard.code">{{ standard.code }} ({{ standard.expectedGpt }} ± {{ standard.sdGpt }} g/t)</mat-option> }
            </mat-select>
          </mat-form-field>
          <mat-form-field><mat-label>Seed of the random order</mat-label><input matInput type="number" min="0" [(ngModel)]="seed" name="seed" /></mat-form-field>
          <mat-slide-toggle [(ngModel)]="isBlind" name="isBlind" class="touch">Ship blanks and standards blind</mat-slide-toggle>
        </div>
        <h2>Lab and method</h2>
        <div class="row">
          <mat-form-field><mat-label>Laboratory</mat-label><input matInput required [(ngModel)]="labName" name="labName" /></mat-form-field>
          <mat-form-field><mat-label>Lab contact e-mail</mat-label><input matInput required type="email" [(ngModel)]="labContactEmail" name="labContactEmail" /></mat-form-field>
          <mat-form-field><mat-label>Method</mat-label><input matInput required [(ngModel)]="method" name="method" /></mat-form-field>
          <mat-form-field><mat-label>Charge mass g</mat-label><input matInput type="number" min="1" [(ngModel)]="chargeMassG" name="chargeMassG" /></mat-form-field>
          <mat-form-field><mat-label>Detection limit g/t</mat-label><input matInput type="number" step="0.001" [(ngModel)]="detectionLimitGpt" name="detectionLimitGpt" /></mat-form-field>
          <mat-form-field><mat-label>Upper limit g/t</mat-label><input matInput type="number" [(ngModel)]="upperLimitGpt" name="upperLimitGpt" /></mat-form-field>
        </div>
        @if (problem(); as text) {
          <div class="problem" role="alert"><mat-icon aria-hidden="true">error</mat-icon>
            <div>{{ text }}@for (detail of details(); track $index) {<br />{{ detail }}}</div>
          </div>
        }
        <button mat-flat-button type="submit" class="touch" [disabled]="selected().size === 0 || isSaving()"><mat-icon>inventory_2</mat-icon> Make the batch</button>
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
  protected readonly letters = TYPE_LETTERS;
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
      this.problem.set(toApiProblem(error).message);
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
      this.problem.set(toApiProblem(error).message);
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
      this.problem.set(problem.message);
      this.details.set(problem.details.map((detail) => `${detail.path}: ${detail.message}`));
    } finally {
      this.isSaving.set(false);
    }
  }
}
