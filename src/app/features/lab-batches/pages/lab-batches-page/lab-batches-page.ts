import { Component, OnInit, computed, inject, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { RouterLink } from '@angular/router';
import { TranslocoPipe, TranslocoService } from '@jsverse/transloco';
import { AuthSession } from '../../../../core/auth/auth-session';
import { toApiProblem } from '../../../../core/http/api-error';
import { LOCALE_FORMAT_PIPES } from '../../../../i18n/locale-format.pipes';
import { problemText } from '../../../sign-in/problem-text';
import { LAB_BATCH_PROBLEMS, LabBatchesStore, STATUS_LABELS, type BatchSummary } from '../../lab-batches.store';

/** `Lab batches`: the batches of the geologist's sites, or those addressed to the lab user's lab. */
@Component({
  selector: 'hs-lab-batches-page',
  imports: [LOCALE_FORMAT_PIPES, MatButtonModule, MatIconModule, MatProgressBarModule, RouterLink, TranslocoPipe],
  template: `
    <section class="hs-page">
      <h1><mat-icon aria-hidden="true">science</mat-icon> {{ 'labBatches.list.title' | transloco }}</h1>
      @if (isLab()) {
        <p class="hs-muted">{{ 'labBatches.list.introLab' | transloco: { lab: session.user()?.labName ?? '' } }}</p>
      } @else {
        <p class="hs-muted">{{ 'labBatches.list.intro' | transloco }}</p>
        <a mat-flat-button routerLink="/lab-batches/new" class="touch"><mat-icon>add</mat-icon> {{ 'labBatches.list.newBatch' | transloco }}</a>
      }
      @if (isLoading()) { <mat-progress-bar mode="indeterminate" [attr.aria-label]="'labBatches.list.loading' | transloco" /> }
      @if (problem(); as text) { <p class="problem" role="alert"><mat-icon aria-hidden="true">error</mat-icon> {{ text }}</p> }
      <ul class="batches" [attr.aria-label]="'labBatches.list.title' | transloco">
        @for (batch of batches(); track batch.id) {
          <li>
            <a [routerLink]="['/lab-batches', batch.id]" class="batch">
              <mat-icon aria-hidden="true">{{ statusLabels[batch.status].icon }}</mat-icon>
              <span class="text">
                <strong>{{ batch.code }}</strong>
                <span>{{ 'labBatches.list.line' | transloco: { count: batch.itemCount, lab: batch.labName, method: batch.method } }}</span>
                <span class="hs-muted">{{ 'labBatches.list.made' | transloco: { status: (statusLabels[batch.status].key | transloco), date: (batch.createdAt | hsDate: 'd MMM y') } }}</span>
              </span>
            </a>
          </li>
        } @empty {
          @if (!isLoading()) { <li class="hs-muted">{{ 'labBatches.list.empty' | transloco }}</li> }
        }
      </ul>
    </section>
  `,
  styles: `
    .touch { min-height: 48px; margin: 8px 0; }
    .batches { list-style: none; padding: 0; margin: 16px 0; display: flex; flex-direction: column; gap: 8px; }
    .batch { display: flex; gap: 12px; align-items: flex-start; min-height: 56px; padding: 12px; border-radius: 12px; color: inherit; text-decoration: none;
      border: 1px solid var(--mat-sys-outline-variant); background: var(--mat-sys-surface-container-low); }
    .text { display: flex; flex-direction: column; gap: 2px; min-width: 0; overflow-wrap: anywhere; }
    .problem { display: flex; gap: 8px; padding: 12px; border-radius: 12px; background: var(--mat-sys-error-container); color: var(--mat-sys-on-error-container); }
  `,
})
export default class LabBatchesPage implements OnInit {
  protected readonly session = inject(AuthSession);
  private readonly store = inject(LabBatchesStore);
  private readonly transloco = inject(TranslocoService);
  protected readonly statusLabels = STATUS_LABELS;
  protected readonly batches = signal<readonly BatchSummary[]>([]);
  protected readonly isLoading = signal(false);
  protected readonly problem = signal<string | null>(null);
  protected readonly isLab = computed(() => this.session.role() === 'lab');

  async ngOnInit(): Promise<void> {
    this.isLoading.set(true);
    try {
      this.batches.set(await this.store.list());
    } catch (error) {
      this.problem.set(problemText(this.transloco, toApiProblem(error), LAB_BATCH_PROBLEMS));
    } finally {
      this.isLoading.set(false);
    }
  }
}
