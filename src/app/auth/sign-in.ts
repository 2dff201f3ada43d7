import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButton } from '@angular/material/button';
import { MatCard, MatCardContent, MatCardHeader, MatCardTitle } from '@angular/material/card';
import { MatError, MatFormField, MatLabel } from '@angular/material/form-field';
import { MatInput } from '@angular/material/input';
import { MatProgressBar } from '@angular/material/progress-bar';
import { Router, RouterLink } from '@angular/router';
import type { DemoAccount } from '../../../shared/auth';
import { apiErrorMessage } from '../core/api-error-message';
import { applyServerErrors } from '../core/server-errors';
import { SessionStore } from '../core/session-store';
import { ValidationMessagePipe } from '../core/validation-message-pipe';
import { AuthApi } from './auth-api';
import { AuthFrame } from './auth-frame';
import { safeReturnUrl } from './return-url';

/** Notices other pages send here through `?notice=`. */
const NOTICES: Record<string, string> = {
  'password-set': 'Your password is set. Sign in with it.',
};

@Component({
  selector: 'ef-sign-in',
  imports: [
    AuthFrame,
    MatButton,
    MatCard,
    MatCardContent,
    MatCardHeader,
    MatCardTitle,
    MatError,
    MatFormField,
    MatInput,
    MatLabel,
    MatProgressBar,
    ReactiveFormsModule,
    RouterLink,
    ValidationMessagePipe,
  ],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './sign-in.html',
  styleUrl: './auth-forms.scss',
})
export default class SignIn {
  private readonly api = inject(AuthApi);
  private readonly router = inject(Router);
  private readonly session = inject(SessionStore);
  private readonly fb = inject(NonNullableFormBuilder);

  /** Query parameters, bound by the router. */
  readonly returnUrl = input<string>();
  readonly notice = input<string>();

  protected readonly form = this.fb.group({
    email: ['', [Validators.required, Validators.email]],
    password: ['', Validators.required],
  });
  protected readonly submitting = signal(false);
  protected readonly formError = signal('');
  protected readonly demoAccounts = this.session.demoAccounts;
  protected readonly noticeText = computed(() => NOTICES[this.notice() ?? ''] ?? '');

  protected signIn(): void {
    if (this.form.invalid || this.submitting()) return;
    this.submitting.set(true);
    this.formError.set('');
    this.api.signIn(this.form.getRawValue()).subscribe({
      next: () => {
        this.submitting.set(false);
        void this.router.navigateByUrl(safeReturnUrl(this.returnUrl()));
      },
      error: (error) => {
        this.formError.set(applyServerErrors(this.form, apiErrorMessage(error)));
        this.submitting.set(false);
      },
    });
  }

  /** Local mode only: fills the form so a tester need not type. */
  protected fillIn(account: DemoAccount): void {
    this.form.setValue({ email: account.email, password: account.password });
    this.formError.set('');
  }
}
