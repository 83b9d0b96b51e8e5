import { Component, OnInit, inject, input, signal } from '@angular/core';
import { FormBuilder, ReactiveFormsModule, Validators, type AbstractControl, type ValidationErrors } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { Router, RouterLink } from '@angular/router';
import { TranslocoPipe, TranslocoService } from '@jsverse/transloco';
import { AuthApi, type LinkInfo } from '../../../../core/auth/auth-api';
import { toApiProblem } from '../../../../core/http/api-error';
import { problemText, type ProblemKeys } from '../../problem-text';

/** The server's rule for a new password: 10 to 72 characters. */
const MIN_PASSWORD = 10;
const MAX_PASSWORD = 72;

function sameAsPassword(control: AbstractControl): ValidationErrors | null {
  const password = control.parent?.get('password')?.value as string | undefined;
  return control.value === password ? null : { mismatch: true };
}

/** What a refused link or password means here; other refusals keep the server's words. */
const LINK_PROBLEMS: ProblemKeys = {
  bad_request: 'signIn.problems.linkUsed',
  // The link's token is malformed (cut short when copied from the e-mail, say).
  validation_failed: 'signIn.problems.linkUsed',
  rate_limited: 'signIn.problems.tooManyPasswordRequests',
  offline: 'signIn.problems.offline',
  internal: 'signIn.problems.internal',
};

/** Chooses a password through an e-mailed link (an invitation or a reset). */
@Component({
  selector: 'hs-set-password-page',
  imports: [ReactiveFormsModule, RouterLink, MatButtonModule, MatFormFieldModule, MatIconModule, MatInputModule, TranslocoPipe],
  template: `
    <section class="card">
      <h1><mat-icon aria-hidden="true">password</mat-icon> {{ 'signIn.setPassword.title' | transloco }}</h1>
      @if (problem(); as problem) {
        <p class="problem" role="alert"><mat-icon aria-hidden="true">error</mat-icon><span>{{ problem }}</span></p>
      }
      @if (link(); as link) {
        <p>{{ (link.purpose === 'invitation' ? 'signIn.setPassword.welcome' : 'signIn.setPassword.hello') | transloco: { name: link.name } }} <strong>{{ link.email }}</strong>.</p>
        <form [formGroup]="form" (ngSubmit)="save(link)" novalidate>
          <mat-form-field appearance="outline">
            <mat-label>{{ 'signIn.setPassword.newPassword' | transloco }}</mat-label>
            <mat-icon matPrefix aria-hidden="true">key</mat-icon>
            <input matInput type="password" formControlName="password" autocomplete="new-password" required>
            <mat-hint>{{ 'signIn.setPassword.hint' | transloco: { min: minPassword } }}</mat-hint>
            @if (form.controls.password.invalid) { <mat-error>{{ 'signIn.setPassword.length' | transloco: { min: minPassword, max: maxPassword } }}</mat-error> }
          </mat-form-field>
          <mat-form-field appearance="outline">
            <mat-label>{{ 'signIn.setPassword.again' | transloco }}</mat-label>
            <mat-icon matPrefix aria-hidden="true">key</mat-icon>
            <input matInput type="password" formControlName="confirmation" autocomplete="new-password" required>
            @if (form.controls.confirmation.invalid) { <mat-error>{{ 'signIn.setPassword.mismatch' | transloco }}</mat-error> }
          </mat-form-field>
          <div class="actions">
            <button mat-flat-button type="submit" [disabled]="isBusy()"><mat-icon>check</mat-icon> {{ 'signIn.setPassword.save' | transloco }}</button>
          </div>
        </form>
      } @else if (!problem()) {
        <p class="hs-muted">{{ 'signIn.setPassword.checking' | transloco }}</p>
      } @else {
        <a mat-stroked-button routerLink="/sign-in/forgot"><mat-icon>lock_reset</mat-icon> {{ 'signIn.setPassword.askNew' | transloco }}</a>
      }
    </section>
  `,
  styleUrl: '../../sign-in.scss',
})
export default class SetPasswordPage implements OnInit {
  private readonly api = inject(AuthApi);
  private readonly router = inject(Router);
  private readonly transloco = inject(TranslocoService);
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
      this.problem.set(this.transloco.translate('signIn.setPassword.needsLink'));
      return;
    }
    try {
      this.link.set(await this.api.describeLink(token));
    } catch (error) {
      this.problem.set(this.problemText(error));
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
      this.problem.set(this.problemText(error));
    } finally {
      this.isBusy.set(false);
    }
  }

  private problemText(error: unknown): string {
    const problem = toApiProblem(error);
    if (problem.code === 'validation_failed' && problem.details.some((detail) => detail.path === 'password')) {
      return this.transloco.translate('signIn.setPassword.length', { min: MIN_PASSWORD, max: MAX_PASSWORD });
    }
    if (!LINK_PROBLEMS[problem.code]) return problem.details[0]?.message ?? problem.message;
    return problemText(this.transloco, problem, LINK_PROBLEMS);
  }
}
