import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButton } from '@angular/material/button';
import { MatCard, MatCardContent, MatCardHeader, MatCardTitle } from '@angular/material/card';
import { MatError, MatFormField, MatLabel } from '@angular/material/form-field';
import { MatInput } from '@angular/material/input';
import { RouterLink } from '@angular/router';
import { apiErrorMessage } from '../core/api-error-message';
import { applyServerErrors } from '../core/server-errors';
import { ValidationMessagePipe } from '../core/validation-message-pipe';
import { AuthApi } from './auth-api';
import { AuthFrame } from './auth-frame';

@Component({
  selector: 'ef-forgot-password',
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
    ReactiveFormsModule,
    RouterLink,
    ValidationMessagePipe,
  ],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <ef-auth-frame>
      <mat-card appearance="outlined">
        <mat-card-header>
          <mat-card-title><h1>Forgot password</h1></mat-card-title>
        </mat-card-header>
        <mat-card-content>
          @if (sent()) {
            <p class="notice" role="status">If an account exists for that address, a link is on its way.</p>
            <p class="hint">The link works once and expires after a while. Check the spam folder if nothing arrives.</p>
            <div class="actions">
              <a routerLink="/sign-in">Back to sign-in</a>
            </div>
          } @else {
            <p class="hint">Enter the address you sign in with; we will e-mail a link to set a new password.</p>
            <form [formGroup]="form" (ngSubmit)="requestLink()" novalidate>
              <mat-form-field>
                <mat-label>E-mail</mat-label>
                <input matInput type="email" formControlName="email" autocomplete="email" required />
                <mat-error>{{ form.controls.email.errors | validationMessage }}</mat-error>
              </mat-form-field>
              @if (formError()) {
                <p class="form-error" role="alert">{{ formError() }}</p>
              }
              <div class="actions">
                <a routerLink="/sign-in">Back to sign-in</a>
                <button mat-flat-button type="submit" [disabled]="submitting()">Send reset link</button>
              </div>
            </form>
          }
        </mat-card-content>
      </mat-card>
    </ef-auth-frame>
  `,
  styleUrl: './auth-forms.scss',
})
export default class ForgotPassword {
  private readonly api = inject(AuthApi);
  private readonly fb = inject(NonNullableFormBuilder);

  protected readonly form = this.fb.group({ email: ['', [Validators.required, Validators.email]] });
  protected readonly submitting = signal(false);
  protected readonly sent = signal(false);
  protected readonly formError = signal('');

  protected requestLink(): void {
    if (this.form.invalid || this.submitting()) return;
    this.submitting.set(true);
    this.formError.set('');
    this.api.requestReset(this.form.getRawValue()).subscribe({
      next: () => {
        this.sent.set(true);
        this.submitting.set(false);
      },
      error: (error) => {
        // Only a malformed address or throttling gets here; the server never reveals whether an account exists.
        this.formError.set(applyServerErrors(this.form, apiErrorMessage(error)));
        this.submitting.set(false);
      },
    });
  }
}
