import { HttpClient, HttpParams } from '@angular/common/http';
import { Injectable, inject, signal } from '@angular/core';
import { TranslocoService } from '@jsverse/transloco';
import { firstValueFrom } from 'rxjs';
import { toApiProblem } from '../../core/http/api-error';
import { problemText, type ProblemKeys } from '../sign-in/problem-text';

/** Why the outbox could not be read, in words for this screen; other refusals keep the server's words. */
export const OUTBOX_PROBLEMS: ProblemKeys = {
  forbidden: 'outbox.problems.forbidden',
  not_found: 'outbox.problems.notFound',
  unauthenticated: 'outbox.problems.signIn',
  token_expired: 'outbox.problems.signIn',
  offline: 'outbox.problems.offline',
  internal: 'outbox.problems.internal',
};

/** One e-mail the system sent, as `GET /api/outbox` lists it. */
export interface OutboxItem {
  readonly id: string;
  readonly recipients: readonly string[];
  readonly subject: string;
  readonly status: 'sending' | 'sent' | 'failed';
  readonly errorMessage: string | null;
  readonly attachments: readonly { filename: string; contentType: string; sizeBytes: number }[];
  readonly createdAt: string | null;
}

/** The message with its body, from `GET /api/outbox/:id`. */
export interface OutboxMessage extends OutboxItem {
  readonly textBody: string;
}

/** The pages of the organisation's sent mail, newest first. */
@Injectable({ providedIn: 'root' })
export class OutboxStore {
  private readonly http = inject(HttpClient);
  private readonly transloco = inject(TranslocoService);
  readonly items = signal<readonly OutboxItem[]>([]);
  readonly total = signal(0);
  readonly isLoading = signal(false);
  readonly problem = signal<string | null>(null);

  async loadPage(pageIndex: number, pageSize: number): Promise<void> {
    this.isLoading.set(true);
    this.problem.set(null);
    try {
      const params = new HttpParams().set('limit', pageSize).set('offset', pageIndex * pageSize);
      const page = await firstValueFrom(this.http.get<{ items: OutboxItem[]; total: number }>('/api/outbox', { params }));
      this.items.set(page.items);
      this.total.set(page.total);
    } catch (error) {
      this.problem.set(problemText(this.transloco, toApiProblem(error), OUTBOX_PROBLEMS));
    } finally {
      this.isLoading.set(false);
    }
  }

  message(id: string): Promise<OutboxMessage> {
    return firstValueFrom(this.http.get<OutboxMessage>(`/api/outbox/${id}`));
  }
}
