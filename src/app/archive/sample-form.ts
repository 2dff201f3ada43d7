import { computed, DestroyRef, inject, signal, type Signal } from '@angular/core';
import { takeUntilDestroyed, toObservable } from '@angular/core/rxjs-interop';
import { AbstractControl, FormArray, FormControl, FormGroup, ValidationErrors, ValidatorFn, Validators } from '@angular/forms';
import { switchMap } from 'rxjs';
import type { StepType } from '../../../shared/archive/process-route';
import { numberWithin } from './field-validators';
import { isParamRequired, type LayerFormValue, type ParamField, type StepFormValue } from './sample-form-model';

/** Reactive-form controls of the sample editor: one group per stack layer and per process step. */

export type LayerGroup = FormGroup<{ materialId: FormControl<string>; thicknessMm: FormControl<number | null> }>;

export type StepGroup = FormGroup<{
  id: FormControl<string | null>;
  type: FormControl<StepType>;
  date: FormControl<string>;
  reductionPct: FormControl<number | null>;
  pieces: FormControl<number | null>;
  temperatureC: FormControl<number | null>;
  timeMin: FormControl<number | null>;
  atmosphere: FormControl<string>;
  details: FormControl<string>;
  notes: FormControl<string>;
}>;

const NEEDED: Partial<Record<ParamField, string>> = {
  reductionPct: 'A rolling pass needs its thickness reduction in %.',
  temperatureC: 'An anneal needs its temperature in °C.',
  timeMin: 'An anneal needs its time in min.',
};

/** Required only for the step types that need the parameter (rolling passes, anneals), with the server's words. */
function neededForType(field: ParamField): ValidatorFn {
  return (control: AbstractControl): ValidationErrors | null => {
    const type = control.parent?.get('type')?.value as StepType | undefined;
    if (!type || !isParamRequired(type, field)) return null;
    const v = control.value as unknown;
    return v === null || v === '' || v === undefined ? { needed: NEEDED[field] ?? 'Required.' } : null;
  };
}

export function layerGroup(value: LayerFormValue): LayerGroup {
  return new FormGroup({
    materialId: new FormControl(value.materialId, { nonNullable: true, validators: [Validators.required] }),
    thicknessMm: new FormControl<number | null>(value.thicknessMm, [
      Validators.required,
      numberWithin({ above: 0, max: 1000 }, 'A thickness must be above 0 mm and at most 1000 mm.'),
    ]),
  });
}

export function stepGroup(value: StepFormValue): StepGroup {
  const text = (v: string, max: number) => new FormControl(v, { nonNullable: true, validators: [Validators.maxLength(max)] });
  const group: StepGroup = new FormGroup({
    id: new FormControl<string | null>(value.id),
    type: new FormControl<StepType>(value.type, { nonNullable: true, validators: [Validators.required] }),
    date: new FormControl(value.date, { nonNullable: true }),
    reductionPct: new FormControl<number | null>(value.reductionPct, [
      neededForType('reductionPct'),
      numberWithin({ above: 0, below: 100 }, 'A reduction must be above 0 % and below 100 %.'),
    ]),
    pieces: new FormControl<number | null>(value.pieces, numberWithin({ min: 2, max: 64, integer: true }, 'Stack 2 to 64 pieces (a whole number).')),
    temperatureC: new FormControl<number | null>(value.temperatureC, [
      neededForType('temperatureC'),
      numberWithin({ min: -273.15, max: 3000 }, 'Use -273.15 to 3000 °C.'),
    ]),
    timeMin: new FormControl<number | null>(value.timeMin, [
      neededForType('timeMin'),
      numberWithin({ above: 0, max: 1e6 }, 'A time must be above 0 min.'),
    ]),
    atmosphere: text(value.atmosphere, 100),
    details: text(value.details, 1000),
    notes: text(value.notes, 2000),
  });
  // Which parameters are required depends on the type: check them again when it changes.
  group.controls.type.valueChanges.subscribe(() => {
    for (const field of ['reductionPct', 'temperatureC', 'timeMin'] as const) group.controls[field].updateValueAndValidity();
  });
  return group;
}

/** Moves a control within its array (for "move up/down" buttons); out-of-range moves do nothing. */
export function moveControl(array: FormArray, from: number, to: number): void {
  if (to < 0 || to >= array.length || from === to) return;
  const control = array.at(from);
  array.removeAt(from, { emitEvent: false });
  array.insert(to, control);
}

/**
 * A counter that ticks on every event of the array (values, status, touched,
 * errors the server set): OnPush editors read it so they redraw when a
 * parent changes the array's state. Call in an injection context.
 */
export function formRevision(array: Signal<AbstractControl>): Signal<number> {
  const revision = signal(0);
  toObservable(array)
    .pipe(
      switchMap((control) => control.events),
      takeUntilDestroyed(inject(DestroyRef)),
    )
    .subscribe(() => revision.update((n) => n + 1));
  return computed(() => revision());
}
