import { ChangeDetectionStrategy, Component, computed, inject, input, output, signal } from '@angular/core';
import { FormControl, FormGroupDirective, NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButton, MatIconButton } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatError, MatFormField, MatLabel, MatSuffix } from '@angular/material/form-field';
import { MatIcon } from '@angular/material/icon';
import { MatInput } from '@angular/material/input';
import { MatTooltip } from '@angular/material/tooltip';
import type { Location } from '../../../shared/archive/specimens';
import { apiErrorMessage } from '../core/api-error-message';
import { askToConfirm } from '../core/confirm-dialog';
import { ValidationMessagePipe } from '../core/validation-message-pipe';
import { ArchiveApi } from './archive-api';
import { numberWithin } from './field-validators';
import { fieldProblems, formErrorText, placeFieldErrors } from './form-errors';
import { formatPosition } from './quantities';

const position = () => new FormControl<number | null>(null, numberWithin({ min: -10_000, max: 10_000 }, 'Use -10 000 to 10 000 mm.'));

/** The named places on a specimen where images are taken: add, rename (and move), delete. */
@Component({
  selector: 'ef-location-list',
  imports: [MatButton, MatError, MatFormField, MatIcon, MatIconButton, MatInput, MatLabel, MatSuffix, MatTooltip, ReactiveFormsModule, ValidationMessagePipe],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './location-list.html',
  styleUrl: './location-list.scss',
})
export class LocationList {
  private readonly api = inject(ArchiveApi);
  private readonly dialog = inject(MatDialog);
  private readonly fb = inject(NonNullableFormBuilder);

  readonly projectId = input.required<string>();
  readonly specimenId = input.required<string>();
  readonly locations = input.required<readonly Location[]>();
  readonly canEdit = input(false);
  readonly canDelete = input(false);
  /** After any saved change; the page reloads the specimen. */
  readonly changed = output<void>();

  protected readonly rows = computed(() =>
    this.locations().map((l) => ({
      ...l,
      summary: [formatPosition(l.xMm, l.yMm), `${l.imageCount} ${l.imageCount === 1 ? 'image' : 'images'}`].filter(Boolean).join(' · '),
    })),
  );
  protected readonly addForm = this.fb.group({ name: ['', [Validators.required, Validators.maxLength(120)]], xMm: position(), yMm: position() });
  protected readonly editForm = this.fb.group({ name: ['', [Validators.required, Validators.maxLength(120)]], xMm: position(), yMm: position() });
  protected readonly editingId = signal<string | null>(null);
  protected readonly busyId = signal<string | null>(null);
  protected readonly adding = signal(false);
  protected readonly addError = signal('');
  protected readonly listError = signal('');

  protected addLocation(formDirective: FormGroupDirective): void {
    if (this.addForm.invalid || this.adding()) return;
    const v = this.addForm.getRawValue();
    this.adding.set(true);
    this.addError.set('');
    this.api.addLocation(this.projectId(), this.specimenId(), { name: v.name.trim(), xMm: v.xMm, yMm: v.yMm }).subscribe({
      next: () => {
        formDirective.resetForm({ name: '', xMm: null, yMm: null });
        this.adding.set(false);
        this.changed.emit();
      },
      error: (error) => {
        const problems = fieldProblems(error.error);
        this.addError.set(formErrorText(apiErrorMessage(error).message, problems, placeFieldErrors(this.addForm, problems)));
        this.adding.set(false);
      },
    });
  }

  protected startEditing(location: Location): void {
    this.editForm.reset({ name: location.name, xMm: location.xMm, yMm: location.yMm });
    this.listError.set('');
    this.editingId.set(location.id);
  }

  protected stopEditing(): void {
    this.editingId.set(null);
  }

  protected saveLocation(location: Location): void {
    if (this.editForm.invalid || this.busyId()) return;
    const v = this.editForm.getRawValue();
    this.busyId.set(location.id);
    this.listError.set('');
    this.api.updateLocation(this.projectId(), this.specimenId(), location.id, { name: v.name.trim(), xMm: v.xMm, yMm: v.yMm }).subscribe({
      next: () => {
        this.busyId.set(null);
        this.editingId.set(null);
        this.changed.emit();
      },
      error: (error) => {
        const problems = fieldProblems(error.error);
        this.listError.set(formErrorText(apiErrorMessage(error).message, problems, placeFieldErrors(this.editForm, problems)));
        this.busyId.set(null);
      },
    });
  }

  protected deleteLocation(location: Location): void {
    askToConfirm(this.dialog, {
      title: `Delete location “${location.name}”?`,
      message: 'The location is removed from this specimen. A location with images filed at it cannot be deleted.',
      confirmLabel: 'Delete',
    }).subscribe((confirmed) => {
      if (confirmed) this.sendDeletion(location);
    });
  }

  private sendDeletion(location: Location): void {
    this.busyId.set(location.id);
    this.listError.set('');
    this.api.deleteLocation(this.projectId(), this.specimenId(), location.id).subscribe({
      next: () => {
        this.busyId.set(null);
        this.changed.emit();
      },
      error: (error) => {
        this.listError.set(apiErrorMessage(error).message);
        this.busyId.set(null);
      },
    });
  }
}
