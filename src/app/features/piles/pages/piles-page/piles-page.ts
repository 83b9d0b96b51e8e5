import { Component, DestroyRef, Injectable, computed, effect, inject, signal, viewChild } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { TranslocoPipe, TranslocoService } from '@jsverse/transloco';
import { RouterLink } from '@angular/router';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatMenuModule } from '@angular/material/menu';
import { MatPaginator, MatPaginatorIntl, MatPaginatorModule } from '@angular/material/paginator';
import { MatSort, MatSortModule } from '@angular/material/sort';
import { MatTableDataSource, MatTableModule } from '@angular/material/table';
import type { Hazard } from '../../../../../../shared/safety/cautions';
import { AuthSession } from '../../../../core/auth/auth-session';
import { AppLanguage } from '../../../../i18n/app-language';
import { LOCALE_FORMAT_PIPES } from '../../../../i18n/locale-format.pipes';
import { PilesStore, type PileRow } from '../../piles.store';

/** The columns people may show or hide, in order; code is always shown. */
const COLUMNS = [
  { key: 'material', label: 'piles.list.choices.material' },
  { key: 'shapeModel', label: 'piles.list.choices.shapeModel' },
  { key: 'areaM2', label: 'piles.list.choices.areaM2' },
  { key: 'dryTonnes', label: 'piles.list.choices.dryTonnes' },
  { key: 'n', label: 'piles.list.choices.n' },
  { key: 'meanGpt', label: 'piles.list.choices.meanGpt' },
  { key: 'ci', label: 'piles.list.choices.ci' },
  { key: 'containedAuG', label: 'piles.list.choices.containedAuG' },
  { key: 'samplesNeeded', label: 'piles.list.choices.samplesNeeded' },
  { key: 'hazards', label: 'piles.list.choices.hazards' },
] as const;

/** The paginator's own words (items per page, "1 – 10 of 25", page buttons) in the active language. */
@Injectable()
export class PilesPaginatorWords extends MatPaginatorIntl {
  private readonly transloco = inject(TranslocoService);

  constructor() {
    super();
    this.transloco.langChanges$.pipe(takeUntilDestroyed(inject(DestroyRef))).subscribe(() => this.say());
  }

  private say(): void {
    const word = (key: string) => this.transloco.translate(`piles.paginator.${key}`);
    this.itemsPerPageLabel = word('itemsPerPage');
    this.nextPageLabel = word('nextPage');
    this.previousPageLabel = word('previousPage');
    this.firstPageLabel = word('firstPage');
    this.lastPageLabel = word('lastPage');
    this.changes.next();
  }

  override getRangeLabel = (page: number, pageSize: number, length: number): string => {
    if (length === 0 || pageSize === 0) {
      return this.transloco.translate('piles.paginator.rangeEmpty', { length });
    }
    const first = page * pageSize + 1;
    const last = Math.min(length, (page + 1) * pageSize);
    return this.transloco.translate('piles.paginator.range', { first, last, length });
  };
}

/** `Piles`: every pile of a site with the engine's estimate; sort, filter, page and choose columns. */
@Component({
  selector: 'hs-piles-page',
  imports: [TranslocoPipe, LOCALE_FORMAT_PIPES, RouterLink, MatButtonModule, MatCheckboxModule, MatFormFieldModule, MatIconModule, MatInputModule, MatMenuModule, MatPaginatorModule, MatSortModule, MatTableModule],
  templateUrl: './piles-page.html',
  providers: [{ provide: MatPaginatorIntl, useClass: PilesPaginatorWords }],
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
  private readonly transloco = inject(TranslocoService);
  private readonly language = inject(AppLanguage);
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
    // The filter finds a pile by its codes and by the words shown for them in the active language.
    this.dataSource.filterPredicate = (row, filter) =>
      [
        row.pile.code, row.pile.material, row.pile.shapeModel, row.pile.hazards.join(' '), row.pile.notes,
        this.transloco.translate(`common.terms.material.${row.pile.material}`), this.transloco.translate(`common.terms.shapeModel.${row.pile.shapeModel}`),
        this.hazardNames(row.pile.hazards),
      ].join(' ').toLowerCase().includes(filter);
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

  /** The hazards of a pile by name, in the active language. */
  protected hazardNames(hazards: readonly Hazard[]): string {
    this.language.active();
    return hazards.map((hazard) => this.transloco.translate(`piles.hazards.${hazard}`)).join(', ');
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
