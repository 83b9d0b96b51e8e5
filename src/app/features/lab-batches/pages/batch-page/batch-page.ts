import { formatNumber } from '@angular/common';
import { Component, OnInit, computed, inject, input, signal } from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatTableModule } from '@angular/material/table';
import { TranslocoPipe, TranslocoService } from '@jsverse/transloco';
import { AuthSession } from '../../../../core/auth/auth-session';
import { toApiProblem } from '../../../../core/http/api-error';
import { AppLanguage } from '../../../../i18n/app-language';
import { LOCALE_FORMAT_PIPES } from '../../../../i18n/locale-format.pipes';
import { problemText } from '../../../sign-in/problem-text';
import { LAB_BATCH_PROBLEMS, LabBatchesStore, STATUS_LABELS, VERDICT_LABELS, saveBlob, type BatchDetail, type BatchItem, type CustodyChanges, type ImportReport } from '../../lab-batches.store';

/** Row statuses in the words a user reads (translation keys), with an icon each. */
const ROW_LABELS: Record<string, { icon: string; key: string }> = {
  matched: { icon: 'check_circle', key: 'labBatches.rowStatus.matched' },
  'below-detection': { icon: 'south', key: 'labBatches.rowStatus.belowDetection' },
  'above-range': { icon: 'north', key: 'labBatches.rowStatus.aboveRange' },
  'unknown-code': { icon: 'help', key: 'labBatches.rowStatus.unknownCode' },
  'missing-code': { icon: 'help', key: 'labBatches.rowStatus.missingCode' },
  'duplicate-row': { icon: 'content_copy', key: 'labBatches.rowStatus.duplicateRow' },
  'not-a-number': { icon: 'error', key: 'labBatches.rowStatus.notANumber' },
  'missing-value': { icon: 'error', key: 'labBatches.rowStatus.missingValue' },
  'wrong-units': { icon: 'straighten', key: 'labBatches.rowStatus.wrongUnits' },
  'wrong-batch': { icon: 'error', key: 'labBatches.rowStatus.wrongBatch' },
  'formula-cell': { icon: 'functions', key: 'labBatches.rowStatus.formulaCell' },
  'wrong-cell-count': { icon: 'view_column', key: 'labBatches.rowStatus.wrongCellCount' },
};

/** How a row's assay compares with the one on record (translation keys). */
const CHANGE_KEYS: Record<string, string> = {
  new: 'labBatches.batch.change.new', unchanged: 'labBatches.batch.change.unchanged', supersedes: 'labBatches.batch.change.supersedes',
};

