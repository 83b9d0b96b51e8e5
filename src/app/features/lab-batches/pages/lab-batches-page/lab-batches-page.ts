import { DatePipe } from '@angular/common';
import { Component, OnInit, computed, inject, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { RouterLink } from '@angular/router';
import { AuthSession } from '../../../../core/auth/auth-session';
import { toApiProblem } from '../../../../core/http/api-error';
import { LabBatchesStore, STATUS_LABELS, type BatchSummary } from '../../lab-batches.store';

/** `Lab batches`: the batches of the geologist's sites, or those addressed to the lab user's lab. */
@Component({
  selector: 'hs-lab-batches-page',
  imports: [DatePipe, MatButtonModule, MatIconModule, MatProgressBarModule, RouterLink],
  template: `
    <section class="hs-page">
      <h1><mat-icon aria-hidden="true">science</mat-icon> Lab batches</h1>
      @if (isLab()) {
        <p class="hs-muted">Batches addressed to {{ session.user()?.labName }}. Open one to download its submission sheet and upload the results.</p>
      } @else {
        <p class="hs-muted">Samples go to the lab in batches with blanks, reference standards and duplicates; results come back as a CSV, checked before anything is saved.</p>
        <a mat-flat-button routerLink="/lab-batches/new" class="touch"><mat-icon>add</mat-icon> New batch</a>
      }
      @if (isLoading()) { <mat-progress-bar mode="indeterminate" aria-label="Loading" /> }
      @if (problem(); as text) { <p class="problem" role="alert"><mat-icon aria-hidden="true">error</mat-icon> {{ text }}</p> }
      <ul class="batches" aria-label="Lab batches">
        @for (batch of batches(); track batch.id) {
          <li>
            <a [routerLink]="['/lab-batches', batch.id]" class="batch">
              <mat-icon aria-hidden="true">{{ statusLabels[batch.status].icon }}</mat-icon>
              <span class="text">
                <strong>{{ batch.code }}</strong>
                <span>{{ batch.itemCount }} bags · {{ batch.labName }} · {{ batch.method }}</span>
                <span class="hs-muted">{{ statusLabels[batch.status].text }} · made {{ batch.createdAt | date: 'd MMM y' }}</span>
              </span>
            </a>
          </li>
        } @empty {
          @if (!isLoading()) { <li class="hs-muted">No lab batches yet.</li> }
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
      this.problem.set(toApiProblem(error).message);
    } finally {
      this.isLoading.set(false);
    }
  }
}
