import { Component, OnInit, inject, input, signal } from '@angular/core';
import { FormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { Router, RouterLink } from '@angular/router';
import { TranslocoPipe, TranslocoService } from '@jsverse/transloco';
import { AuthApi } from '../../../../core/auth/auth-api';
import { safeReturnUrl } from '../../../../core/auth/auth-guards';
import { AuthSession } from '../../../../core/auth/auth-session';
import { toApiProblem } from '../../../../core/http/api-error';
import { LanguagePicker } from '../../../../i18n/language-picker/language-picker';
import { problemText, type ProblemKeys } from '../../problem-text';

/** What a refused sign-in means on this form; other refusals keep the server's words. */
const SIGN_IN_PROBLEMS: ProblemKeys = {
  validation_failed: 'signIn.problems.checkFields',
  unauthenticated: 'signIn.problems.wrongCredentials',
  rate_limited: 'signIn.problems.tooManySignIns',
  offline: 'signIn.problems.offline',
  internal: 'signIn.problems.internal',
};

/** Sign in with e-mail and password; once signed in, the phone works offline for weeks. */
@Component({
  selector: 'hs-sign-in-page',
  imports: [
    ReactiveFormsModule, RouterLink, MatButtonModule, MatFormFieldModule, MatIconModule, MatInputModule, MatProgressBarModule, TranslocoPipe,
    LanguagePicker,
  ],
  templateUrl: './sign-in-page.html',
  styleUrl: '../../sign-in.scss',
})
export default class SignInPage implements OnInit {
  private readonly api = inject(AuthApi);
  private readonly router = inject(Router);
  private readonly transloco = inject(TranslocoService);
  protected readonly session = inject(AuthSession);

  /** Where to go after signing in (`?returnUrl=`); only addresses inside the app are followed. */
  readonly returnUrl = input<string>();
  /** An address to fill in, e.g. after choosing a password (`?email=`). */
  readonly email = input<string>();

  protected readonly isBusy = signal(false);
  protected readonly problem = signal<string | null>(null);
  protected readonly isPasswordVisible = signal(false);

  protected readonly form = inject(FormBuilder).nonNullable.group({
    email: [this.session.user()?.email ?? '', [Validators.required, Validators.email, Validators.maxLength(254)]],
    password: ['', [Validators.required, Validators.maxLength(200)]],
    deviceName: [this.session.device().name ?? '', [Validators.maxLength(100)]],
  });

  ngOnInit(): void {
    const email = this.email();
    if (email) {
      this.form.controls.email.setValue(email);
    }
  }

  protected async signIn(): Promise<void> {
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    this.isBusy.set(true);
    this.problem.set(null);
    const { email, password, deviceName } = this.form.getRawValue();
    try {
      await this.api.signIn(email.trim(), password, deviceName);
      await this.router.navigateByUrl(safeReturnUrl(this.returnUrl()));
    } catch (error) {
      const problem = toApiProblem(error);
      this.problem.set(problemText(this.transloco, problem, SIGN_IN_PROBLEMS));
      this.form.controls.password.setValue('');
    } finally {
      this.isBusy.set(false);
    }
  }
}
