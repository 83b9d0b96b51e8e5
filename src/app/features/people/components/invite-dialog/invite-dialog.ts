import { Component, inject, signal } from '@angular/core';
import { FormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { TranslocoPipe, TranslocoService } from '@jsverse/transloco';
import { ROLES, type Role } from '../../../../../../shared/accounts/roles';
import { ROLE_LABELS } from '../../../../core/auth/role-labels';
import { toApiProblem } from '../../../../core/http/api-error';
import { peopleProblemText } from '../../people-problems';
import { PeopleStore, type SentMail, type SiteRecord } from '../../people.store';

/** Invites a person by e-mail with a role and sites; closes with what happened to the e-mail. */
@Component({
  selector: 'hs-invite-dialog',
  imports: [ReactiveFormsModule, MatButtonModule, MatCheckboxModule, MatDialogModule, MatFormFieldModule, MatIconModule, MatInputModule, MatSelectModule, TranslocoPipe],
  template: `
    <h2 mat-dialog-title>{{ 'people.invite.title' | transloco }}</h2>
    <mat-dialog-content>
      <form [formGroup]="form" id="invite-form" (ngSubmit)="invite()" novalidate>
        @if (problem(); as problem) { <p class="problem" role="alert"><mat-icon aria-hidden="true">error</mat-icon>{{ problem }}</p> }
        <mat-form-field appearance="outline">
          <mat-label>{{ 'people.form.email' | transloco }}</mat-label>
          <input matInput type="email" formControlName="email" required>
          @if (form.controls.email.invalid) { <mat-error>{{ 'people.problems.email' | transloco }}</mat-error> }
        </mat-form-field>
        <mat-form-field appearance="outline">
          <mat-label>{{ 'people.form.name' | transloco }}</mat-label>
          <input matInput formControlName="name" required maxlength="200">
          @if (form.controls.name.invalid) { <mat-error>{{ 'people.problems.name' | transloco }}</mat-error> }
        </mat-form-field>
        <mat-form-field appearance="outline">
          <mat-label>{{ 'people.form.role' | transloco }}</mat-label>
          <mat-select formControlName="role">
            @for (role of roles; track role) {
              <mat-option [value]="role"><mat-icon aria-hidden="true">{{ roleLabels[role].icon }}</mat-icon> {{ roleLabels[role].label | transloco }}</mat-option>
            }
          </mat-select>
        </mat-form-field>
        @if (form.controls.role.value === 'lab') {
          <mat-form-field appearance="outline">
            <mat-label>{{ 'people.form.laboratory' | transloco }}</mat-label>
            <input matInput formControlName="labName" maxlength="200">
            <mat-hint>{{ 'people.invite.labHint' | transloco }}</mat-hint>
          </mat-form-field>
        } @else {
          <fieldset class="sites">
            <legend>{{ 'people.form.sites' | transloco }}</legend>
            @for (site of sites; track site.id) {
              <mat-checkbox [checked]="chosenSites().includes(site.id)" (change)="toggleSite(site.id, $event.checked)">
                {{ site.code }} · {{ site.name }}
              </mat-checkbox>
            }
          </fieldset>
        }
      </form>
    </mat-dialog-content>
    <mat-dialog-actions align="end">
      <button mat-button type="button" mat-dialog-close>{{ 'people.form.cancel' | transloco }}</button>
      <button mat-flat-button type="submit" form="invite-form" [disabled]="isBusy()"><mat-icon>send</mat-icon> {{ 'people.invite.send' | transloco }}</button>
    </mat-dialog-actions>
  `,
  styleUrl: '../dialog.scss',
})
export class InviteDialog {
  private readonly store = inject(PeopleStore);
  private readonly dialog = inject(MatDialogRef<InviteDialog, SentMail>);
  private readonly transloco = inject(TranslocoService);
  protected readonly sites = inject<{ sites: readonly SiteRecord[] }>(MAT_DIALOG_DATA).sites;
  protected readonly roles = ROLES;
  protected readonly roleLabels = ROLE_LABELS;
  protected readonly chosenSites = signal<readonly string[]>([]);
  protected readonly isBusy = signal(false);
  protected readonly problem = signal<string | null>(null);
  protected readonly form = inject(FormBuilder).nonNullable.group({
    email: ['', [Validators.required, Validators.email, Validators.maxLength(254)]],
    name: ['', [Validators.required, Validators.maxLength(200)]],
    role: ['sampler' as Role, Validators.required],
    labName: ['', Validators.maxLength(200)],
  });

  protected toggleSite(siteId: string, isChosen: boolean): void {
    this.chosenSites.update((ids) => (isChosen ? [...ids, siteId] : ids.filter((id) => id !== siteId)));
  }

  protected async invite(): Promise<void> {
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    const { email, name, role, labName } = this.form.getRawValue();
    this.isBusy.set(true);
    this.problem.set(null);
    try {
      const { mail } = await this.store.invite({
        email: email.trim(), name: name.trim(), role,
        ...(role === 'lab' ? { labName: labName.trim(), siteIds: [] } : { siteIds: this.chosenSites() }),
      });
      this.dialog.close(mail);
    } catch (error) {
      this.problem.set(peopleProblemText(this.transloco, toApiProblem(error), { conflict: 'people.problems.emailTaken' }));
    } finally {
      this.isBusy.set(false);
    }
  }
}
