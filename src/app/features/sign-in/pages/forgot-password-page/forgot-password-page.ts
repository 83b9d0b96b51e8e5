import { Component, inject, signal } from '@angular/core';
import { FormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { RouterLink } from '@angular/router';
import { TranslocoPipe, TranslocoService } from '@jsverse/transloco';
import { AuthApi } from '../../../../core/auth/auth-api';
import { toApiProblem } from '../../../../core/http/api-error';
import { problemText, type ProblemKeys } from '../../problem-text';

/** What a refused request for a link means here; other refusals keep the server's words. */
const FORGOT_PROBLEMS: ProblemKeys = {
  validation_failed: 'signIn.fields.emailRequired',
  rate_limited: 'signIn.problems.tooManyPasswordRequests',
  offline: 'signIn.problems.offline',
  internal: 'signIn.problems.internal',
};

/** Asks for a password-reset link by e-mail. */
@Component({
  selector: 'hs-forgot-password-page',
  imports: [ReactiveFormsModule, RouterLink, MatButtonModule, MatFormFieldModule, MatIconModule, MatInputModule, TranslocoPipe],
  template: `
    <section class="card">
      <h1><mat-icon aria-hidden="true">lock_reset</mat-icon> {{ 'signIn.forgot.title' | transloco }}</h1>
      @if (isSent()) {
        <p class="notice" role="status"><mat-icon aria-hidden="true">mark_email_read</mat-icon><span>{{ 'signIn.forgot.sent' | transloco }}</span></p>
        <a mat-stroked-button routerLink="/sign-in"><mat-icon>login</mat-icon> {{ 'signIn.forgot.backToSignIn' | transloco }}</a>
      } @else {
        <p class="hs-muted">{{ 'signIn.forgot.explain' | transloco }}</p>
        @if (problem(); as problem) {
          <p class="problem" role="alert"><mat-icon aria-hidden="true">error</mat-icon><span>{{ problem }}</span></p>
        }
        <form [formGroup]="form" (ngSubmit)="send()" novalidate>
          <mat-form-field appearance="outline">
            <mat-label>{{ 'signIn.fields.email' | transloco }}</mat-label>
            <mat-icon matPrefix aria-hidden="true">mail</mat-icon>
            <input matInput type="email" formControlName="email" autocomplete="username" required>
            @if (form.controls.email.invalid) { <mat-error>{{ 'signIn.fields.emailRequired' | transloco }}</mat-error> }
          </mat-form-field>
          <div class="actions">
            <button mat-flat-button type="submit" [disabled]="isBusy()"><mat-icon>send</mat-icon> {{ 'signIn.forgot.send' | transloco }}</button>
            <a routerLink="/sign-in">{{ 'signIn.forgot.backToSignIn' | transloco }}</a>
          </div>
        </form>
      }
    </section>
  `,
  styleUrl: '../../sign-in.scss',
})
export default class ForgotPasswordPage {
  private readonly api = inject(AuthApi);
  private readonly transloco = inject(TranslocoService);
  protected readonly isBusy = signal(false);
  /** The server took the request. It answers the same whether or not the address has an account. */
  protected readonly isSent = signal(false);
  protected readonly problem = signal<string | null>(null);
  protected readonly form = inject(FormBuilder).nonNullable.group({ email: ['', [Validators.required, Validators.email]] });

  protected async send(): Promise<void> {
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    this.isBusy.set(true);
    this.problem.set(null);
    try {
      await this.api.requestPasswordReset(this.form.getRawValue().email.trim());
      this.isSent.set(true);
    } catch (error) {
      this.problem.set(problemText(this.transloco, toApiProblem(error), FORGOT_PROBLEMS));
    } finally {
      this.isBusy.set(false);
    }
  }
}
