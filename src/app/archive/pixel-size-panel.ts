import { ChangeDetectionStrategy, Component, computed, inject, input, output, signal } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule } from '@angular/forms';
import { MatButton } from '@angular/material/button';
import { MatError, MatFormField, MatHint, MatLabel, MatSuffix } from '@angular/material/form-field';
import { MatIcon } from '@angular/material/icon';
import { MatInput } from '@angular/material/input';
import type { ImageRecord } from '../../../shared/images';
import { PIXEL_SIZE_SOURCE_LABELS } from '../../../shared/pixel-size';
import { apiErrorMessage } from '../core/api-error-message';
import { ValidationMessagePipe } from '../core/validation-message-pipe';
import { numberWithin } from './field-validators';
import { fieldProblems, formErrorText, placeFieldErrors } from './form-errors';
import { ImageApi, type ImageChange } from './image-api';
import { fieldOfView, formatPixelSizeXY } from './image-display';

const positive = () => new FormControl<number | null>(null, numberWithin({ above: 0, max: 1_000_000 }, 'A pixel size must be above 0 µm/px.'));

/** The image's scale: value, where it came from, whether a person confirmed it; confirm it or enter a calibrated one. */
@Component({
  selector: 'ef-pixel-size-panel',
  imports: [MatButton, MatError, MatFormField, MatHint, MatIcon, MatInput, MatLabel, MatSuffix, ReactiveFormsModule, ValidationMessagePipe],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './pixel-size-panel.html',
  styleUrl: './pixel-size-panel.scss',
})
export class PixelSizePanel {
  private readonly api = inject(ImageApi);

  readonly image = input.required<ImageRecord>();
  readonly canEdit = input(false);
  readonly saved = output<ImageRecord>();

  protected readonly value = computed(() => formatPixelSizeXY(this.image().pixelSize.xUm, this.image().pixelSize.yUm));
  protected readonly calibrated = computed(() => this.image().pixelSize.xUm !== null);
  protected readonly sourceLabel = computed(() => PIXEL_SIZE_SOURCE_LABELS[this.image().pixelSize.source]);
  protected readonly field = computed(() => {
    const i = this.image();
    return fieldOfView(i.width, i.height, i.pixelSize.xUm, i.pixelSize.yUm);
  });
  protected readonly canConfirm = computed(() => this.canEdit() && this.calibrated() && !this.image().pixelSize.confirmed);
  protected readonly form = new FormGroup({ pixelSizeUm: positive(), pixelSizeYUm: positive() });
  protected readonly busy = signal(false);
  protected readonly formError = signal('');

  protected confirm(): void {
    this.send({ confirmPixelSize: true });
  }

  protected override(): void {
    this.form.markAllAsTouched();
    const { pixelSizeUm, pixelSizeYUm } = this.form.getRawValue();
    // Required only when saving: the panel also serves to confirm without typing anything.
    if (pixelSizeUm === null) this.form.controls.pixelSizeUm.setErrors({ required: true });
    if (this.form.invalid || pixelSizeUm === null) return;
    this.send({ pixelSizeUm, ...(pixelSizeYUm !== null ? { pixelSizeYUm } : {}) });
  }

  private send(change: ImageChange): void {
    if (this.busy()) return;
    this.busy.set(true);
    this.formError.set('');
    this.api.update(this.image().projectId, this.image().id, change).subscribe({
      next: (saved) => {
        this.busy.set(false);
        this.form.reset();
        this.saved.emit(saved);
      },
      error: (error) => {
        const problems = fieldProblems(error.error);
        this.formError.set(formErrorText(apiErrorMessage(error).message, problems, placeFieldErrors(this.form, problems)));
        this.busy.set(false);
      },
    });
  }
}
