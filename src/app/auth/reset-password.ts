import { ChangeDetectionStrategy, Component, inject, input, signal } from '@angular/core';
import { MatProgressBar } from '@angular/material/progress-bar';
import { catchError, map, of } from 'rxjs';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButton } from '@angular/material/button';
import { MatCard, MatCardContent, MatCardHeader, MatCardTitle } from '@angular/material/card';
import { MatError, MatFormField, MatHint, MatLabel } from '@angular/material/form-field';
import { MatInput } from '@angular/material/input';
import { Router, RouterLink } from '@angular/router';
import { apiErrorMessage } from '../core/api-error-message';
import { remote } from '../core/remote';
import { applyServerErrors } from '../core/server-errors';
import { ValidationMessagePipe } from '../core/validation-message-pipe';
import { AuthApi } from './auth-api';
import { AuthFrame } from './auth-frame';
import { ConfirmMatcher, passwordsMatch } from './password-match';
import { PASSWORD_MAX, PASSWORD_MIN } from '../../../shared/auth-constants';

/** Reached from a reset or invitation e-mail: `/reset-password?token=…`. */
@Component({
  selector: 'ef-reset-password',
  imports: [
    AuthFrame,
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
    MatProgressBar,
    ReactiveFormsModule,
    RouterLink,
    ValidationMessagePipe,
  ],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './reset-password.html',
  styleUrl: './auth-forms.scss',
})
export default class ResetPassword {
  private readonly api = inject(AuthApi);
  private readonly router = inject(Router);
  private readonly fb = inject(NonNullableFormBuilder);

  /** Query parameter from the e-mailed link. */
  readonly token = input<string>();

  protected readonly passwordMin = PASSWORD_MIN;
  protected readonly confirmMatcher = new ConfirmMatcher();
  protected readonly form = this.fb.group(
    {
      newPassword: ['', [Validators.required, Validators.minLength(PASSWORD_MIN), Validators.maxLength(PASSWORD_MAX)]],
      confirmPassword: ['', Validators.required],
    },
    { validators: passwordsMatch('newPassword', 'confirmPassword') },
  );
  protected readonly submitting = signal(false);
  protected readonly formError = signal('');
  /** Set when the server refused the link itself (used, expired or unknown). */
  protected readonly linkRefused = signal(false);
  /** Asked as the page opens, so nobody types a new password into a dead link: '' when it works, else why not. */
  protected readonly linkCheck = remote(this.token, (token) =>
    token
      ? this.api.checkReset(token).pipe(
          map(() => ''),
          catchError((error) => of(apiErrorMessage(error).message)),
        )
      : of(''),
  );

  protected setPassword(): void {
    const token = this.token();
    if (!token || this.form.invalid || this.submitting()) return;
    this.submitting.set(true);
    this.formError.set('');
    this.api.completeReset({ token, newPassword: this.form.controls.newPassword.value }).subscribe({
      next: () => {
        this.submitting.set(false);
        void this.router.navigate(['/sign-in'], { queryParams: { notice: 'password-set' } });
      },
      error: (error) => {
        const failure = apiErrorMessage(error);
        this.linkRefused.set(failure.code === 'token_invalid' || 'token' in failure.fieldErrors);
        this.formError.set(applyServerErrors(this.form, failure));
        this.submitting.set(false);
      },
    });
  }
}
