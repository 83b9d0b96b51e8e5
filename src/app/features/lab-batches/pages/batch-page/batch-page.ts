import { DatePipe, DecimalPipe } from '@angular/common';
import { Component, OnInit, computed, inject, input, signal } from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatTableModule } from '@angular/material/table';
import { AuthSession } from '../../../../core/auth/auth-session';
import { toApiProblem } from '../../../../core/http/api-error';
import { LabBatchesStore, STATUS_LABELS, VERDICT_LABELS, saveBlob, type BatchDetail, type CustodyChanges, type ImportReport } from '../../lab-batches.store';

/** Row statuses in the words a user reads, with an icon each. */
const ROW_LABELS: Record<string, { icon: string; text: string }> = {
  matched: { icon: 'check_circle', text: 'Matched' },
  'below-detection': { icon: 'south', text: 'Below detection' },
  'above-range': { icon: 'north', text: 'Above range' },
  'unknown-code': { icon: 'help', text: 'Unknown sample code' },
  'missing-code': { icon: 'help', text: 'No sample code' },
  'duplicate-row': { icon: 'content_copy', text: 'Duplicated row' },
  'not-a-number': { icon: 'error', text: 'Not a number' },
  'missing-value': { icon: 'error', text: 'Missing value' },
  'wrong-units': { icon: 'straighten', text: 'Wrong units' },
  'wrong-batch': { icon: 'error', text: 'Other batch' },
  'formula-cell': { icon: 'functions', text: 'Formula in a cell' },
  'wrong-cell-count': { icon: 'view_column', text: 'Wrong number of cells' },
};

