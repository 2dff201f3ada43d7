import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButton } from '@angular/material/button';
import { MatDialogActions, MatDialogClose, MatDialogContent, MatDialogRef, MatDialogTitle } from '@angular/material/dialog';
import { MatError, MatFormField, MatHint, MatLabel } from '@angular/material/form-field';
import { MatInput } from '@angular/material/input';
import { createProjectBody, type ProjectDetail } from '../../../shared/projects';
import { apiErrorMessage } from '../core/api-error-message';
import { schemaValidator } from '../core/schema-validator';
import { applyServerErrors } from '../core/server-errors';
import { ValidationMessagePipe } from '../core/validation-message-pipe';
import { ProjectApi } from './project-api';

const fields = createProjectBody.shape;

/** Codes are stored in capitals; accept what people type and check it the way it will be saved. */
const codeAsSaved = { safeParse: (value: unknown) => fields.code.safeParse(String(value ?? '').toUpperCase()) };

/** Creates a project (the creator becomes its lead); closes with the new project. */
@Component({
  selector: 'ef-new-project-dialog',
  imports: [
    MatButton,
    MatDialogActions,
    MatDialogClose,
    MatDialogContent,
    MatDialogTitle,
    MatError,
    MatFormField,
    MatHint,
    MatInput,
    MatLabel,
    ReactiveFormsModule,
    ValidationMessagePipe,
  ],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './new-project-dialog.html',
  styleUrl: './project-dialogs.scss',
})
export class NewProjectDialog {
  private readonly api = inject(ProjectApi);
  private readonly dialogRef = inject<MatDialogRef<NewProjectDialog, ProjectDetail>>(MatDialogRef);
  private readonly fb = inject(NonNullableFormBuilder);

  protected readonly form = this.fb.group({
    code: ['', [Validators.required, schemaValidator(codeAsSaved)]],
    name: ['', [Validators.required, schemaValidator(fields.name)]],
    description: ['', schemaValidator(fields.description)],
  });
  protected readonly submitting = signal(false);
  protected readonly formError = signal('');

  protected create(): void {
    if (this.form.invalid || this.submitting()) return;
    const { code, name, description } = this.form.getRawValue();
    this.submitting.set(true);
    this.formError.set('');
    this.api.create({ code: code.trim().toUpperCase(), name: name.trim(), description: description.trim() }).subscribe({
      next: (project) => this.dialogRef.close(project),
      error: (error) => {
        const failure = apiErrorMessage(error);
        // A taken code comes back as a conflict without field details; it belongs beside the code.
        if (failure.code === 'conflict' && Object.keys(failure.fieldErrors).length === 0) {
          failure.fieldErrors = { code: failure.message };
        }
        this.formError.set(applyServerErrors(this.form, failure));
        this.submitting.set(false);
      },
    });
  }
}
