import { Component, inject, signal } from '@angular/core';
import { FormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { MatSlideToggleModule } from '@angular/material/slide-toggle';
import { TranslocoPipe, TranslocoService } from '@jsverse/transloco';
import { ROLES } from '../../../../../../shared/accounts/roles';
import { ROLE_LABELS } from '../../../../core/auth/role-labels';
import { toApiProblem } from '../../../../core/http/api-error';
import { LOCALE_FORMAT_PIPES } from '../../../../i18n/locale-format.pipes';
import { peopleProblemText } from '../../people-problems';
import type { ProblemKeys } from '../../../sign-in/problem-text';
import { PeopleStore, type Person, type SiteRecord } from '../../people.store';

/** Changes a person's name, role, lab, sites, or disables them. */
@Component({
  selector: 'hs-person-dialog',
  imports: [ReactiveFormsModule, MatButtonModule, MatCheckboxModule, MatDialogModule, MatFormFieldModule, MatIconModule, MatInputModule, MatSelectModule, MatSlideToggleModule, TranslocoPipe, LOCALE_FORMAT_PIPES],
  template: `
    <h2 mat-dialog-title>{{ person.name }}</h2>
    <mat-dialog-content>
      <p class="hs-muted">{{ person.email }}</p>
      <form [formGroup]="form" id="person-form" (ngSubmit)="save()" novalidate>
        @if (problem(); as problem) { <p class="problem" role="alert"><mat-icon aria-hidden="true">error</mat-icon>{{ problem }}</p> }
        <mat-form-field appearance="outline">
          <mat-label>{{ 'people.form.name' | transloco }}</mat-label>
          <input matInput formControlName="name" required maxlength="200">
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
          </mat-form-field>
        }
        <fieldset class="sites">
          <legend>{{ 'people.form.sites' | transloco }}</legend>
          @for (site of sites; track site.id) {
            <mat-checkbox [checked]="chosenSites().includes(site.id)" (change)="toggleSite(site.id, $event.checked)">
              {{ site.code }} · {{ site.name }}
            </mat-checkbox>
          }
        </fieldset>
        <mat-slide-toggle formControlName="isDisabled">{{ 'people.person.disabled' | transloco }}</mat-slide-toggle>
        @if (person.devices.length > 0) {
          <h3>{{ 'people.person.devices' | transloco }}</h3>
          <ul>
            @for (device of person.devices; track device.id) {
              <li><mat-icon aria-hidden="true" inline>smartphone</mat-icon> {{ 'people.person.device' | transloco: { name: device.name, when: device.lastSyncAt ? (device.lastSyncAt | hsDate: 'd MMM y, HH:mm') : ('people.person.never' | transloco) } }}</li>
            }
          </ul>
        }
      </form>
    </mat-dialog-content>
    <mat-dialog-actions align="end">
      @if (person.status === 'invited') {
        <button mat-stroked-button type="button" (click)="resend()" [disabled]="isBusy()"><mat-icon>forward_to_inbox</mat-icon> {{ 'people.person.resend' | transloco }}</button>
      }
      <button mat-button type="button" mat-dialog-close>{{ 'people.form.cancel' | transloco }}</button>
      <button mat-flat-button type="submit" form="person-form" [disabled]="isBusy()"><mat-icon>save</mat-icon> {{ 'people.form.save' | transloco }}</button>
    </mat-dialog-actions>
  `,
  styleUrl: '../dialog.scss',
})
export class PersonDialog {
  private readonly store = inject(PeopleStore);
  private readonly dialog = inject(MatDialogRef<PersonDialog, string>);
  private readonly transloco = inject(TranslocoService);
  private readonly data = inject<{ person: Person; sites: readonly SiteRecord[] }>(MAT_DIALOG_DATA);
  protected readonly person = this.data.person;
  protected readonly sites = this.data.sites;
  protected readonly roles = ROLES;
  protected readonly roleLabels = ROLE_LABELS;
  protected readonly chosenSites = signal<readonly string[]>(this.person.siteIds);
  protected readonly isBusy = signal(false);
  protected readonly problem = signal<string | null>(null);
  protected readonly form = inject(FormBuilder).nonNullable.group({
    name: [this.person.name, [Validators.required, Validators.maxLength(200)]],
    role: [this.person.role, Validators.required],
    labName: [this.person.labName ?? '', Validators.maxLength(200)],
    isDisabled: [this.person.isDisabled],
  });

  protected toggleSite(siteId: string, isChosen: boolean): void {
    this.chosenSites.update((ids) => (isChosen ? [...ids, siteId] : ids.filter((id) => id !== siteId)));
  }

  protected async save(): Promise<void> {
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    const { name, role, labName, isDisabled } = this.form.getRawValue();
    await this.run({ conflict: 'people.problems.ownAccount', not_found: 'people.problems.noSuchPerson' }, async () => {
      await this.store.update(this.person.id, {
        name: name.trim(), role, labName: role === 'lab' ? labName.trim() || null : null, siteIds: this.chosenSites(), isDisabled,
      });
      this.dialog.close(this.transloco.translate('people.person.saved', { name: name.trim() }));
    });
  }

  protected async resend(): Promise<void> {
    await this.run({ conflict: 'people.problems.alreadyAccepted', not_found: 'people.problems.noSuchPerson' }, async () => {
      const mail = await this.store.resendInvitation(this.person.id);
      this.dialog.close(mail.status === 'sent'
        ? this.transloco.translate('people.person.invitationResent', { email: this.person.email })
        : this.transloco.translate('people.person.mailFailed', { error: mail.errorMessage ?? '' }));
    });
  }

  private async run(problems: ProblemKeys, work: () => Promise<void>): Promise<void> {
    this.isBusy.set(true);
    this.problem.set(null);
    try {
      await work();
    } catch (error) {
      this.problem.set(peopleProblemText(this.transloco, toApiProblem(error), problems));
    } finally {
      this.isBusy.set(false);
    }
  }
}
