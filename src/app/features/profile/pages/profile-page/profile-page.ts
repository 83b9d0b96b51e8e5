import { Component, OnInit, inject, signal } from '@angular/core';
import { FormControl, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { Router, RouterLink } from '@angular/router';
import { TranslocoPipe, TranslocoService } from '@jsverse/transloco';
import { AuthApi } from '../../../../core/auth/auth-api';
import { AuthSession } from '../../../../core/auth/auth-session';
import { ROLE_LABELS } from '../../../../core/auth/role-labels';
import { toApiProblem } from '../../../../core/http/api-error';
import { LanguagePicker } from '../../../../i18n/language-picker/language-picker';
import { problemText, type ProblemKeys } from '../../../sign-in/problem-text';

/** Why the server did not take the new device name; other refusals keep the server's words. */
const RENAME_PROBLEMS: ProblemKeys = {
  offline: 'profile.problems.offline',
  // The sign-in has no device, or the device now belongs to someone else: both mend by signing in here.
  conflict: 'profile.problems.signInHere',
  unauthenticated: 'profile.problems.signIn',
  token_expired: 'profile.problems.signIn',
  internal: 'profile.problems.internal',
};

/** Who is signed in on this device, its name, and signing out. Works offline from the cached profile. */
@Component({
  selector: 'hs-profile-page',
  imports: [ReactiveFormsModule, RouterLink, MatButtonModule, MatFormFieldModule, MatIconModule, MatInputModule, TranslocoPipe, LanguagePicker],
  template: `
    @if (session.user(); as user) {
      <section class="hs-page">
        <h1><mat-icon aria-hidden="true">account_circle</mat-icon> {{ user.name }}</h1>
        @if (session.needsSignIn()) {
          <p class="notice" role="status">
            <mat-icon aria-hidden="true">sync_problem</mat-icon>
            <span>{{ 'profile.page.ended' | transloco }}</span>
            <a mat-flat-button routerLink="/sign-in" [queryParams]="{ returnUrl: '/profile' }"><mat-icon>login</mat-icon> {{ 'profile.page.signInAgain' | transloco }}</a>
          </p>
        }
        <dl class="facts">
          <dt><mat-icon aria-hidden="true">mail</mat-icon> {{ 'profile.page.email' | transloco }}</dt><dd>{{ user.email }}</dd>
          <dt><mat-icon aria-hidden="true">{{ roleLabels[user.role].icon }}</mat-icon> {{ 'profile.page.role' | transloco }}</dt><dd>{{ roleLabels[user.role].label | transloco }}</dd>
          @if (user.labName) { <dt><mat-icon aria-hidden="true">science</mat-icon> {{ 'profile.page.laboratory' | transloco }}</dt><dd>{{ user.labName }}</dd> }
          <dt><mat-icon aria-hidden="true">location_on</mat-icon> {{ 'profile.page.sites' | transloco }}</dt>
          <dd>@for (site of user.sites; track site.id) { <span class="chip">{{ site.code }} · {{ site.name }}</span> } @empty { {{ 'profile.page.noSites' | transloco }} }</dd>
        </dl>

        <h2><mat-icon aria-hidden="true">translate</mat-icon> {{ 'profile.language.title' | transloco }}</h2>
        <div class="language">
          <hs-language-picker />
          <span class="hs-muted">{{ 'profile.language.hint' | transloco }}</span>
        </div>

        <h2><mat-icon aria-hidden="true">smartphone</mat-icon> {{ 'profile.device.title' | transloco }}</h2>
        <form class="device" (submit)="$event.preventDefault(); renameDevice()">
          <mat-form-field appearance="outline">
            <mat-label>{{ 'profile.device.name' | transloco }}</mat-label>
            <input matInput [formControl]="deviceName" maxlength="100">
            <mat-hint>{{ 'profile.device.hint' | transloco }}</mat-hint>
          </mat-form-field>
          <button mat-stroked-button type="submit" [disabled]="isBusy()"><mat-icon>save</mat-icon> {{ 'profile.device.save' | transloco }}</button>
        </form>
        @if (message(); as message) { <p role="status">{{ message }}</p> }

        <h2><mat-icon aria-hidden="true">logout</mat-icon> {{ 'profile.signOut.title' | transloco }}</h2>
        <p class="hs-muted">{{ 'profile.signOut.note' | transloco }}</p>
        <button mat-flat-button type="button" (click)="signOut()"><mat-icon>logout</mat-icon> {{ 'profile.signOut.button' | transloco }}</button>
      </section>
    }
  `,
  styles: `
    .facts { display: grid; grid-template-columns: max-content 1fr; gap: 8px 16px; align-items: center; }
    dt { display: flex; align-items: center; gap: 6px; font: var(--mat-sys-title-small); }
    dd { margin: 0; overflow-wrap: anywhere; }
    .chip { display: inline-block; padding: 4px 10px; margin: 2px; border-radius: 16px; background: var(--mat-sys-secondary-container); color: var(--mat-sys-on-secondary-container); }
    .device { display: flex; flex-wrap: wrap; align-items: flex-start; gap: 12px; }
    .device mat-form-field { flex: 1 1 220px; }
    .notice { display: flex; flex-wrap: wrap; align-items: center; gap: 8px; padding: 12px; border-radius: 12px;
      background: var(--mat-sys-tertiary-container); color: var(--mat-sys-on-tertiary-container); }
    h2 { display: flex; align-items: center; gap: 8px; }
    .language { display: flex; flex-wrap: wrap; align-items: center; gap: 8px; }
    @media (max-width: 400px) { .facts { grid-template-columns: 1fr; } }
  `,
})
export default class ProfilePage implements OnInit {
  protected readonly session = inject(AuthSession);
  private readonly api = inject(AuthApi);
  private readonly router = inject(Router);
  private readonly transloco = inject(TranslocoService);
  protected readonly roleLabels = ROLE_LABELS;
  protected readonly isBusy = signal(false);
  protected readonly message = signal<string | null>(null);
  protected readonly deviceName = new FormControl(this.session.user()?.deviceName ?? this.session.device().name ?? '', {
    nonNullable: true, validators: [Validators.required, Validators.maxLength(100)],
  });

  async ngOnInit(): Promise<void> {
    // Online, pick up changes an admin made; offline, the cached profile stands.
    await this.api.reloadProfile().catch(() => null);
  }

  protected async renameDevice(): Promise<void> {
    const name = this.deviceName.value.trim();
    if (!name) {
      return;
    }
    this.isBusy.set(true);
    try {
      await this.api.renameDevice(name);
      this.message.set(this.transloco.translate('profile.device.saved'));
    } catch (error) {
      this.session.nameDevice(name);
      this.message.set(this.transloco.translate('profile.device.keptHere', { reason: problemText(this.transloco, toApiProblem(error), RENAME_PROBLEMS) }));
    } finally {
      this.isBusy.set(false);
    }
  }

  protected async signOut(): Promise<void> {
    await this.api.signOut();
    await this.router.navigateByUrl('/sign-in');
  }
}
