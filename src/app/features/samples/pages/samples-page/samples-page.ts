import { ScrollingModule, CdkVirtualScrollViewport } from '@angular/cdk/scrolling';
import { Component, Injector, afterNextRender, computed, effect, inject, signal, viewChild } from '@angular/core';
import { TranslocoPipe } from '@jsverse/transloco';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatMenuModule } from '@angular/material/menu';
import { MatSortModule, type Sort } from '@angular/material/sort';
import { SAMPLE_TYPES, type SampleData } from '../../../../../../shared/sync/protocol';
import { AuthSession } from '../../../../core/auth/auth-session';
import { LOCALE_FORMAT_PIPES } from '../../../../i18n/locale-format.pipes';
import { SamplesStore, codePrefixOf, type SampleRow, type SampleSort } from '../../samples.store';

/** The columns people may show or hide, in order; the sample code is always shown, first. */
const COLUMNS = [
  { key: 'pileCode', label: 'samples.list.choices.pileCode' },
  { key: 'sampleType', label: 'samples.list.choices.sampleType' },
  { key: 'wetMassKg', label: 'samples.list.choices.wetMassKg' },
  { key: 'increments', label: 'samples.list.choices.increments' },
  { key: 'gradeGpt', label: 'samples.list.choices.gradeGpt' },
  { key: 'gradeSource', label: 'samples.list.choices.gradeSource' },
  { key: 'gpsAccuracyM', label: 'samples.list.choices.gpsAccuracyM' },
  { key: 'collectedAt', label: 'samples.list.choices.collectedAt' },
  { key: 'position', label: 'samples.list.choices.position' },
] as const;

type ColumnKey = 'code' | (typeof COLUMNS)[number]['key'];

/** Width of each column in the grid (the header and the rows share it). */
const COLUMN_WIDTHS: Record<ColumnKey, string> = {
  code: 'minmax(132px, 1.2fr)', pileCode: 'minmax(124px, 1fr)', sampleType: 'minmax(180px, 1.3fr)', wetMassKg: 'minmax(88px, 0.7fr)',
  increments: 'minmax(104px, 0.7fr)', gradeGpt: 'minmax(96px, 0.7fr)', gradeSource: 'minmax(150px, 1fr)', gpsAccuracyM: 'minmax(88px, 0.6fr)',
  collectedAt: 'minmax(150px, 1fr)', position: 'minmax(140px, 1fr)',
};

/** The columns the server can sort by; the others are shown in whatever order the sort gives. */
const SORTABLE: ReadonlySet<string> = new Set<SampleSort>(['code', 'pileCode', 'sampleType', 'wetMassKg', 'collectedAt']);
const NUMERIC: ReadonlySet<string> = new Set(['wetMassKg', 'increments', 'gradeGpt', 'gpsAccuracyM']);

/** Type letters beside the words, so the type never rests on colour. */
const TYPE_LETTERS: Record<string, string> = { routine: 'R', duplicate: 'D', blank: 'B', standard: 'S' };

/** One row's height in px: a 48 px touch target. The viewport needs it fixed to place rows without measuring them. */
const ROW_HEIGHT = 48;
/** Fetch the next page once the rows in view come this close to the last one fetched. */
const ROWS_AHEAD = 60;
/** The tallest the list grows before it scrolls inside the page. */
const VIEWPORT_MAX_HEIGHT = '65vh';

/**
 * `Samples`: a site's samples with their grades, paged from the server as the list scrolls (a
 * site can hold 20,000), filtered by type and by the start of the code, sorted by a column,
 * with the columns people choose.
 */
