import { Component, OnInit, inject, signal } from '@angular/core';
import { FormControl, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { Router, RouterLink } from '@angular/router';
import { AuthApi } from '../../../../core/auth/auth-api';
import { AuthSession } from '../../../../core/auth/auth-session';
import { ROLE_LABELS } from '../../../../core/auth/role-labels';
import { toApiProblem } from '../../../../core/http/api-error';

/** Who is signed in on this device, its name, and signing out. Works offline from the cached profile. */
@Component({
  selector: 'hs-profile-page',
  imports: [ReactiveFormsModule, RouterLink, MatButtonModule, MatFormFieldModule, MatIconModule, MatInputModule],
  template: `
    @if (session.user(); as user) {
      <section class="hs-page">
        <h1><mat-icon aria-hidden="true">account_circle</mat-icon> {{ user.name }}</h1>
        @if (session.needsSignIn()) {
          <p class="notice" role="status">
            <mat-icon aria-hidden="true">sync_problem</mat-icon>
            <span>Your sign-in has ended. Keep working; sign in again to sync. Nothing captured is lost.</span>
            <a mat-flat-button routerLink="/sign-in" [queryParams]="{ returnUrl: '/profile' }"><mat-icon>login</mat-icon> Sign in again</a>
          </p>
        }
        <dl class="facts">
          <dt><mat-icon aria-hidden="true">mail</mat-icon> E-mail</dt><dd>{{ user.email }}</dd>
          <dt><mat-icon aria-hidden="true">{{ roleLabels[user.role].icon }}</mat-icon> Role</dt><dd>{{ roleLabels[user.role].label }}</dd>
          @if (user.labName) { <dt><mat-icon aria-hidden="true">science</mat-icon> Laboratory</dt><dd>{{ user.labName }}</dd> }
          <dt><mat-icon aria-hidden="true">location_on</mat-icon> Sites</dt>
          <dd>@for (site of user.sites; track site.id) { <span class="chip">{{ site.code }} · {{ site.name }}</span> } @empty { None }</dd>
        </dl>

        <h2><mat-icon aria-hidden="true">smartphone</mat-icon> This device</h2>
        <form class="device" (ngSubmit)="renameDevice()">
          <mat-form-field appearance="outline">
            <mat-label>Device name</mat-label>
            <input matInput [formControl]="deviceName" maxlength="100">
            <mat-hint>How this phone shows in People &amp; sites</mat-hint>
          </mat-form-field>
          <button mat-stroked-button type="submit" [disabled]="isBusy()"><mat-icon>save</mat-icon> Save name</button>
        </form>
        @if (message(); as message) { <p role="status">{{ message }}</p> }

        <h2><mat-icon aria-hidden="true">logout</mat-icon> Sign out</h2>
        <p class="hs-muted">Records captured on this phone stay on it, queued for the next sync.</p>
        <button mat-flat-button type="button" (click)="signOut()"><mat-icon>logout</mat-icon> Sign out</button>
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
    @media (max-width: 400px) { .facts { grid-template-columns: 1fr; } }
  `,
})
export default class ProfilePage implements OnInit {
  protected readonly session = inject(AuthSession);
  private readonly api = inject(AuthApi);
  private readonly router = inject(Router);
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
      this.message.set('Saved the device name.');
    } catch (error) {
      this.session.nameDevice(name);
      this.message.set(`Kept on this phone; the server will hear it at the next sign-in (${toApiProblem(error).message})`);
    } finally {
      this.isBusy.set(false);
    }
  }

  protected async signOut(): Promise<void> {
    await this.api.signOut();
    await this.router.navigateByUrl('/sign-in');
  }
}
