import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButton } from '@angular/material/button';
import { MatDialogActions, MatDialogClose, MatDialogContent, MatDialogRef, MatDialogTitle } from '@angular/material/dialog';
import { MatError, MatFormField, MatHint, MatLabel } from '@angular/material/form-field';
import { MatInput } from '@angular/material/input';
import { MatOption, MatSelect } from '@angular/material/select';
import { inviteUserBody, type UserSummary } from '../../../shared/admin';
import { SITE_ROLES, type SiteRole } from '../../../shared/roles';
import { apiErrorMessage } from '../core/api-error-message';
import { schemaValidator } from '../core/schema-validator';
import { applyServerErrors } from '../core/server-errors';
import { ValidationMessagePipe } from '../core/validation-message-pipe';
import { AdminApi } from './admin-api';

/** Creates an account and mails its owner a link to set a password; closes with the account. */
@Component({
  selector: 'ef-invite-user-dialog',
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
    MatOption,
    MatSelect,
    ReactiveFormsModule,
    ValidationMessagePipe,
  ],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <h2 mat-dialog-title>Invite user</h2>
    <form [formGroup]="form" (ngSubmit)="invite()" novalidate>
      <mat-dialog-content>
        <mat-form-field>
          <mat-label>E-mail</mat-label>
          <input matInput type="email" formControlName="email" autocomplete="off" required />
          <mat-error>{{ form.controls.email.errors | validationMessage }}</mat-error>
        </mat-form-field>
        <mat-form-field>
          <mat-label>Name</mat-label>
          <input matInput formControlName="displayName" autocomplete="off" required />
          <mat-hint>As colleagues will see it, e.g. on review comments</mat-hint>
          <mat-error>{{ form.controls.displayName.errors | validationMessage }}</mat-error>
        </mat-form-field>
        <mat-form-field>
          <mat-label>Site role</mat-label>
          <mat-select formControlName="siteRole" required>
            @for (role of siteRoles; track role) {
              <mat-option [value]="role">{{ role === 'admin' ? 'Admin' : 'Member' }}</mat-option>
            }
          </mat-select>
          <mat-hint>Members see only the projects they are added to</mat-hint>
          <mat-error>{{ form.controls.siteRole.errors | validationMessage }}</mat-error>
        </mat-form-field>
        @if (formError()) {
          <p class="form-error" role="alert">{{ formError() }}</p>
        }
      </mat-dialog-content>
      <mat-dialog-actions align="end">
        <button mat-button type="button" mat-dialog-close>Cancel</button>
        <button mat-flat-button type="submit" [disabled]="submitting()">Send invitation</button>
      </mat-dialog-actions>
    </form>
  `,
  styles: `
    mat-dialog-content {
      display: flex;
      flex-direction: column;
      gap: 12px;
    }
    mat-form-field:first-child {
      padding-top: 6px;
    }
    .form-error {
      margin: 0;
      padding: 8px 12px;
      border-radius: var(--mat-sys-corner-small);
      background: var(--mat-sys-error-container);
      color: var(--mat-sys-on-error-container);
    }
  `,
})
export class InviteUserDialog {
  private readonly api = inject(AdminApi);
  private readonly dialogRef = inject<MatDialogRef<InviteUserDialog, UserSummary>>(MatDialogRef);
  private readonly fb = inject(NonNullableFormBuilder);

  protected readonly siteRoles = SITE_ROLES;
  protected readonly form = this.fb.group({
    email: ['', [Validators.required, Validators.email]],
    displayName: ['', [Validators.required, schemaValidator(inviteUserBody.shape.displayName)]],
    siteRole: ['member' as SiteRole, Validators.required],
  });
  protected readonly submitting = signal(false);
  protected readonly formError = signal('');

  protected invite(): void {
    if (this.form.invalid || this.submitting()) return;
    const { email, displayName, siteRole } = this.form.getRawValue();
    this.submitting.set(true);
    this.formError.set('');
    this.api.inviteUser({ email: email.trim().toLowerCase(), displayName: displayName.trim(), siteRole }).subscribe({
      next: (user) => this.dialogRef.close(user),
      error: (error) => {
        const failure = apiErrorMessage(error);
        // An address already in use comes back as a conflict; it belongs beside the e-mail.
        if (failure.code === 'conflict' && Object.keys(failure.fieldErrors).length === 0) {
          failure.fieldErrors = { email: failure.message };
        }
        this.formError.set(applyServerErrors(this.form, failure));
        this.submitting.set(false);
      },
    });
  }
}
