import { Component, OnInit, inject, input, signal } from '@angular/core';
import { FormBuilder, ReactiveFormsModule, Validators, type AbstractControl, type ValidationErrors } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { Router, RouterLink } from '@angular/router';
import { AuthApi, type LinkInfo } from '../../../../core/auth/auth-api';
import { toApiProblem } from '../../../../core/http/api-error';

/** The server's rule for a new password: 10 to 72 characters. */
const MIN_PASSWORD = 10;
const MAX_PASSWORD = 72;

function sameAsPassword(control: AbstractControl): ValidationErrors | null {
  const password = control.parent?.get('password')?.value as string | undefined;
  return control.value === password ? null : { mismatch: true };
}

/** Chooses a password through an e-mailed link (an invitation or a reset). */
@Component({
  selector: 'hs-set-password-page',
  imports: [ReactiveFormsModule, RouterLink, MatButtonModule, MatFormFieldModule, MatIconModule, MatInputModule],
  template: `
    <section class="card">
      <h1><mat-icon aria-hidden="true">password</mat-icon> Choose a password</h1>
      @if (problem(); as problem) {
        <p class="problem" role="alert"><mat-icon aria-hidden="true">error</mat-icon><span>{{ problem }}</span></p>
      }
      @if (link(); as link) {
        <p>{{ link.purpose === 'invitation' ? 'Welcome' : 'Hello' }}, {{ link.name }}. Choose the password for <strong>{{ link.email }}</strong>.</p>
        <form [formGroup]="form" (ngSubmit)="save(link)" novalidate>
          <mat-form-field appearance="outline">
            <mat-label>New password</mat-label>
            <mat-icon matPrefix aria-hidden="true">key</mat-icon>
            <input matInput type="password" formControlName="password" autocomplete="new-password" required>
            <mat-hint>At least {{ minPassword }} characters</mat-hint>
            @if (form.controls.password.invalid) { <mat-error>Use {{ minPassword }} to {{ maxPassword }} characters</mat-error> }
          </mat-form-field>
          <mat-form-field appearance="outline">
            <mat-label>The same password again</mat-label>
            <mat-icon matPrefix aria-hidden="true">key</mat-icon>
            <input matInput type="password" formControlName="confirmation" autocomplete="new-password" required>
            @if (form.controls.confirmation.invalid) { <mat-error>The two passwords differ</mat-error> }
          </mat-form-field>
          <div class="actions">
            <button mat-flat-button type="submit" [disabled]="isBusy()"><mat-icon>check</mat-icon> Save password</button>
          </div>
        </form>
      } @else if (!problem()) {
        <p class="hs-muted">Checking the link…</p>
      } @else {
        <a mat-stroked-button routerLink="/sign-in/forgot"><mat-icon>lock_reset</mat-icon> Ask for a new link</a>
      }
    </section>
  `,
  styleUrl: '../../sign-in.scss',
})
export default class SetPasswordPage implements OnInit {
  private readonly api = inject(AuthApi);
  private readonly router = inject(Router);
  /** The token from the e-mailed link (`?token=`). */
  readonly token = input<string>();

  protected readonly minPassword = MIN_PASSWORD;
  protected readonly maxPassword = MAX_PASSWORD;
  protected readonly link = signal<LinkInfo | null>(null);
  protected readonly problem = signal<string | null>(null);
  protected readonly isBusy = signal(false);
  protected readonly form = inject(FormBuilder).nonNullable.group({
    password: ['', [Validators.required, Validators.minLength(MIN_PASSWORD), Validators.maxLength(MAX_PASSWORD)]],
    confirmation: ['', [Validators.required, sameAsPassword]],
  });

  async ngOnInit(): Promise<void> {
    const token = this.token();
    if (!token) {
      this.problem.set('This page needs the link from your e-mail.');
      return;
    }
    try {
      this.link.set(await this.api.describeLink(token));
    } catch (error) {
      this.problem.set(toApiProblem(error).message);
    }
  }

  protected async save(link: LinkInfo): Promise<void> {
    this.form.controls.confirmation.updateValueAndValidity();
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    this.isBusy.set(true);
    this.problem.set(null);
    try {
      await this.api.setPassword(this.token() as string, this.form.getRawValue().password);
      await this.router.navigate(['/sign-in'], { queryParams: { email: link.email } });
    } catch (error) {
      const problem = toApiProblem(error);
      this.problem.set(problem.details[0]?.message ?? problem.message);
    } finally {
      this.isBusy.set(false);
    }
  }
}