/** One lab batch: chain of custody, submission sheet, e-mail, bags with assays, results import with a dry run. */
@Component({
  selector: 'hs-batch-page',
  imports: [FormsModule, LOCALE_FORMAT_PIPES, MatButtonModule, MatFormFieldModule, MatIconModule, MatInputModule, MatProgressBarModule, MatTableModule, TranslocoPipe],
  template: `
    <section class="hs-page">
      @if (batch(); as batch) {
        <h1><mat-icon aria-hidden="true">science</mat-icon> {{ 'labBatches.batch.title' | transloco: { code: batch.code } }}</h1>
        <p class="with-icon" data-testid="batch-status"><mat-icon aria-hidden="true">{{ statusLabels[batch.status].icon }}</mat-icon>
          {{ 'labBatches.batch.summary' | transloco: { status: (statusLabels[batch.status].key | transloco), count: batch.itemCount, lab: batch.labName, method: batch.method,
            mass: (batch.chargeMassG | hsNumber: '1.0-2'), limit: (batch.detectionLimitGpt | hsNumber: '1.0-4') } }}</p>

        <div class="actions">
          <button mat-stroked-button type="button" class="touch" (click)="download()"><mat-icon>download</mat-icon> {{ 'labBatches.batch.submissionCsv' | transloco }}</button>
          @if (isGeologist()) {
            <button mat-flat-button type="button" class="touch" (click)="send()" [disabled]="isBusy()"><mat-icon>send</mat-icon> {{ 'labBatches.batch.sendTo' | transloco: { email: batch.labContactEmail } }}</button>
          }
        </div>
        @if (notice(); as text) { <p class="notice" role="status"><mat-icon aria-hidden="true">info</mat-icon> {{ text }}</p> }
        @if (problem(); as text) { <p class="problem" role="alert"><mat-icon aria-hidden="true">error</mat-icon> {{ text }}</p> }

        <h2>{{ 'labBatches.batch.custodyTitle' | transloco }}</h2>
        <form class="row" (ngSubmit)="saveCustody()">
          @if (isGeologist()) {
            <mat-form-field><mat-label>{{ 'labBatches.batch.dispatchedBy' | transloco }}</mat-label><input matInput [(ngModel)]="custody.dispatchedBy" name="dispatchedBy" /></mat-form-field>
            <mat-form-field><mat-label>{{ 'labBatches.batch.dispatchedAt' | transloco }}</mat-label><input matInput type="datetime-local" [(ngModel)]="dispatchedAtLocal" name="dispatchedAt" /></mat-form-field>
            <mat-form-field><mat-label>{{ 'labBatches.batch.carrier' | transloco }}</mat-label><input matInput [(ngModel)]="custody.carrier" name="carrier" /></mat-form-field>
            <mat-form-field><mat-label>{{ 'labBatches.batch.sealNumbers' | transloco }}</mat-label><input matInput [(ngModel)]="custody.sealNumbers" name="sealNumbers" /></mat-form-field>
          } @else {
            <p class="hs-muted">{{ 'labBatches.batch.custodyRead' | transloco: { by: batch.dispatchedBy ?? '—', at: batch.dispatchedAt ? (batch.dispatchedAt | hsDate: 'd MMM y, HH:mm') : '—',
              carrier: batch.carrier ?? '—', seals: batch.sealNumbers ?? '—' } }}</p>
          }
          <mat-form-field><mat-label>{{ 'labBatches.batch.receivedBy' | transloco }}</mat-label><input matInput [(ngModel)]="custody.receivedBy" name="receivedBy" /></mat-form-field>
          <mat-form-field><mat-label>{{ 'labBatches.batch.receivedAt' | transloco }}</mat-label><input matInput type="datetime-local" [(ngModel)]="receivedAtLocal" name="receivedAt" /></mat-form-field>
          <mat-form-field><mat-label>{{ 'labBatches.batch.condition' | transloco }}</mat-label><input matInput [(ngModel)]="custody.conditionOnReceipt" name="conditionOnReceipt" /></mat-form-field>
          <button mat-stroked-button type="submit" class="touch"><mat-icon>save</mat-icon> {{ 'labBatches.batch.saveCustody' | transloco }}</button>
        </form>

        <h2>{{ 'labBatches.batch.resultsTitle' | transloco }}</h2>
        <div class="row">
          <label class="file touch">
            <mat-icon aria-hidden="true">upload_file</mat-icon> {{ 'labBatches.batch.chooseFile' | transloco }}
            <input type="file" accept=".csv,text/csv" (change)="chooseFile($event)" data-testid="results-file" />
          </label>
          @if (file(); as chosen) { <span>{{ chosen.name }}</span> }
        </div>
        @if (isBusy()) { <mat-progress-bar mode="indeterminate" [attr.aria-label]="'labBatches.batch.working' | transloco" /> }
        @if (report(); as report) {
          <div class="report" data-testid="import-report">
            @for (problem of report.fileProblems; track $index) { <p class="problem"><mat-icon aria-hidden="true">error</mat-icon> {{ problem.message }}</p> }
            <p>
              {{ 'labBatches.batch.rows' | transloco: { count: report.summary.rows } }} · <strong>{{ 'labBatches.batch.blocking' | transloco: { count: report.summary.blocking } }}</strong>
              · {{ 'labBatches.batch.toSave' | transloco: { count: report.summary.changed } }}
              @if (report.notInFile.length) { · {{ 'labBatches.batch.notInFile' | transloco: { codes: report.notInFile.join(', ') } }} }
              @if (report.isAlreadyImported) { · {{ 'labBatches.batch.alreadyImported' | transloco }} }
            </p>
            @if (report.rows.length) {
              <div class="table-wrap">
                <table mat-table [dataSource]="report.rows" [attr.aria-label]="'labBatches.batch.rowsLabel' | transloco">
                  <ng-container matColumnDef="line"><th mat-header-cell *matHeaderCellDef>{{ 'labBatches.batch.col.line' | transloco }}</th><td mat-cell *matCellDef="let row">{{ row.line }}</td></ng-container>
                  <ng-container matColumnDef="code"><th mat-header-cell *matHeaderCellDef>{{ 'labBatches.batch.col.sampleCode' | transloco }}</th><td mat-cell *matCellDef="let row">{{ row.sampleCode }}</td></ng-container>
                  <ng-container matColumnDef="value"><th mat-header-cell *matHeaderCellDef>{{ 'labBatches.batch.col.valueAsSent' | transloco }}</th><td mat-cell *matCellDef="let row">{{ row.rawValue }}</td></ng-container>
                  <ng-container matColumnDef="status"><th mat-header-cell *matHeaderCellDef>{{ 'labBatches.batch.col.found' | transloco }}</th>
                    <td mat-cell *matCellDef="let row"><span class="with-icon"><mat-icon aria-hidden="true">{{ rowLabel(row.status).icon }}</mat-icon>{{ rowText(row.status) }}</span></td></ng-container>
                  <ng-container matColumnDef="message"><th mat-header-cell *matHeaderCellDef>{{ 'labBatches.batch.col.detail' | transloco }}</th>
                    <td mat-cell *matCellDef="let row">{{ row.message }}@if (row.change) { ({{ changeText(row.change) }})}</td></ng-container>
                  <tr mat-header-row *matHeaderRowDef="reportColumns"></tr>
                  <tr mat-row *matRowDef="let row; columns: reportColumns" [class.blocking]="row.isBlocking"></tr>
                </table>
              </div>
            }
            @if (!report.isSaved && report.canSave && !report.isAlreadyImported && report.summary.changed > 0) {
              <button mat-flat-button type="button" class="touch" (click)="confirmImport()" [disabled]="isBusy()"><mat-icon>done_all</mat-icon> {{ 'labBatches.batch.saveResults' | transloco: { count: report.summary.changed } }}</button>
            }
            @if (report.isSaved) { <p class="notice" role="status"><mat-icon aria-hidden="true">check_circle</mat-icon> {{ 'labBatches.batch.saved' | transloco }}</p> }
          </div>
        }

        @if (batch.qaqc; as qaqc) {
          <h2>{{ 'labBatches.batch.qaqcTitle' | transloco }}</h2>
          <ul class="verdicts" [attr.aria-label]="'labBatches.batch.verdictsLabel' | transloco">
            @for (entry of qaqc.blanks; track entry.itemId) {
              <li><mat-icon aria-hidden="true">{{ verdictLabels[entry.verdict].icon }}</mat-icon> {{ 'labBatches.batch.blankLine' | transloco: { code: entry.labCode, verdict: (verdictLabels[entry.verdict].key | transloco),
                value: entry.valueGpt === null ? '—' : (entry.valueGpt | hsNumber: '1.0-4'), limit: (entry.limitGpt | hsNumber: '1.0-4') } }}</li>
            }
            @for (entry of qaqc.standards; track entry.itemId) {
              <li><mat-icon aria-hidden="true">{{ verdictLabels[entry.verdict].icon }}</mat-icon> {{ 'labBatches.batch.standardLine' | transloco: { standard: entry.standardCode, code: entry.labCode, verdict: (verdictLabels[entry.verdict].key | transloco) } }}@if (entry.zScore !== null) { {{ 'labBatches.batch.zScore' | transloco: { z: (entry.zScore | hsNumber: '1.2-2') } }}}</li>
            }
            @for (entry of qaqc.duplicates; track entry.itemId) {
              <li><mat-icon aria-hidden="true">{{ verdictLabels[entry.verdict].icon }}</mat-icon> {{ 'labBatches.batch.duplicateLine' | transloco: { code: entry.labCode, original: entry.originalLabCode, verdict: (verdictLabels[entry.verdict].key | transloco) } }}@if (entry.hard !== null) { {{ 'labBatches.batch.hard' | transloco: { percent: (entry.hard * 100 | hsNumber: '1.0-0') } }}}</li>
            }
            @for (entry of qaqc.batches; track entry.batchId) {
              <li data-testid="batch-verdict"><mat-icon aria-hidden="true">{{ verdictLabels[entry.verdict].icon }}</mat-icon> <strong>{{ 'labBatches.batch.batchVerdict' | transloco: { verdict: (verdictLabels[entry.verdict].key | transloco) } }}</strong></li>
            }
          </ul>
        }

        <h2>{{ 'labBatches.batch.bagsTitle' | transloco }}</h2>
        <div class="table-wrap">
          <table mat-table [dataSource]="batch.items" [attr.aria-label]="'labBatches.batch.bagsLabel' | transloco">
            <ng-container matColumnDef="position"><th mat-header-cell *matHeaderCellDef>{{ 'labBatches.batch.col.position' | transloco }}</th><td mat-cell *matCellDef="let item">{{ item.position }}</td></ng-container>
            <ng-container matColumnDef="labCode"><th mat-header-cell *matHeaderCellDef>{{ 'labBatches.batch.col.bagCode' | transloco }}</th><td mat-cell *matCellDef="let item">{{ item.labCode }}</td></ng-container>
            <ng-container matColumnDef="sample"><th mat-header-cell *matHeaderCellDef>{{ 'labBatches.batch.col.sample' | transloco }}</th><td mat-cell *matCellDef="let item">{{ item.sampleCode ?? '—' }}</td></ng-container>
            <ng-container matColumnDef="type"><th mat-header-cell *matHeaderCellDef>{{ 'labBatches.batch.col.type' | transloco }}</th>
              <td mat-cell *matCellDef="let item">{{ (item.itemType ? 'common.terms.sampleType.' + item.itemType : 'labBatches.batch.typeSample') | transloco }}@if (item.isInserted) { {{ 'labBatches.batch.inserted' | transloco }}}{{ item.standardCode ? ' ' + item.standardCode : '' }}</td></ng-container>
            <ng-container matColumnDef="assay"><th mat-header-cell *matHeaderCellDef>{{ 'labBatches.batch.col.assay' | transloco }}</th>
              <td mat-cell *matCellDef="let item" data-testid="assay">{{ assayText(item) }}</td></ng-container>
            <tr mat-header-row *matHeaderRowDef="itemColumns"></tr>
            <tr mat-row *matRowDef="let row; columns: itemColumns"></tr>
          </table>
        </div>
      } @else if (problem(); as text) {
        <p class="problem" role="alert"><mat-icon aria-hidden="true">error</mat-icon> {{ text }}</p>
      } @else {
        <mat-progress-bar mode="indeterminate" [attr.aria-label]="'labBatches.batch.loading' | transloco" />
      }
    </section>
  `,
  styles: `
    .row { display: flex; flex-wrap: wrap; gap: 0 12px; align-items: center; }
    .row mat-form-field { flex: 1 1 200px; }
    .actions { display: flex; flex-wrap: wrap; gap: 8px; }
    .touch { min-height: 48px; }
    .with-icon { display: inline-flex; align-items: center; gap: 6px; }
    .file { display: inline-flex; align-items: center; gap: 8px; padding: 0 16px; border-radius: 24px; border: 1px solid var(--mat-sys-outline); cursor: pointer; }
    .file input { width: 1px; height: 1px; opacity: 0; position: absolute; }
    .file:focus-within { outline: 2px solid var(--mat-sys-primary); }
    .table-wrap { overflow-x: auto; }
    tr.blocking td { background: var(--mat-sys-error-container); color: var(--mat-sys-on-error-container); font-weight: 500; }
    .verdicts { list-style: none; padding: 0; display: flex; flex-direction: column; gap: 4px; }
    .verdicts li { display: flex; align-items: center; gap: 6px; }
    .notice, .problem { display: flex; gap: 8px; padding: 12px; border-radius: 12px; }
    .notice { background: var(--mat-sys-secondary-container); color: var(--mat-sys-on-secondary-container); }
    .problem { background: var(--mat-sys-error-container); color: var(--mat-sys-on-error-container); }
  `,
})
export default class BatchPage implements OnInit {
  /** The batch id from the route (component input binding). */
  readonly id = input.required<string>();
  private readonly store = inject(LabBatchesStore);
  private readonly session = inject(AuthSession);
  private readonly transloco = inject(TranslocoService);
  private readonly language = inject(AppLanguage);
  protected readonly statusLabels = STATUS_LABELS;
  protected readonly verdictLabels = VERDICT_LABELS;
  protected readonly reportColumns = ['line', 'code', 'value', 'status', 'message'];
  protected readonly itemColumns = ['position', 'labCode', 'sample', 'type', 'assay'];
  protected readonly batch = signal<BatchDetail | null>(null);
  protected readonly report = signal<ImportReport | null>(null);
  protected readonly file = signal<File | null>(null);
  protected readonly problem = signal<string | null>(null);
  protected readonly notice = signal<string | null>(null);
  protected readonly isBusy = signal(false);
  protected readonly isGeologist = computed(() => this.session.role() === 'geologist');
  protected custody: CustodyChanges = {};
  protected dispatchedAtLocal = '';
  protected receivedAtLocal = '';

