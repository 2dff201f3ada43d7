import { ChangeDetectionStrategy, Component, inject, signal, viewChild } from '@angular/core';
import { FormGroupDirective, NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButton } from '@angular/material/button';
import { MatCard, MatCardContent, MatCardHeader, MatCardTitle } from '@angular/material/card';
import { MatError, MatFormField, MatHint, MatLabel } from '@angular/material/form-field';
import { MatInput } from '@angular/material/input';
import { apiErrorMessage } from '../core/api-error-message';
import { applyServerErrors } from '../core/server-errors';
import { SessionStore } from '../core/session-store';
import { ValidationMessagePipe } from '../core/validation-message-pipe';
import { NotificationSettings } from '../reviews/notification-settings';
import { AuthApi } from './auth-api';
import { ConfirmMatcher, passwordsMatch } from './password-match';
import { PASSWORD_MAX, PASSWORD_MIN } from '../../../shared/auth-constants';

/** The signed-in user's profile and password. */
@Component({
  selector: 'ef-account',
  imports: [
    MatButton,
    MatCard,
    MatCardContent,
    MatCardHeader,
    MatCardTitle,
    MatError,
    MatFormField,
    MatHint,
    MatInput,
    MatLabel,
    NotificationSettings,
    ReactiveFormsModule,
    ValidationMessagePipe,
  ],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './account.html',
  styleUrl: './account.scss',
})
export default class Account {
  private readonly api = inject(AuthApi);
  private readonly session = inject(SessionStore);
  private readonly fb = inject(NonNullableFormBuilder);

  private readonly formDirective = viewChild.required(FormGroupDirective);

  protected readonly user = this.session.user;
  protected readonly passwordMin = PASSWORD_MIN;
  protected readonly confirmMatcher = new ConfirmMatcher();
  protected readonly form = this.fb.group(
    {
      currentPassword: ['', Validators.required],
      newPassword: ['', [Validators.required, Validators.minLength(PASSWORD_MIN), Validators.maxLength(PASSWORD_MAX)]],
      confirmPassword: ['', Validators.required],
    },
    { validators: passwordsMatch('newPassword', 'confirmPassword') },
  );
  protected readonly submitting = signal(false);
  protected readonly formError = signal('');
  protected readonly changed = signal(false);

  protected changePassword(): void {
    if (this.form.invalid || this.submitting()) return;
    const { currentPassword, newPassword } = this.form.getRawValue();
    this.submitting.set(true);
    this.formError.set('');
    this.changed.set(false);
    this.api.changePassword({ currentPassword, newPassword }).subscribe({
      next: () => {
        // resetForm (not form.reset) also clears "submitted", so no field shows as missing.
        this.formDirective().resetForm();
        this.changed.set(true);
        this.submitting.set(false);
      },
      error: (error) => {
        const failure = apiErrorMessage(error);
        if (failure.code === 'bad_credentials') {
          failure.fieldErrors = { currentPassword: failure.message, ...failure.fieldErrors };
        }
        this.formError.set(applyServerErrors(this.form, failure));
        this.submitting.set(false);
      },
    });
  }
}
