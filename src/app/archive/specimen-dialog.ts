import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { FormControl, NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButton, MatIconButton } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogActions, MatDialogClose, MatDialogContent, MatDialogRef, MatDialogTitle } from '@angular/material/dialog';
import { MatError, MatFormField, MatHint, MatLabel, MatSuffix } from '@angular/material/form-field';
import { MatIcon } from '@angular/material/icon';
import { MatInput } from '@angular/material/input';
import { MatOption, MatSelect } from '@angular/material/select';
import { map } from 'rxjs';
import type { ProcessStep } from '../../../shared/archive/process-route';
import { SECTION_PLANE_LABELS, SECTION_PLANES, type SectionPlane, type Specimen } from '../../../shared/archive/specimens';
import { apiErrorMessage } from '../core/api-error-message';
import { ValidationMessagePipe } from '../core/validation-message-pipe';
import { ArchiveApi, type SpecimenBody } from './archive-api';
import { EtchantCaution } from './etchant-caution';
import { fieldProblems, formErrorText, placeFieldErrors } from './form-errors';
import { CODE_MESSAGE, CODE_PATTERN, numberWithin, textMatching } from './field-validators';
import { afterStepLabel } from './timeline-rows';

export interface SpecimenDialogData {
  projectId: string;
  sampleId: string;
  /** The sample's route, for "cut after which step". */
  route: readonly ProcessStep[];
  /** null to create a new specimen. */
  specimen: Specimen | null;
}

/** Records a specimen cut from a sample (or edits one): when it was cut, the section plane, preparation and etchant. */
@Component({
  selector: 'ef-specimen-dialog',
  imports: [
    EtchantCaution,
    MatButton,
    MatDialogActions,
    MatDialogClose,
    MatDialogContent,
    MatDialogTitle,
    MatError,
    MatFormField,
    MatHint,
    MatIcon,
    MatIconButton,
    MatInput,
    MatLabel,
    MatOption,
    MatSelect,
    MatSuffix,
    ReactiveFormsModule,
    ValidationMessagePipe,
  ],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './specimen-dialog.html',
  styleUrl: './archive-dialogs.scss',
})
export class SpecimenDialog {
  private readonly api = inject(ArchiveApi);
  private readonly dialogRef = inject<MatDialogRef<SpecimenDialog, Specimen>>(MatDialogRef);
  private readonly fb = inject(NonNullableFormBuilder);

  protected readonly data = inject<SpecimenDialogData>(MAT_DIALOG_DATA);
  protected readonly planes = SECTION_PLANES.map((value) => ({ value, label: SECTION_PLANE_LABELS[value] }));
  protected readonly stepOptions = this.data.route.map((step) => ({ id: step.id, label: afterStepLabel(this.data.route, step.id) }));
  protected readonly initialLabel = afterStepLabel([], null);
  private readonly initial = this.data.specimen;
  protected readonly form = this.fb.group({
    code: [this.initial?.code ?? '', [Validators.required, textMatching(CODE_PATTERN, CODE_MESSAGE)]],
    afterStepId: new FormControl<string | null>(this.initial ? this.initial.afterStepId : (this.data.route.at(-1)?.id ?? null)),
    sectionPlane: [this.initial?.sectionPlane ?? ('longitudinal' as SectionPlane), Validators.required],
    preparation: this.fb.group({
      steps: this.fb.array((this.initial?.preparation.steps ?? []).map((line) => this.lineControl(line))),
      etchant: [this.initial?.preparation.etchant ?? '', Validators.maxLength(200)],
      etchingTimeS: new FormControl<number | null>(this.initial?.preparation.etchingTimeS ?? null, numberWithin({ above: 0, max: 86_400 }, 'An etching time must be above 0 s (at most 86 400 s).')),
    }),
    notes: [this.initial?.notes ?? '', Validators.maxLength(4000)],
  });
  private readonly etchant = toSignal(this.form.controls.preparation.controls.etchant.valueChanges.pipe(map((v) => v.trim())), {
    initialValue: this.form.controls.preparation.controls.etchant.value.trim(),
  });
  protected readonly etched = computed(() => this.etchant() !== '');
  protected readonly shownEtchant = this.etchant;
  protected readonly submitting = signal(false);
  protected readonly formError = signal('');

  protected get lines() {
    return this.form.controls.preparation.controls.steps;
  }

  protected addLine(): void {
    this.lines.push(this.lineControl(''));
  }

  protected removeLine(index: number): void {
    this.lines.removeAt(index);
  }

  protected save(): void {
    this.form.markAllAsTouched();
    if (this.form.invalid || this.submitting()) return;
    const v = this.form.getRawValue();
    const body: SpecimenBody = {
      code: v.code.trim(),
      afterStepId: v.afterStepId,
      sectionPlane: v.sectionPlane,
      preparation: {
        steps: v.preparation.steps.map((line) => line.trim()).filter(Boolean),
        etchant: v.preparation.etchant.trim(),
        etchingTimeS: v.preparation.etchingTimeS,
      },
      notes: v.notes.trim(),
    };
    const specimen = this.data.specimen;
    const request = specimen
      ? this.api.updateSpecimen(this.data.projectId, specimen.id, body)
      : this.api.createSpecimen(this.data.projectId, { ...body, sampleId: this.data.sampleId });
    this.submitting.set(true);
    this.formError.set('');
    request.subscribe({
      next: (saved) => this.dialogRef.close(saved),
      error: (error) => {
        const problems = fieldProblems(error.error);
        const leftOver = placeFieldErrors(this.form, problems);
        this.formError.set(formErrorText(apiErrorMessage(error).message, problems, leftOver));
        this.submitting.set(false);
      },
    });
  }

  private lineControl(text: string): FormControl<string> {
    return this.fb.control(text, [Validators.required, Validators.maxLength(200)]);
  }
}