  async ngOnInit(): Promise<void> {
    await this.run(async () => this.show(await this.store.get(this.id())));
  }

  protected rowLabel(status: string): { icon: string; key: string | null } {
    return ROW_LABELS[status] ?? { icon: 'help', key: null };
  }

  /** A row status in the reader's words; a status this screen does not know is shown as the server sent it. */
  protected rowText(status: string): string {
    const key = this.rowLabel(status).key;
    return key ? this.transloco.translate(key) : status;
  }

  protected changeText(change: string): string {
    return CHANGE_KEYS[change] ? this.transloco.translate(CHANGE_KEYS[change]) : change;
  }

  /** A bag's assay: `< limit` below detection, `> value` above the method's range, in the locale's digits. */
  protected assayText(item: BatchItem): string {
    if (!item.assay) return '—';
    const locale = this.language.locale();
    const digits = (value: number) => formatNumber(value, locale, '1.3-4');
    if (item.assay.isBelowDetection) return item.assay.detectionLimitGpt === null ? '< —' : `< ${digits(item.assay.detectionLimitGpt)}`;
    return `${item.assay.isAboveRange ? '> ' : ''}${digits(item.assay.valueGpt)}`;
  }

  protected async download(): Promise<void> {
    const batch = this.batch();
    if (batch) await this.run(async () => saveBlob(await this.store.submissionCsv(batch.id), `${batch.code}-submission.csv`));
  }

