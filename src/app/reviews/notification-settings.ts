import { ChangeDetectionStrategy, Component, effect, inject, signal } from '@angular/core';
import { FormControl, ReactiveFormsModule } from '@angular/forms';
import { MatButton } from '@angular/material/button';
import { MatError } from '@angular/material/form-field';
import { MatProgressBar } from '@angular/material/progress-bar';
import { MatRadioButton, MatRadioGroup } from '@angular/material/radio';
import { DELIVERY_MODE_LABELS, DELIVERY_MODES, NOTIFICATION_KIND_LABELS, NOTIFICATION_KINDS, type DeliveryMode } from '../../../shared/notifications';
import { apiErrorMessage } from '../core/api-error-message';
import { remote } from '../core/remote';
import { ReviewApi } from './review-api';
import { deliveryExplanation, digestTime } from './notification-text';

/** How the signed-in person gets review and comment e-mails: each at once, a daily digest, or none. */
@Component({
  selector: 'ef-notification-settings',
  imports: [MatButton, MatError, MatProgressBar, MatRadioButton, MatRadioGroup, ReactiveFormsModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './notification-settings.html',
  styleUrl: './notification-settings.scss',
})
export class NotificationSettings {
  private readonly api = inject(ReviewApi);

  protected readonly settings = remote(() => null, () => this.api.notificationSettings());
  protected readonly modes = DELIVERY_MODES.map((mode) => ({ mode, label: DELIVERY_MODE_LABELS[mode] }));
  protected readonly kinds = NOTIFICATION_KINDS.map((kind) => NOTIFICATION_KIND_LABELS[kind]);
  protected readonly delivery = new FormControl<DeliveryMode>('immediate', { nonNullable: true });
  protected readonly saving = signal(false);
  protected readonly saved = signal('');
  protected readonly saveError = signal('');

  private readonly showLoaded = effect(() => {
    const s = this.settings.value();
    if (s) this.delivery.setValue(s.delivery);
  });

  protected digestText(hourUtc: number): string {
    return digestTime(hourUtc);
  }

  /** A new choice is not saved yet: take the old confirmation away. */
  protected forgetConfirmation(): void {
    this.saved.set('');
  }

  protected save(): void {
    if (this.saving()) return;
    this.saving.set(true);
    this.saved.set('');
    this.saveError.set('');
    this.api.saveNotificationSettings({ delivery: this.delivery.value }).subscribe({
      next: (next) => {
        this.settings.set(next);
        this.saved.set(`Saved. ${deliveryExplanation(next.delivery, next.digestHourUtc)}`);
        this.saving.set(false);
      },
      error: (error) => {
        const failure = apiErrorMessage(error);
        this.saveError.set(failure.fieldErrors['delivery'] ?? failure.message);
        this.saving.set(false);
      },
    });
  }
}