@Component({
  selector: 'hs-samples-page',
  imports: [TranslocoPipe, LOCALE_FORMAT_PIPES, ScrollingModule, MatButtonModule, MatCheckboxModule, MatFormFieldModule, MatIconModule, MatInputModule, MatMenuModule, MatSortModule],
  templateUrl: './samples-page.html',
  styles: `
    .toolbar { display: flex; flex-wrap: wrap; gap: 12px; align-items: center; }
    .toolbar button, .toolbar select { min-height: 48px; }
    .toolbar select { padding: 0 12px; font: inherit; border-radius: 8px; }
    .filter { flex: 1 1 220px; max-width: 420px; }
    .refused { color: var(--mat-sys-error); }
    .count { min-height: 1.5em; margin: 8px 0; font: var(--mat-sys-title-small); }
    .table-frame { overflow-x: auto; border: 1px solid var(--mat-sys-outline-variant); border-radius: 12px; }
    .grid { min-width: max-content; }
    /* The list scrolls by keyboard too (it takes focus), so show where focus is. */
    .viewport:focus-visible { outline: 3px solid var(--mat-sys-primary); outline-offset: -3px; }
    .row { display: grid; grid-template-columns: var(--columns); height: 48px; align-items: center; border-bottom: 1px solid var(--mat-sys-outline-variant); }
    .row > div { padding: 0 12px; white-space: nowrap; overflow: hidden; text-overflow: ellipsis; }
    .header { font-weight: 500; height: 56px; background: var(--mat-sys-surface-container); }
    .number { text-align: end; }
    .empty { grid-template-columns: 1fr; }
    .letter { display: inline-flex; width: 22px; height: 22px; align-items: center; justify-content: center; border: 2px solid currentColor; border-radius: 4px; font-weight: 700; margin-right: 6px; }
    .more { margin-top: 12px; min-height: 48px; }
    .statement { border-left: 6px solid var(--mat-sys-primary); padding-left: 12px; }
  `,
})
export default class SamplesPage {
  protected readonly store = inject(SamplesStore);
  private readonly session = inject(AuthSession);
  private readonly injector = inject(Injector);
  protected readonly allColumns = COLUMNS;
  protected readonly sampleTypes = SAMPLE_TYPES;
  protected readonly letters = TYPE_LETTERS;
  protected readonly rowHeight = ROW_HEIGHT;
  protected readonly sites = computed(() => this.session.user()?.sites ?? []);
  protected readonly siteId = signal<string | null>(this.sites()[0]?.id ?? null);
  protected readonly typeFilter = signal<string>('');
  protected readonly textFilter = signal<string>('');
  protected readonly sort = signal<{ column: SampleSort; direction: 'asc' | 'desc' } | null>(null);
  protected readonly shown = signal<ReadonlySet<string>>(new Set(['pileCode', 'sampleType', 'wetMassKg', 'gradeGpt', 'gradeSource', 'collectedAt']));
  protected readonly displayedColumns = computed<ColumnKey[]>(() => ['code', ...COLUMNS.map((column) => column.key).filter((key) => this.shown().has(key))]);
  protected readonly gridColumns = computed(() => this.displayedColumns().map((column) => COLUMN_WIDTHS[column]).join(' '));
  /** The code prefix typed, or undefined when the text cannot start a code (the last list stays). */
  private readonly codePrefix = computed(() => codePrefixOf(this.textFilter()));
  protected readonly isPrefixRefused = computed(() => this.codePrefix() === undefined);
  protected readonly sortColumn = computed(() => this.sort()?.column ?? '');
  protected readonly sortDirection = computed(() => this.sort()?.direction ?? '');
  private readonly viewport = viewChild(CdkVirtualScrollViewport);
  /** As tall as the rows here, up to most of the screen, so a short list leaves no empty frame. */
  protected readonly viewportHeight = computed(() => `min(${VIEWPORT_MAX_HEIGHT}, ${this.store.rows().length * ROW_HEIGHT}px)`);

  constructor() {
    effect(() => {
      const siteId = this.siteId();
      const codePrefix = this.codePrefix();
      if (siteId && codePrefix !== undefined) {
        this.store.show({ siteId, sampleType: (this.typeFilter() || null) as SampleData['sampleType'] | null, codePrefix, sort: this.sort() });
      }
    });
    // The viewport measures itself once; tell it when its height follows the rows.
    effect(() => {
      this.viewportHeight();
      const viewport = this.viewport();
      if (viewport) afterNextRender(() => viewport.checkViewportSize(), { injector: this.injector });
    });
    // A new query starts at the top of the list.
    effect(() => {
      const viewport = this.viewport();
      if (this.store.rows().length === 0 && viewport && viewport.measureScrollOffset() > 0) viewport.scrollToOffset(0);
    });
  }

  /** The first row in view moved: fetch the next page when the end of what is here comes near. */
  protected nearRow(firstInView: number): void {
    const rowsInView = Math.ceil((this.viewport()?.getViewportSize() ?? 0) / ROW_HEIGHT);
    if (firstInView + rowsInView + ROWS_AHEAD >= this.store.rows().length) {
      this.store.loadMore();
    }
  }

  protected sortBy(sort: Sort): void {
    this.sort.set(sort.direction ? { column: sort.active as SampleSort, direction: sort.direction } : null);
  }

  protected isSortable(column: string): boolean {
    return SORTABLE.has(column);
  }

  protected isNumeric(column: string): boolean {
    return NUMERIC.has(column);
  }

  protected headerOf(column: ColumnKey): string {
    return `samples.list.headers.${column}`;
  }

  protected trackById(_index: number, row: SampleRow): string {
    return row.id;
  }

  protected toggleColumn(key: string): void {
    const next = new Set(this.shown());
    if (next.has(key)) next.delete(key);
    else next.add(key);
    this.shown.set(next);
  }
}