  protected async send(): Promise<void> {
    await this.run(async () => {
      const { mail, batch } = await this.store.send(this.id());
      this.show(batch);
      this.notice.set(mail.status === 'sent'
        ? this.transloco.translate('labBatches.batch.notice.sent', { email: batch.labContactEmail })
        : this.transloco.translate('labBatches.batch.notice.notSent', { reason: mail.errorMessage ?? this.transloco.translate(`labBatches.batch.mailStatus.${mail.status}`) }));
    });
  }

  protected async saveCustody(): Promise<void> {
    const changes: CustodyChanges = this.isGeologist()
      ? { ...this.custody, dispatchedAt: toIso(this.dispatchedAtLocal), receivedAt: toIso(this.receivedAtLocal) }
      : { receivedBy: this.custody.receivedBy ?? null, receivedAt: toIso(this.receivedAtLocal), conditionOnReceipt: this.custody.conditionOnReceipt ?? null };
    await this.run(async () => {
      this.show(await this.store.updateCustody(this.id(), changes));
      this.notice.set(this.transloco.translate('labBatches.batch.notice.custodySaved'));
    });
  }

  protected async chooseFile(event: Event): Promise<void> {
    const chosen = (event.target as HTMLInputElement).files?.[0] ?? null;
    this.file.set(chosen);
    this.report.set(null);
    if (chosen) await this.run(async () => this.report.set(await this.store.importResults(this.id(), chosen, true)));
  }

