import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { AbstractControl, FormArray, FormControl, FormGroup, NonNullableFormBuilder, ReactiveFormsModule, ValidationErrors, Validators } from '@angular/forms';
import { MatAutocomplete, MatAutocompleteTrigger } from '@angular/material/autocomplete';
import { MatButton, MatIconButton } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogActions, MatDialogClose, MatDialogContent, MatDialogRef, MatDialogTitle } from '@angular/material/dialog';
import { MatError, MatFormField, MatHint, MatLabel } from '@angular/material/form-field';
import { MatIcon } from '@angular/material/icon';
import { MatInput } from '@angular/material/input';
import { MatOptgroup, MatOption, MatSelect } from '@angular/material/select';
import { map } from 'rxjs';
import { ELEMENT_SYMBOLS } from '../../../shared/archive/elements';
import { MATERIAL_CLASS_SUGGESTIONS, type Material } from '../../../shared/archive/materials';
import { apiErrorMessage } from '../core/api-error-message';
import { ValidationMessagePipe } from '../core/validation-message-pipe';
import { ArchiveApi } from './archive-api';
import { compositionFromRows, compositionRows, formatSum, listedSum, normaliseSymbol, repeatedElements, sumWarning, symbolProblem, type CompositionRow } from './composition-rows';
import { fieldProblems, formErrorText, placeFieldErrors } from './form-errors';
import { numberWithin } from './field-validators';

export interface MaterialDialogData {
  projectId: string;
  /** null to create a new material. */
  material: Material | null;
}

type RowGroup = FormGroup<{ element: FormControl<string>; wtPct: FormControl<number | null> }>;

/** Base metals offered first in the balance select; every element follows. */
const COMMON_BALANCE = ['Fe', 'Al', 'Ni', 'Ti', 'Cu', 'Co', 'Mg', 'Zr'];

function elementValidator(control: AbstractControl<string>): ValidationErrors | null {
  const problem = symbolProblem(control.value ?? '');
  return problem ? { symbol: problem } : null;
}

/** Creates or edits a material: designation, class, composition in wt.% with the balance element, notes. */
@Component({
  selector: 'ef-material-dialog',
  imports: [
    MatAutocomplete,
    MatAutocompleteTrigger,
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
    MatOptgroup,
    MatOption,
    MatSelect,
    ReactiveFormsModule,
    ValidationMessagePipe,
  ],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './material-dialog.html',
  styleUrl: './archive-dialogs.scss',
})
export class MaterialDialog {
  private readonly api = inject(ArchiveApi);
  private readonly dialogRef = inject<MatDialogRef<MaterialDialog, Material>>(MatDialogRef);
  private readonly fb = inject(NonNullableFormBuilder);

  protected readonly data = inject<MaterialDialogData>(MAT_DIALOG_DATA);
  protected readonly commonBalance = COMMON_BALANCE;
  protected readonly otherBalance = ELEMENT_SYMBOLS.filter((s) => !COMMON_BALANCE.includes(s));
  protected readonly form = this.fb.group({
    designation: [this.data.material?.designation ?? '', [Validators.required, Validators.maxLength(60)]],
    materialClass: [this.data.material?.materialClass ?? '', Validators.maxLength(80)],
    rows: this.fb.array<RowGroup>(compositionRows(this.data.material?.composition ?? { wtPct: {}, balance: null }).map((r) => this.rowGroup(r))),
    balance: [this.data.material?.composition.balance ?? ''],
    notes: [this.data.material?.notes ?? '', Validators.maxLength(4000)],
  });
  protected readonly value = toSignal(this.form.valueChanges.pipe(map(() => this.form.getRawValue())), { initialValue: this.form.getRawValue() });
  protected readonly sum = computed(() => listedSum(this.value().rows));
  protected readonly sumText = computed(() => formatSum(this.sum()));
  protected readonly sumWarning = computed(() => sumWarning(this.sum()));
  protected readonly repeated = computed(() => [...repeatedElements(this.value().rows)]);
  protected readonly balanceListed = computed(() => {
    const balance = this.value().balance;
    return balance !== '' && this.value().rows.some((r) => normaliseSymbol(r.element) === balance);
  });
  protected readonly classSuggestions = computed(() => {
    const typed = this.value().materialClass.trim().toLowerCase();
    return MATERIAL_CLASS_SUGGESTIONS.filter((s) => s.toLowerCase().includes(typed));
  });
  protected readonly submitting = signal(false);
  protected readonly formError = signal('');

  protected get rows(): FormArray<RowGroup> {
    return this.form.controls.rows;
  }

  protected rowName(index: number): string {
    const symbol = normaliseSymbol(this.rows.at(index).controls.element.value);
    return symbol || `row ${index + 1}`;
  }

  protected addRow(): void {
    this.rows.push(this.rowGroup({ element: '', wtPct: null }));
  }

  protected removeRow(index: number): void {
    this.rows.removeAt(index);
  }

  protected save(): void {
    this.form.markAllAsTouched();
    if (this.form.invalid || this.repeated().length > 0 || this.balanceListed() || this.submitting()) return;
    const v = this.form.getRawValue();
    const body = {
      designation: v.designation.trim(),
      materialClass: v.materialClass.trim(),
      composition: compositionFromRows(v.rows, v.balance),
      notes: v.notes.trim(),
    };
    const material = this.data.material;
    const request = material
      ? this.api.updateMaterial(this.data.projectId, material.id, body)
      : this.api.createMaterial(this.data.projectId, body);
    this.submitting.set(true);
    this.formError.set('');
    request.subscribe({
      next: (saved) => this.dialogRef.close(saved),
      error: (error) => {
        this.showFailure(error);
        this.submitting.set(false);
      },
    });
  }

  private showFailure(error: { status: number; error: unknown }): void {
    const failure = apiErrorMessage(error);
    const problems = fieldProblems(error.error);
    // The server names composition entries by symbol; the form has rows.
    const rename: Record<string, string> = { 'composition.balance': 'balance' };
    this.rows.controls.forEach((row, i) => {
      const symbol = normaliseSymbol(row.controls.element.value);
      rename[`composition.wtPct.${symbol}`] = `rows.${i}.wtPct`;
    });
    const leftOver = placeFieldErrors(this.form, problems, rename);
    this.formError.set(formErrorText(failure.message, problems, leftOver));
  }

  private rowGroup(row: CompositionRow): RowGroup {
    return this.fb.group({
      element: this.fb.control(row.element, [Validators.required, elementValidator]),
      wtPct: new FormControl<number | null>(row.wtPct, [Validators.required, numberWithin({ min: 0, max: 100 }, 'Enter 0 to 100 wt.%.')]),
    });
  }
}
