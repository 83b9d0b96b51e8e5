import { HttpClient, HttpParams } from '@angular/common/http';
import { Injectable, inject, signal } from '@angular/core';
import { firstValueFrom } from 'rxjs';
import type { LonLat, ScenarioRanks } from '../../../../shared/engine';
import { toApiProblem, type ApiProblem } from '../../core/http/api-error';
import type { EconomicParameters } from '../../../../shared/economics/economic-parameters';

export type { EconomicParameters } from '../../../../shared/economics/economic-parameters';

/** Where a parameter came from. */
export type ParameterSource = 'site' | 'site-default' | 'built-in' | 'query';

/** One recorded change of a parameter. */
export interface EconomicsChange {
  readonly id: string;
  readonly parameter: keyof EconomicParameters;
  readonly oldValue: string | number | null;
  readonly newValue: string | number | null;
  readonly changedByName: string;
  readonly changedAt: string;
}

/** A site's parameters in force and their history. */
export interface EconomicsView {
  readonly siteId: string;
  readonly parameters: EconomicParameters;
  readonly sources: Readonly<Record<keyof EconomicParameters, ParameterSource>>;
  readonly history: readonly EconomicsChange[];
}

/** One pile on the shortlist (server-computed). */
export interface ShortlistRow {
  readonly pileId: string;
  readonly code: string;
  readonly material: string;
  readonly isRankable: boolean;
  readonly thinDataReasons: readonly string[];
  readonly sampleCount: number;
  readonly gradeSource: string | null;
  readonly dryTonnes: number | null;
  readonly gradeGpt: number | null;
  readonly gradeLowGpt: number | null;
  readonly centroid: LonLat | null;
  readonly containedAuG: number | null;
  readonly recoverableAuG: number | null;
  readonly grossValue: number | null;
  readonly haulCost: number | null;
  readonly processingCost: number | null;
  readonly fixedCost: number | null;
  readonly ownerShare: number | null;
  readonly netValue: number | null;
  readonly valuePerTonne: number | null;
  readonly breakEvenGradeGpt: number | null;
  readonly conservativeNetValue: number | null;
  readonly rank: number | null;
  readonly conservativeRank: number | null;
  readonly ranks: ScenarioRanks | null;
  readonly netValueByScenario: Readonly<Record<keyof ScenarioRanks, number>> | null;
}

/** The shortlist of a site, as `GET /api/shortlist` answers. */
export interface ShortlistView {
  readonly site: { readonly id: string; readonly code: string; readonly name: string; readonly processingPoint: LonLat | null };
  readonly generatedAt: string;
  readonly parameters: EconomicParameters & { readonly recovery: number };
  readonly sources: Readonly<Record<keyof EconomicParameters, ParameterSource>>;
  readonly recoverySource: 'trials' | 'default' | 'query';
  readonly acceptedTrialCount: number;
  readonly sensitivityStep: number;
  readonly rows: readonly ShortlistRow[];
  readonly assumptions: readonly string[];
}

/** What-if overrides sent with a report request. */
export type Overrides = Partial<Record<'goldPricePerTroyOz' | 'recovery' | 'haulCostPerTKm' | 'processingCostPerT', number>>;

/** The shortlist and economics of the chosen site, from the server (which computes every figure). */
@Injectable({ providedIn: 'root' })
export class ShortlistStore {
  private readonly http = inject(HttpClient);
  readonly view = signal<ShortlistView | null>(null);
  readonly economics = signal<EconomicsView | null>(null);
  readonly isLoading = signal(false);
  /** Why the last load failed, as the API said it (the screen words it in the person's language). */
  readonly problem = signal<ApiProblem | null>(null);

  async load(siteId: string): Promise<void> {
    this.isLoading.set(true);
    this.problem.set(null);
    try {
      const [view, economics] = await Promise.all([
        firstValueFrom(this.http.get<ShortlistView>('/api/shortlist', { params: { site: siteId } })),
        firstValueFrom(this.http.get<EconomicsView>(`/api/economics/${siteId}`)),
      ]);
      this.view.set(view);
      this.economics.set(economics);
    } catch (error) {
      this.problem.set(toApiProblem(error));
    } finally {
      this.isLoading.set(false);
    }
  }

  /** Saves changed parameters (managers); the shortlist is then fetched again. Throws the API problem. */
  async saveEconomics(siteId: string, changes: Partial<EconomicParameters>): Promise<void> {
    await firstValueFrom(this.http.patch<EconomicsView>(`/api/economics/${siteId}`, changes));
    await this.load(siteId);
  }

  /** Fetches the report (PDF or CSV) with the what-if overrides and hands it to the browser as a download. */
  async downloadReport(siteId: string, format: 'pdf' | 'csv', overrides: Overrides): Promise<void> {
    let params = new HttpParams().set('site', siteId);
    for (const [name, value] of Object.entries(overrides)) {
      params = params.set(name, String(value));
    }
    const response = await firstValueFrom(this.http.get(`/api/shortlist/report.${format}`, { params, responseType: 'blob', observe: 'response' }));
    const filename = /filename="([^"]+)"/.exec(response.headers.get('Content-Disposition') ?? '')?.[1] ?? `shortlist.${format}`;
    const url = URL.createObjectURL(response.body as Blob);
    const link = document.createElement('a');
    link.href = url;
    link.download = filename;
    document.body.appendChild(link);
    link.click();
    link.remove();
    setTimeout(() => URL.revokeObjectURL(url), 60_000);
  }

  /** E-mails the report through the system's mail (listed in the Outbox). */
  sendReport(siteId: string, to: readonly string[], overrides: Overrides): Promise<{ id: string; status: string; errorMessage: string | null }> {
    return firstValueFrom(this.http.post<{ id: string; status: string; errorMessage: string | null }>('/api/shortlist/report/send', { site: siteId, to, overrides }));
  }
}