/** One lab batch: chain of custody, submission sheet, e-mail, bags with assays, results import with a dry run. */
@Component({
  selector: 'hs-batch-page',
  imports: [DatePipe, DecimalPipe, FormsModule, MatButtonModule, MatFormFieldModule, MatIconModule, MatInputModule, MatProgressBarModule, MatTableModule],
  template: `
    <section class="hs-page">
      @if (batch(); as batch) {
        <h1><mat-icon aria-hidden="true">science</mat-icon> Batch {{ batch.code }}</h1>
        <p class="with-icon" data-testid="batch-status"><mat-icon aria-hidden="true">{{ statusLabels[batch.status].icon }}</mat-icon> {{ statusLabels[batch.status].text }}
          · {{ batch.itemCount }} bags · {{ batch.labName }} · {{ batch.method }}, {{ batch.chargeMassG }} g, detection limit {{ batch.detectionLimitGpt }} g/t</p>

        <div class="actions">
          <button mat-stroked-button type="button" class="touch" (click)="download()"><mat-icon>download</mat-icon> Submission CSV</button>
          @if (isGeologist()) {
            <button mat-flat-button type="button" class="touch" (click)="send()" [disabled]="isBusy()"><mat-icon>send</mat-icon> Send to {{ batch.labContactEmail }}</button>
          }
        </div>
        @if (notice(); as text) { <p class="notice" role="status"><mat-icon aria-hidden="true">info</mat-icon> {{ text }}</p> }
        @if (problem(); as text) { <p class="problem" role="alert"><mat-icon aria-hidden="true">error</mat-icon> {{ text }}</p> }

        <h2>Chain of custody</h2>
        <form class="row" (ngSubmit)="saveCustody()">
          @if (isGeologist()) {
            <mat-form-field><mat-label>Dispatched by</mat-label><input matInput [(ngModel)]="custody.dispatchedBy" name="dispatchedBy" /></mat-form-field>
            <mat-form-field><mat-label>Dispatched at</mat-label><input matInput type="datetime-local" [(ngModel)]="dispatchedAtLocal" name="dispatchedAt" /></mat-form-field>
            <mat-form-field><mat-label>Carrier</mat-label><input matInput [(ngModel)]="custody.carrier" name="carrier" /></mat-form-field>
            <mat-form-field><mat-label>Seal numbers</mat-label><input matInput [(ngModel)]="custody.sealNumbers" name="sealNumbers" /></mat-form-field>
          } @else {
            <p class="hs-muted">Dispatched by {{ batch.dispatchedBy ?? '—' }} · {{ batch.dispatchedAt ? (batch.dispatchedAt | date: 'd MMM y, HH:mm') : '—' }} · carrier {{ batch.carrier ?? '—' }} · seals {{ batch.sealNumbers ?? '—' }}</p>
          }
          <mat-form-field><mat-label>Received by</mat-label><input matInput [(ngModel)]="custody.receivedBy" name="receivedBy" /></mat-form-field>
          <mat-form-field><mat-label>Received at</mat-label><input matInput type="datetime-local" [(ngModel)]="receivedAtLocal" name="receivedAt" /></mat-form-field>
          <mat-form-field><mat-label>Condition on receipt</mat-label><input matInput [(ngModel)]="custody.conditionOnReceipt" name="conditionOnReceipt" /></mat-form-field>
          <button mat-stroked-button type="submit" class="touch"><mat-icon>save</mat-icon> Save custody</button>
        </form>

        <h2>Results</h2>
        <div class="row">
          <label class="file touch">
            <mat-icon aria-hidden="true">upload_file</mat-icon> Choose results CSV
            <input type="file" accept=".csv,text/csv" (change)="chooseFile($event)" data-testid="results-file" />
          </label>
          @if (file(); as chosen) { <span>{{ chosen.name }}</span> }
        </div>
        @if (isBusy()) { <mat-progress-bar mode="indeterminate" aria-label="Working" /> }
        @if (report(); as report) {
          <div class="report" data-testid="import-report">
            @for (problem of report.fileProblems; track $index) { <p class="problem"><mat-icon aria-hidden="true">error</mat-icon> {{ problem.message }}</p> }
            <p>
              {{ report.summary.rows }} rows · <strong>{{ report.summary.blocking }}</strong> with problems · {{ report.summary.changed }} to save
              @if (report.notInFile.length) { · not in the file: {{ report.notInFile.join(', ') }} }
              @if (report.isAlreadyImported) { · this exact file was imported before: nothing changes }
            </p>
            @if (report.rows.length) {
              <div class="table-wrap">
                <table mat-table [dataSource]="report.rows" aria-label="Rows of the results file">
                  <ng-container matColumnDef="line"><th mat-header-cell *matHeaderCellDef>Line</th><td mat-cell *matCellDef="let row">{{ row.line }}</td></ng-container>
                  <ng-container matColumnDef="code"><th mat-header-cell *matHeaderCellDef>Sample code</th><td mat-cell *matCellDef="let row">{{ row.sampleCode }}</td></ng-container>
                  <ng-container matColumnDef="value"><th mat-header-cell *matHeaderCellDef>Au g/t as sent</th><td mat-cell *matCellDef="let row">{{ row.rawValue }}</td></ng-container>
                  <ng-container matColumnDef="status"><th mat-header-cell *matHeaderCellDef>Found</th>
                    <td mat-cell *matCellDef="let row"><span class="with-icon"><mat-icon aria-hidden="true">{{ rowLabel(row.status).icon }}</mat-icon>{{ rowLabel(row.status).text }}</span></td></ng-container>
                  <ng-container matColumnDef="message"><th mat-header-cell *matHeaderCellDef>Detail</th><td mat-cell *matCellDef="let row">{{ row.message }}{{ row.change ? ' (' + row.change + ')' : '' }}</td></ng-container>
                  <tr mat-header-row *matHeaderRowDef="reportColumns"></tr>
                  <tr mat-row *matRowDef="let row; columns: reportColumns" [class.blocking]="row.isBlocking"></tr>
                </table>
              </div>
            }
            @if (!report.isSaved && report.canSave && !report.isAlreadyImported && report.summary.changed > 0) {
              <button mat-flat-button type="button" class="touch" (click)="confirmImport()" [disabled]="isBusy()"><mat-icon>done_all</mat-icon> Save {{ report.summary.changed }} results</button>
            }
            @if (report.isSaved) { <p class="notice" role="status"><mat-icon aria-hidden="true">check_circle</mat-icon> Saved.</p> }
          </div>
        }

        @if (batch.qaqc; as qaqc) {
          <h2>QA/QC</h2>
          <ul class="verdicts" aria-label="QA/QC verdicts">
            @for (entry of qaqc.blanks; track entry.itemId) { <li><mat-icon aria-hidden="true">{{ verdictLabels[entry.verdict].icon }}</mat-icon> Blank {{ entry.labCode }}: {{ verdictLabels[entry.verdict].text }} ({{ entry.valueGpt ?? '—' }} g/t, limit {{ entry.limitGpt }})</li> }
            @for (entry of qaqc.standards; track entry.itemId) { <li><mat-icon aria-hidden="true">{{ verdictLabels[entry.verdict].icon }}</mat-icon> Standard {{ entry.standardCode }} {{ entry.labCode }}: {{ verdictLabels[entry.verdict].text }}{{ entry.zScore === null ? '' : ' (z = ' + (entry.zScore | number: '1.2-2') + ')' }}</li> }
            @for (entry of qaqc.duplicates; track entry.itemId) { <li><mat-icon aria-hidden="true">{{ verdictLabels[entry.verdict].icon }}</mat-icon> Duplicate {{ entry.labCode }} of {{ entry.originalLabCode }}: {{ verdictLabels[entry.verdict].text }}{{ entry.hard === null ? '' : ' (HARD ' + (entry.hard * 100 | number: '1.0-0') + ' %)' }}</li> }
            @for (entry of qaqc.batches; track entry.batchId) { <li data-testid="batch-verdict"><mat-icon aria-hidden="true">{{ verdictLabels[entry.verdict].icon }}</mat-icon> <strong>Batch verdict: {{ verdictLabels[entry.verdict].text }}</strong></li> }
          </ul>
        }

        <h2>Bags in dispatch order</h2>
        <div class="table-wrap">
          <table mat-table [dataSource]="batch.items" aria-label="Bags of the batch">
            <ng-container matColumnDef="position"><th mat-header-cell *matHeaderCellDef>#</th><td mat-cell *matCellDef="let item">{{ item.position }}</td></ng-container>
            <ng-container matColumnDef="labCode"><th mat-header-cell *matHeaderCellDef>Bag code</th><td mat-cell *matCellDef="let item">{{ item.labCode }}</td></ng-container>
            <ng-container matColumnDef="sample"><th mat-header-cell *matHeaderCellDef>Sample</th><td mat-cell *matCellDef="let item">{{ item.sampleCode ?? '—' }}</td></ng-container>
            <ng-container matColumnDef="type"><th mat-header-cell *matHeaderCellDef>Type</th><td mat-cell *matCellDef="let item">{{ item.itemType ?? 'sample' }}{{ item.isInserted ? ' (inserted)' : '' }}{{ item.standardCode ? ' ' + item.standardCode : '' }}</td></ng-container>
            <ng-container matColumnDef="assay"><th mat-header-cell *matHeaderCellDef>Au g/t</th>
              <td mat-cell *matCellDef="let item" data-testid="assay">{{ item.assay ? (item.assay.isBelowDetection ? '< ' + item.assay.detectionLimitGpt : (item.assay.isAboveRange ? '> ' : '') + item.assay.valueGpt) : '—' }}</td></ng-container>
            <tr mat-header-row *matHeaderRowDef="itemColumns"></tr>
            <tr mat-row *matRowDef="let row; columns: itemColumns"></tr>
          </table>
        </div>
      } @else if (problem(); as text) {
        <p class="problem" role="alert"><mat-icon aria-hidden="true">error</mat-icon> {{ text }}</p>
      } @else {
        <mat-progress-bar mode="indeterminate" aria-label="Loading" />
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

  protected rowLabel(status: string): { icon: string; text: string } {
    return ROW_LABELS[status] ?? { icon: 'help', text: status };
  }

  protected async download(): Promise<void> {
    const batch = this.batch();
    if (batch) await this.run(async () => saveBlob(await this.store.submissionCsv(batch.id), `${batch.code}-submission.csv`));
  }

  protected async send(): Promise<void> {
    await this.run(async () => {
      const { mail, batch } = await this.store.send(this.id());
      this.show(batch);
      this.notice.set(mail.status === 'sent' ? `Sent to ${batch.labContactEmail}; a copy is in Outbox.` : `Not sent: ${mail.errorMessage ?? mail.status}`);
    });
  }

  protected async saveCustody(): Promise<void> {
    const changes: CustodyChanges = this.isGeologist()
      ? { ...this.custody, dispatchedAt: toIso(this.dispatchedAtLocal), receivedAt: toIso(this.receivedAtLocal) }
      : { receivedBy: this.custody.receivedBy ?? null, receivedAt: toIso(this.receivedAtLocal), conditionOnReceipt: this.custody.conditionOnReceipt ?? null };
    await this.run(async () => {
      this.show(await this.store.updateCustody(this.id(), changes));
      this.notice.set('Chain of custody saved.');
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
      this.problem.set(toApiProblem(error).message);
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
