import { HttpClient, HttpParams } from '@angular/common/http';
import { Injectable, computed, inject, signal } from '@angular/core';
import type { Subscription } from 'rxjs';
import type { SampleData } from '../../../../shared/sync/protocol';

/** A sample row as `GET /api/samples` lists it: the record, its pile's code and its grade from the engine. */
export type SampleRow = SampleData & {
  readonly revision: number;
  readonly pileCode: string;
  readonly gradeGpt: number | null;
  readonly gradeSource: 'assay' | 'pan' | 'calibrated-pan' | null;
};

/** The columns the server sorts by (the others are shown as they come). */
export type SampleSort = 'code' | 'collectedAt' | 'sampleType' | 'wetMassKg' | 'pileCode';

/** What the Samples screen asks for: the site, the filters the server applies, and the order. */
export interface SampleQuery {
  readonly siteId: string;
  readonly sampleType: SampleData['sampleType'] | null;
  /** The start of a sample code, as the server takes it (`^[A-Z0-9-]{1,24}$`), or null for all. */
  readonly codePrefix: string | null;
  /** null: newest first, the server's own order. */
  readonly sort: { readonly column: SampleSort; readonly direction: 'asc' | 'desc' } | null;
}

interface SamplePage {
  readonly items: readonly SampleRow[];
  readonly total: number;
  readonly limit: number;
  readonly offset: number;
}

/** Rows fetched at a time: a few screens of rows, well under the server's 500. */
export const SAMPLE_PAGE_SIZE = 200;

/** What the filter box may send as a code prefix. */
const CODE_PREFIX = /^[A-Z0-9-]{1,24}$/;

/**
 * The filter box's text as a code prefix: trimmed and upper-cased (codes are written in capitals);
 * undefined when it cannot be the start of a code (the screen says so and keeps the last list).
 */
export function codePrefixOf(text: string): string | null | undefined {
  const prefix = text.trim().toUpperCase();
  if (prefix === '') {
    return null;
  }
  return CODE_PREFIX.test(prefix) ? prefix : undefined;
}

/**
 * The samples of a site page by page from `GET /api/samples`, filtered and sorted on the server:
 * a site can hold 20,000 samples, so the screen holds what was scrolled to, never the whole site.
 * A new query drops the rows and cancels a page still on its way.
 */
@Injectable({ providedIn: 'root' })
export class SamplesStore {
  private readonly http = inject(HttpClient);
  private inFlight: Subscription | null = null;
  readonly query = signal<SampleQuery | null>(null);
  readonly rows = signal<readonly SampleRow[]>([]);
  /** How many samples match the query on the server; null before the first page came. */
  readonly total = signal<number | null>(null);
  readonly isLoading = signal(false);
  /** The translation key of what went wrong, or null. */
  readonly problem = signal<string | null>(null);
  readonly hasMore = computed(() => this.total() !== null && this.rows().length < (this.total() as number));

  /** Starts over with a new query (the first page), unless it is the one already shown. */
  show(query: SampleQuery): void {
    if (JSON.stringify(query) === JSON.stringify(this.query())) {
      return;
    }
    this.inFlight?.unsubscribe();
    this.inFlight = null;
    this.query.set(query);
    this.rows.set([]);
    this.total.set(null);
    this.fetchPage(0);
  }

  /** Fetches the next page, unless one is on its way or every row is here. */
  loadMore(): void {
    if (this.inFlight || !this.query() || (this.total() !== null && !this.hasMore())) {
      return;
    }
    this.fetchPage(this.rows().length);
  }

  /** Tries the page that failed again. */
  retry(): void {
    this.problem.set(null);
    this.loadMore();
  }

  private fetchPage(offset: number): void {
    const query = this.query() as SampleQuery;
    let params = new HttpParams().set('siteId', query.siteId).set('limit', SAMPLE_PAGE_SIZE).set('offset', offset);
    if (query.sampleType) params = params.set('sampleType', query.sampleType);
    if (query.codePrefix) params = params.set('codePrefix', query.codePrefix);
    if (query.sort) params = params.set('sort', query.sort.column).set('direction', query.sort.direction);
    this.isLoading.set(true);
    this.problem.set(null);
    this.inFlight = this.http.get<SamplePage>('/api/samples', { params }).subscribe({
      next: (page) => {
        this.rows.update((rows) => [...rows, ...page.items]);
        this.total.set(page.total);
      },
      error: () => {
        this.inFlight = null;
        this.isLoading.set(false);
        this.problem.set('samples.list.loadProblem');
      },
      complete: () => {
        this.inFlight = null;
        this.isLoading.set(false);
      },
    });
  }
}
