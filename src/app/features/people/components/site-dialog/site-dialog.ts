import { Component, inject, signal } from '@angular/core';
import { FormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { TranslocoPipe, TranslocoService } from '@jsverse/transloco';
import { toApiProblem } from '../../../../core/http/api-error';
import { peopleProblemText } from '../../people-problems';
import { PeopleStore, type SiteRecord } from '../../people.store';

/** Adds a site or edits its code, name and processing point. */
@Component({
  selector: 'hs-site-dialog',
  imports: [ReactiveFormsModule, MatButtonModule, MatDialogModule, MatFormFieldModule, MatIconModule, MatInputModule, TranslocoPipe],
  template: `
    <h2 mat-dialog-title>{{ site ? ('people.siteDialog.editTitle' | transloco: { code: site.code }) : ('people.siteDialog.addTitle' | transloco) }}</h2>
    <mat-dialog-content>
      <form [formGroup]="form" id="site-form" (ngSubmit)="save()" novalidate>
        @if (problem(); as problem) { <p class="problem" role="alert"><mat-icon aria-hidden="true">error</mat-icon>{{ problem }}</p> }
        <div class="row">
          <mat-form-field appearance="outline">
            <mat-label>{{ 'people.sites.code' | transloco }}</mat-label>
            <input matInput formControlName="code" required maxlength="8">
            <mat-hint>{{ 'people.siteDialog.codeHint' | transloco }}</mat-hint>
            @if (form.controls.code.invalid) { <mat-error>{{ 'people.problems.siteCode' | transloco }}</mat-error> }
          </mat-form-field>
          <mat-form-field appearance="outline">
            <mat-label>{{ 'people.sites.name' | transloco }}</mat-label>
            <input matInput formControlName="name" required maxlength="200">
          </mat-form-field>
        </div>
        <p>{{ 'people.siteDialog.processingPoint' | transloco }}</p>
        <div class="row">
          <mat-form-field appearance="outline">
            <mat-label>{{ 'people.siteDialog.latitude' | transloco }}</mat-label>
            <input matInput type="number" formControlName="processingLat" min="-90" max="90" step="any">
          </mat-form-field>
          <mat-form-field appearance="outline">
            <mat-label>{{ 'people.siteDialog.longitude' | transloco }}</mat-label>
            <input matInput type="number" formControlName="processingLon" min="-180" max="180" step="any">
          </mat-form-field>
        </div>
      </form>
    </mat-dialog-content>
    <mat-dialog-actions align="end">
      <button mat-button type="button" mat-dialog-close>{{ 'people.form.cancel' | transloco }}</button>
      <button mat-flat-button type="submit" form="site-form" [disabled]="isBusy()"><mat-icon>save</mat-icon> {{ 'people.form.save' | transloco }}</button>
    </mat-dialog-actions>
  `,
  styleUrl: '../dialog.scss',
})
export class SiteDialog {
  private readonly store = inject(PeopleStore);
  private readonly dialog = inject(MatDialogRef<SiteDialog, SiteRecord>);
  private readonly transloco = inject(TranslocoService);
  protected readonly site = inject<{ site: SiteRecord | null }>(MAT_DIALOG_DATA).site;
  protected readonly isBusy = signal(false);
  protected readonly problem = signal<string | null>(null);
  protected readonly form = inject(FormBuilder).group({
    code: [this.site?.code ?? '', [Validators.required, Validators.pattern(/^[A-Z][A-Z0-9]{1,7}$/)]],
    name: [this.site?.name ?? '', [Validators.required, Validators.maxLength(200)]],
    processingLat: [this.site?.processingLat ?? null as number | null, [Validators.min(-90), Validators.max(90)]],
    processingLon: [this.site?.processingLon ?? null as number | null, [Validators.min(-180), Validators.max(180)]],
  });

  protected async save(): Promise<void> {
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    const value = this.form.getRawValue();
    this.isBusy.set(true);
    this.problem.set(null);
    try {
      const saved = await this.store.saveSite(
        { code: value.code ?? '', name: (value.name ?? '').trim(), processingLat: value.processingLat ?? null, processingLon: value.processingLon ?? null },
        this.site?.id ?? null,
      );
      this.dialog.close(saved);
    } catch (error) {
      this.problem.set(peopleProblemText(
        this.transloco, toApiProblem(error), { conflict: 'people.problems.siteCodeTaken', not_found: 'people.problems.noSuchSite' }, { code: value.code ?? '' },
      ));
    } finally {
      this.isBusy.set(false);
    }
  }
}
