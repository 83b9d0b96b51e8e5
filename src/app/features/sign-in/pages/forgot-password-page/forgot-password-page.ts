import { Component, inject, signal } from '@angular/core';
import { FormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { RouterLink } from '@angular/router';
import { AuthApi } from '../../../../core/auth/auth-api';
import { toApiProblem } from '../../../../core/http/api-error';

/** Asks for a password-reset link by e-mail. */
@Component({
  selector: 'hs-forgot-password-page',
  imports: [ReactiveFormsModule, RouterLink, MatButtonModule, MatFormFieldModule, MatIconModule, MatInputModule],
  template: `
    <section class="card">
      <h1><mat-icon aria-hidden="true">lock_reset</mat-icon> Forgot your password?</h1>
      @if (sent(); as sent) {
        <p class="notice" role="status"><mat-icon aria-hidden="true">mark_email_read</mat-icon><span>{{ sent }}</span></p>
        <a mat-stroked-button routerLink="/sign-in"><mat-icon>login</mat-icon> Back to sign in</a>
      } @else {
        <p class="hs-muted">We will e-mail you a link to choose a new password. It works once, for one hour.</p>
        @if (problem(); as problem) {
          <p class="problem" role="alert"><mat-icon aria-hidden="true">error</mat-icon><span>{{ problem }}</span></p>
        }
        <form [formGroup]="form" (ngSubmit)="send()" novalidate>
          <mat-form-field appearance="outline">
            <mat-label>E-mail</mat-label>
            <mat-icon matPrefix aria-hidden="true">mail</mat-icon>
            <input matInput type="email" formControlName="email" autocomplete="username" required>
            @if (form.controls.email.invalid) { <mat-error>Enter your e-mail address</mat-error> }
          </mat-form-field>
          <div class="actions">
            <button mat-flat-button type="submit" [disabled]="isBusy()"><mat-icon>send</mat-icon> Send the link</button>
            <a routerLink="/sign-in">Back to sign in</a>
          </div>
        </form>
      }
    </section>
  `,
  styleUrl: '../../sign-in.scss',
})
export default class ForgotPasswordPage {
  private readonly api = inject(AuthApi);
  protected readonly isBusy = signal(false);
  protected readonly sent = signal<string | null>(null);
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
      this.sent.set((await this.api.requestPasswordReset(this.form.getRawValue().email.trim())).message);
    } catch (error) {
      this.problem.set(toApiProblem(error).message);
    } finally {
      this.isBusy.set(false);
    }
  }
}
