import { DatePipe, DecimalPipe } from '@angular/common';
import { Component, computed, effect, inject, signal, viewChild } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatMenuModule } from '@angular/material/menu';
import { MatPaginator, MatPaginatorModule } from '@angular/material/paginator';
import { MatSort, MatSortModule } from '@angular/material/sort';
import { MatTableDataSource, MatTableModule } from '@angular/material/table';
import { PLANNING_ESTIMATE_STATEMENT } from '../../../../../../shared/safety/cautions';
import { SAMPLE_TYPES } from '../../../../../../shared/sync/protocol';
import { AuthSession } from '../../../../core/auth/auth-session';
import { SamplesStore, type SampleRow } from '../../samples.store';

const COLUMNS = [
  { key: 'pileCode', label: 'Pile' },
  { key: 'sampleType', label: 'Type' },
  { key: 'wetMassKg', label: 'Wet kg' },
  { key: 'increments', label: 'Increments' },
  { key: 'gradeGpt', label: 'Grade g/t' },
  { key: 'gradeSource', label: 'Grade from' },
  { key: 'gpsAccuracyM', label: 'GPS ± m' },
  { key: 'collectedAt', label: 'Collected' },
  { key: 'position', label: 'Position' },
] as const;

/** Type letters beside the words, so the type never rests on colour. */
const TYPE_LETTERS: Record<string, string> = { routine: 'R', duplicate: 'D', blank: 'B', standard: 'S' };

/** `Samples`: every sample of a site with its grade; sort, filter by text and type, page, choose columns. */
@Component({
  selector: 'hs-samples-page',
  imports: [DatePipe, DecimalPipe, MatButtonModule, MatCheckboxModule, MatFormFieldModule, MatIconModule, MatInputModule, MatMenuModule, MatPaginatorModule, MatSortModule, MatTableModule],
  templateUrl: './samples-page.html',
  styles: `
    .toolbar { display: flex; flex-wrap: wrap; gap: 12px; align-items: center; }
    .toolbar button, .toolbar select { min-height: 48px; }
    .toolbar select { padding: 0 12px; font: inherit; border-radius: 8px; }
    .filter { flex: 1 1 220px; max-width: 420px; }
    .table-frame { overflow-x: auto; border: 1px solid var(--mat-sys-outline-variant); border-radius: 12px; }
    table { width: 100%; }
    td, th { padding: 8px 12px; white-space: nowrap; }
    .letter { display: inline-flex; width: 22px; height: 22px; align-items: center; justify-content: center; border: 2px solid currentColor; border-radius: 4px; font-weight: 700; margin-right: 6px; }
    .statement { border-left: 6px solid var(--mat-sys-primary); padding-left: 12px; }
  `,
})
export default class SamplesPage {
  protected readonly store = inject(SamplesStore);
  private readonly session = inject(AuthSession);
  protected readonly statement = PLANNING_ESTIMATE_STATEMENT;
  protected readonly allColumns = COLUMNS;
  protected readonly sampleTypes = SAMPLE_TYPES;
  protected readonly letters = TYPE_LETTERS;
  protected readonly sites = computed(() => this.session.user()?.sites ?? []);
  protected readonly siteId = signal<string | null>(this.sites()[0]?.id ?? null);
  protected readonly typeFilter = signal<string>('');
  protected readonly textFilter = signal<string>('');
  protected readonly shown = signal<ReadonlySet<string>>(new Set(['pileCode', 'sampleType', 'wetMassKg', 'gradeGpt', 'gradeSource', 'collectedAt']));
  protected readonly displayedColumns = computed(() => ['code', ...COLUMNS.map((column) => column.key).filter((key) => this.shown().has(key))]);
  protected readonly dataSource = new MatTableDataSource<SampleRow>([]);
  private readonly sort = viewChild(MatSort);
  private readonly paginator = viewChild(MatPaginator);

  constructor() {
    this.dataSource.sortingDataAccessor = (row, key) => {
      const value = (row as unknown as Record<string, unknown>)[key];
      return typeof value === 'number' ? value : value === null || value === undefined ? -1 : String(value);
    };
    this.dataSource.filterPredicate = (row, filter) => {
      const { text, type } = JSON.parse(filter) as { text: string; type: string };
      return (!type || row.sampleType === type) && [row.code, row.pileCode, row.position, row.sampleType].join(' ').toLowerCase().includes(text);
    };
    effect(() => {
      this.dataSource.data = [...this.store.rows()];
    });
    effect(() => {
      this.dataSource.filter = JSON.stringify({ text: this.textFilter().trim().toLowerCase(), type: this.typeFilter() });
    });
    effect(() => {
      this.dataSource.sort = this.sort() ?? null;
      this.dataSource.paginator = this.paginator() ?? null;
    });
    effect(() => {
      const siteId = this.siteId();
      if (siteId) void this.store.loadSite(siteId);
    });
  }

  protected toggleColumn(key: string): void {
    const next = new Set(this.shown());
    if (next.has(key)) next.delete(key);
    else next.add(key);
    this.shown.set(next);
  }
}
