import { HttpClient } from '@angular/common/http';
import { Injectable, inject, signal } from '@angular/core';
import { firstValueFrom } from 'rxjs';
import type { SampleData } from '../../../../shared/sync/protocol';

/** A sample row: the record, its pile's code and its grade from the engine. */
export type SampleRow = SampleData & {
  readonly pileCode: string;
  readonly gradeGpt: number | null;
  readonly gradeSource: string | null;
  readonly panGpt: number | null;
  readonly assayGpt: number | null;
};

/** Every sample of a site with its grade, for the Samples table. */
@Injectable({ providedIn: 'root' })
export class SamplesStore {
  private readonly http = inject(HttpClient);
  readonly rows = signal<readonly SampleRow[]>([]);
  readonly isLoading = signal(false);
  readonly problem = signal<string | null>(null);

  async loadSite(siteId: string): Promise<void> {
    this.isLoading.set(true);
    this.problem.set(null);
    try {
      this.rows.set((await firstValueFrom(this.http.get<{ samples: SampleRow[] }>(`/api/review/sites/${siteId}`))).samples);
    } catch {
      this.problem.set('The samples could not be loaded. Check the connection and try again.');
    } finally {
      this.isLoading.set(false);
    }
  }
}
