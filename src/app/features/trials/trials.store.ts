import { HttpClient } from '@angular/common/http';
import { Injectable, inject, signal } from '@angular/core';
import { firstValueFrom } from 'rxjs';
import { toApiProblem } from '../../core/http/api-error';

/** Whether a trial counts towards the working recovery. */
export type TrialStatus = 'accepted' | 'pending' | 'rejected';

/** A trial as `GET /api/trials` answers it: the record and the server-computed figures (fractions). */
export interface TrialView {
  readonly id: string;
  readonly pileIds: readonly string[];
  readonly pileCodes: readonly string[];
  readonly trialDate: string;
  readonly equipmentNote: string;
  readonly feedMassKg: number;
  readonly feedGradeGpt: number;
  readonly concentrateMassKg: number;
  readonly concentrateGradeGpt: number;
  readonly tailingsGradeGpt: number;
  readonly middlingsMassKg: number | null;
  readonly middlingsGradeGpt: number | null;
  readonly status: TrialStatus;
  readonly massYield: number;
  readonly recoveryTwoProduct: number;
  readonly recoveryWeighed: number | null;
  readonly discrepancy: number | null;
  readonly enrichmentRatio: number;
  readonly recoverySd: number;
  readonly middlingsGoldFraction: number | null;
  readonly isDiscrepancyOverTolerance: boolean;
  readonly warnings: readonly { code: string; message: string }[];
}

/** One site's trials and its working recovery. */
export interface TrialList {
  readonly items: readonly TrialView[];
  readonly workingRecovery: { readonly recovery: number; readonly source: 'trials' | 'default'; readonly trialCount: number };
  readonly discrepancyTolerance: number;
}

/** A new trial as the form sends it. */
export interface NewTrial {
  readonly siteId: string;
  readonly pileIds: readonly string[];
  readonly trialDate: string;
  readonly equipmentNote: string;
  readonly feedMassKg: number;
  readonly feedGradeGpt: number;
  readonly concentrateMassKg: number;
  readonly concentrateGradeGpt: number;
  readonly tailingsGradeGpt: number;
  readonly middlingsMassKg: number | null;
  readonly middlingsGradeGpt: number | null;
  readonly status: TrialStatus;
}

/** The trials of the chosen site and the piles they may name, from the server. */
@Injectable({ providedIn: 'root' })
export class TrialsStore {
  private readonly http = inject(HttpClient);
  readonly list = signal<TrialList | null>(null);
  readonly piles = signal<readonly { id: string; code: string }[]>([]);
  readonly problem = signal<string | null>(null);
  readonly isLoading = signal(false);

  async load(siteId: string): Promise<void> {
    this.isLoading.set(true);
    this.problem.set(null);
    try {
      const [list, piles] = await Promise.all([
        firstValueFrom(this.http.get<TrialList>('/api/trials', { params: { site: siteId } })),
        firstValueFrom(this.http.get<{ items: { id: string; code: string }[] }>('/api/piles', { params: { siteId, limit: 500 } })),
      ]);
      this.list.set(list);
      this.piles.set(piles.items);
    } catch (error) {
      this.problem.set(toApiProblem(error).message);
    } finally {
      this.isLoading.set(false);
    }
  }

  /** Records a trial; throws the API problem (with a detail per refused field). */
  async recordTrial(trial: NewTrial): Promise<void> {
    await firstValueFrom(this.http.post<TrialView>('/api/trials', trial));
    await this.load(trial.siteId);
  }

  async setStatus(siteId: string, id: string, status: TrialStatus): Promise<void> {
    await firstValueFrom(this.http.patch<TrialView>(`/api/trials/${id}`, { status }));
    await this.load(siteId);
  }
}
