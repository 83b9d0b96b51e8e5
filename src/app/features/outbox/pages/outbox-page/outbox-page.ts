import { Component, OnInit, inject, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatPaginatorModule, type PageEvent } from '@angular/material/paginator';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { TranslocoPipe, TranslocoService } from '@jsverse/transloco';
import { toApiProblem } from '../../../../core/http/api-error';
import { LOCALE_FORMAT_PIPES } from '../../../../i18n/locale-format.pipes';
import { problemText } from '../../../sign-in/problem-text';
import { OUTBOX_PROBLEMS } from '../../outbox.store';
import { OutboxStore, type OutboxMessage } from '../../outbox.store';

/** A piece of a message body: plain text, or a web address to show as a link. */
interface BodyPart {
  readonly text: string;
  readonly isLink: boolean;
}

const URL_PATTERN = /(https?:\/\/[^\s<>"]+)/g;
const STATUS_ICONS = { sent: 'mark_email_read', sending: 'schedule_send', failed: 'error' } as const;
/** How each sending status is written (translation keys). */
const STATUS_KEYS = { sent: 'outbox.status.sent', sending: 'outbox.status.sending', failed: 'outbox.status.failed' } as const;

/** Splits text into plain parts and links, so links are clickable without rendering any HTML. */
export function splitLinks(text: string): BodyPart[] {
  return text.split(URL_PATTERN).filter((part) => part !== '').map((part) => ({ text: part, isLink: /^https?:\/\//.test(part) }));
}

/** `Outbox` (admin): every e-mail the system sent — invitations, resets, lab batches — and whether it went. */
@Component({
  selector: 'hs-outbox-page',
  imports: [LOCALE_FORMAT_PIPES, MatButtonModule, MatIconModule, MatPaginatorModule, MatProgressBarModule, TranslocoPipe],
  template: `
    <section class="hs-page">
      <h1><mat-icon aria-hidden="true">outgoing_mail</mat-icon> {{ 'outbox.page.title' | transloco }}</h1>
      <p class="hs-muted">{{ 'outbox.page.intro' | transloco }}</p>
      @if (store.isLoading()) { <mat-progress-bar mode="indeterminate" [attr.aria-label]="'outbox.page.loading' | transloco" /> }
      @if (store.problem(); as problem) { <p class="problem" role="alert"><mat-icon aria-hidden="true">error</mat-icon>{{ problem }}</p> }

      <ul class="messages" [attr.aria-label]="'outbox.page.listLabel' | transloco">
        @for (item of store.items(); track item.id) {
          <li>
            <button type="button" class="summary" (click)="toggle(item.id)" [attr.aria-expanded]="opened()?.id === item.id">
              <mat-icon aria-hidden="true" [class]="'status-' + item.status">{{ statusIcons[item.status] }}</mat-icon>
              <span class="text">
                <strong>{{ item.subject }}</strong>
                <span>{{ 'outbox.page.to' | transloco: { recipients: item.recipients.join(', ') } }}</span>
                <span class="hs-muted">{{ item.createdAt | hsDate: 'd MMM y, HH:mm' }} · {{ statusKeys[item.status] | transloco }}@if (item.attachments.length) { · {{ 'outbox.page.attachments' | transloco: { count: item.attachments.length } }}}</span>
              </span>
            </button>
            @if (opened(); as message) {
              @if (message.id === item.id) {
                <div class="body">
                  @if (message.errorMessage) { <p class="problem">{{ message.errorMessage }}</p> }
                  <p class="text-body">@for (part of parts(); track $index) {@if (part.isLink) {<a [href]="part.text">{{ part.text }}</a>} @else {{{ part.text }}}}</p>
                  @for (attachment of message.attachments; track attachment.filename) {
                    <p class="with-icon"><mat-icon aria-hidden="true">attach_file</mat-icon>{{ 'outbox.page.attachment' | transloco: { filename: attachment.filename, size: (attachment.sizeBytes | hsNumber) } }}</p>
                  }
                </div>
              }
            }
          </li>
        } @empty {
          @if (!store.isLoading()) { <li class="hs-muted">{{ 'outbox.page.empty' | transloco }}</li> }
        }
      </ul>
      <mat-paginator [length]="store.total()" [pageSize]="pageSize" [pageSizeOptions]="[25, 50, 100]" (page)="changePage($event)" [attr.aria-label]="'outbox.page.pages' | transloco" />
    </section>
  `,
  styles: `
    .messages { list-style: none; padding: 0; margin: 16px 0; display: flex; flex-direction: column; gap: 8px; }
    .messages > li { border: 1px solid var(--mat-sys-outline-variant); border-radius: 12px; background: var(--mat-sys-surface-container-low); }
    .summary { display: flex; gap: 12px; align-items: flex-start; width: 100%; min-height: 56px; padding: 12px; text-align: left;
      background: none; border: 0; color: inherit; font: inherit; cursor: pointer; }
    .text { display: flex; flex-direction: column; gap: 2px; min-width: 0; overflow-wrap: anywhere; }
    .body { padding: 0 12px 12px 48px; }
    .text-body { white-space: pre-wrap; overflow-wrap: anywhere; }
    .status-sent { color: var(--hs-ok); } .status-failed { color: var(--hs-fail); } .status-sending { color: var(--hs-warn); }
    .with-icon { display: flex; align-items: center; gap: 6px; }
    .problem { padding: 12px; border-radius: 12px; background: var(--mat-sys-error-container); color: var(--mat-sys-on-error-container); }
  `,
})
export default class OutboxPage implements OnInit {
  protected readonly store = inject(OutboxStore);
  private readonly transloco = inject(TranslocoService);
  protected readonly statusIcons = STATUS_ICONS;
  protected readonly statusKeys = STATUS_KEYS;
  protected readonly pageSize = 25;
  protected readonly opened = signal<OutboxMessage | null>(null);
  protected readonly parts = signal<BodyPart[]>([]);

  ngOnInit(): void {
    void this.store.loadPage(0, this.pageSize);
  }

  protected changePage(event: PageEvent): void {
    void this.store.loadPage(event.pageIndex, event.pageSize);
  }

  protected async toggle(id: string): Promise<void> {
    if (this.opened()?.id === id) {
      this.opened.set(null);
      return;
    }
    try {
      const message = await this.store.message(id);
      this.parts.set(splitLinks(message.textBody));
      this.opened.set(message);
    } catch (error) {
      this.store.problem.set(problemText(this.transloco, toApiProblem(error), OUTBOX_PROBLEMS));
    }
  }
}