  protected async confirmImport(): Promise<void> {
    const chosen = this.file();
    if (!chosen) return;
    await this.run(async () => {
      this.report.set(await this.store.importResults(this.id(), chosen, false));
      this.show(await this.store.get(this.id()));
    });
  }

  private show(batch: BatchDetail): void {
    this.batch.set(batch);
    this.custody = {
      dispatchedBy: batch.dispatchedBy, carrier: batch.carrier, sealNumbers: batch.sealNumbers,
      receivedBy: batch.receivedBy, conditionOnReceipt: batch.conditionOnReceipt,
    };
    this.dispatchedAtLocal = toLocal(batch.dispatchedAt);
    this.receivedAtLocal = toLocal(batch.receivedAt);
  }

  private async run(work: () => Promise<void>): Promise<void> {
    this.isBusy.set(true);
    this.problem.set(null);
    this.notice.set(null);
    try {
      await work();
    } catch (error) {
      this.problem.set(problemText(this.transloco, toApiProblem(error), LAB_BATCH_PROBLEMS));
    } finally {
      this.isBusy.set(false);
    }
  }
}

/** `datetime-local` text (local time) to ISO, or null when empty. */
function toIso(local: string): string | null {
  return local ? new Date(local).toISOString() : null;
}

/** ISO to `datetime-local` text in local time. */
function toLocal(iso: string | null): string {
  if (!iso) return '';
  const date = new Date(iso);
  const pad = (value: number) => String(value).padStart(2, '0');
  return `${date.getFullYear()}-${pad(date.getMonth() + 1)}-${pad(date.getDate())}T${pad(date.getHours())}:${pad(date.getMinutes())}`;
}
