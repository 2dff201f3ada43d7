import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButton } from '@angular/material/button';
import {
  MAT_DIALOG_DATA,
  MatDialogActions,
  MatDialogClose,
  MatDialogContent,
  MatDialogRef,
  MatDialogTitle,
} from '@angular/material/dialog';
import { MatError, MatFormField, MatLabel } from '@angular/material/form-field';
import { MatInput } from '@angular/material/input';
import { createProjectBody, type ProjectDetail } from '../../../shared/projects';
import { apiErrorMessage } from '../core/api-error-message';
import { schemaValidator } from '../core/schema-validator';
import { applyServerErrors } from '../core/server-errors';
import { ValidationMessagePipe } from '../core/validation-message-pipe';
import { ProjectApi } from './project-api';

/** Name and description follow the same rules as when the project was created. */
const fields = createProjectBody.shape;

/** Renames or re-describes a project; closes with the saved project. The code never changes. */
@Component({
  selector: 'ef-edit-project-dialog',
  imports: [
    MatButton,
    MatDialogActions,
    MatDialogClose,
    MatDialogContent,
    MatDialogTitle,
    MatError,
    MatFormField,
    MatInput,
    MatLabel,
    ReactiveFormsModule,
    ValidationMessagePipe,
  ],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <h2 mat-dialog-title>Edit {{ project.code }}</h2>
    <form [formGroup]="form" (ngSubmit)="save()" novalidate>
      <mat-dialog-content>
        <mat-form-field>
          <mat-label>Name</mat-label>
          <input matInput formControlName="name" autocomplete="off" required />
          <mat-error>{{ form.controls.name.errors | validationMessage }}</mat-error>
        </mat-form-field>
        <mat-form-field>
          <mat-label>Description</mat-label>
          <textarea matInput formControlName="description" rows="5"></textarea>
          <mat-error>{{ form.controls.description.errors | validationMessage }}</mat-error>
        </mat-form-field>
        @if (formError()) {
          <p class="form-error" role="alert">{{ formError() }}</p>
        }
      </mat-dialog-content>
      <mat-dialog-actions align="end">
        <button mat-button type="button" mat-dialog-close>Cancel</button>
        <button mat-flat-button type="submit" [disabled]="submitting()">Save</button>
      </mat-dialog-actions>
    </form>
  `,
  styleUrl: './project-dialogs.scss',
})
export class EditProjectDialog {
  private readonly api = inject(ProjectApi);
  private readonly dialogRef = inject<MatDialogRef<EditProjectDialog, ProjectDetail>>(MatDialogRef);
  private readonly fb = inject(NonNullableFormBuilder);

  protected readonly project = inject<ProjectDetail>(MAT_DIALOG_DATA);
  protected readonly form = this.fb.group({
    name: [this.project.name, [Validators.required, schemaValidator(fields.name)]],
    description: [this.project.description, schemaValidator(fields.description)],
  });
  protected readonly submitting = signal(false);
  protected readonly formError = signal('');

  protected save(): void {
    if (this.form.invalid || this.submitting()) return;
    const { name, description } = this.form.getRawValue();
    this.submitting.set(true);
    this.formError.set('');
    this.api.update(this.project.id, { name: name.trim(), description: description.trim() }).subscribe({
      next: (saved) => this.dialogRef.close(saved),
      error: (error) => {
        this.formError.set(applyServerErrors(this.form, apiErrorMessage(error)));
        this.submitting.set(false);
      },
    });
  }
}
