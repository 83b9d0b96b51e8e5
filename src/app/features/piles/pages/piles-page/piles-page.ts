import { DecimalPipe } from '@angular/common';
import { Component, computed, effect, inject, signal, viewChild } from '@angular/core';
import { RouterLink } from '@angular/router';
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
import { AuthSession } from '../../../../core/auth/auth-session';
import { PilesStore, type PileRow } from '../../piles.store';

/** The columns people may show or hide, in order; code is always shown. */
const COLUMNS = [
  { key: 'material', label: 'Material' },
  { key: 'shapeModel', label: 'Shape' },
  { key: 'areaM2', label: 'Area m²' },
  { key: 'dryTonnes', label: 'Dry t' },
  { key: 'n', label: 'Samples graded' },
  { key: 'meanGpt', label: 'Mean g/t' },
  { key: 'ci', label: '90 % interval g/t' },
  { key: 'containedAuG', label: 'Contained Au g' },
  { key: 'samplesNeeded', label: 'Samples needed' },
  { key: 'hazards', label: 'Hazards' },
] as const;

/** `Piles`: every pile of a site with the engine's estimate; sort, filter, page and choose columns. */
@Component({
  selector: 'hs-piles-page',
  imports: [DecimalPipe, RouterLink, MatButtonModule, MatCheckboxModule, MatFormFieldModule, MatIconModule, MatInputModule, MatMenuModule, MatPaginatorModule, MatSortModule, MatTableModule],
  templateUrl: './piles-page.html',
  styles: `
    .toolbar { display: flex; flex-wrap: wrap; gap: 12px; align-items: center; }
    .toolbar button, .toolbar select { min-height: 48px; }
    .toolbar select { padding: 0 12px; font: inherit; border-radius: 8px; }
    .filter { flex: 1 1 220px; max-width: 420px; }
    .table-frame { overflow-x: auto; border: 1px solid var(--mat-sys-outline-variant); border-radius: 12px; }
    table { width: 100%; }
    td, th { padding: 8px 12px; white-space: nowrap; }
    td a { display: inline-flex; align-items: center; min-height: 48px; font-weight: 500; }
    .statement { border-left: 6px solid var(--mat-sys-primary); padding-left: 12px; }
  `,
})
export default class PilesPage {
  protected readonly store = inject(PilesStore);
  private readonly session = inject(AuthSession);
  protected readonly statement = PLANNING_ESTIMATE_STATEMENT;
  protected readonly allColumns = COLUMNS;
  protected readonly sites = computed(() => this.session.user()?.sites ?? []);
  protected readonly siteId = signal<string | null>(this.sites()[0]?.id ?? null);
  protected readonly shown = signal<ReadonlySet<string>>(new Set(['material', 'dryTonnes', 'n', 'meanGpt', 'ci', 'containedAuG', 'hazards']));
  protected readonly displayedColumns = computed(() => ['code', ...COLUMNS.map((column) => column.key).filter((key) => this.shown().has(key))]);
  protected readonly dataSource = new MatTableDataSource<PileRow>([]);
  private readonly sort = viewChild(MatSort);
  private readonly paginator = viewChild(MatPaginator);

  constructor() {
    this.dataSource.sortingDataAccessor = (row, key) => sortValue(row, key);
    this.dataSource.filterPredicate = (row, filter) =>
      [row.pile.code, row.pile.material, row.pile.shapeModel, row.pile.hazards.join(' '), row.pile.notes].join(' ').toLowerCase().includes(filter);
    effect(() => {
      this.dataSource.data = [...this.store.rows()];
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

  protected applyFilter(value: string): void {
    this.dataSource.filter = value.trim().toLowerCase();
  }

  protected toggleColumn(key: string): void {
    const next = new Set(this.shown());
    if (next.has(key)) next.delete(key);
    else next.add(key);
    this.shown.set(next);
  }
}

function sortValue(row: PileRow, key: string): string | number {
  const estimate = row.estimate;
  switch (key) {
    case 'code': return row.pile.code;
    case 'material': return row.pile.material;
    case 'shapeModel': return row.pile.shapeModel;
    case 'areaM2': return estimate?.areaM2 ?? -1;
    case 'dryTonnes': return estimate?.dryTonnes ?? -1;
    case 'n': return estimate?.grade?.n ?? 0;
    case 'meanGpt': return estimate?.grade?.meanGpt ?? -1;
    case 'ci': return estimate?.grade?.ciLowGpt ?? -1;
    case 'containedAuG': return estimate?.containedAuG ?? -1;
    case 'samplesNeeded': return estimate?.samplesNeeded ?? -1;
    default: return row.pile.hazards.length;
  }
}
