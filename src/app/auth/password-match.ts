import { AbstractControl, FormGroupDirective, NgForm, ValidationErrors, ValidatorFn } from '@angular/forms';
import { ErrorStateMatcher } from '@angular/material/core';

/** Group validator: `{ mismatch: true }` when the two named fields differ. */
export function passwordsMatch(field: string, confirmField: string): ValidatorFn {
  return (group: AbstractControl): ValidationErrors | null => {
    const confirm = group.get(confirmField)?.value;
    return confirm && group.get(field)?.value !== confirm ? { mismatch: true } : null;
  };
}

/** Shows the confirmation field in error when the group reports a mismatch. */
export class ConfirmMatcher implements ErrorStateMatcher {
  isErrorState(control: AbstractControl | null, form: FormGroupDirective | NgForm | null): boolean {
    if (!control) return false;
    const shown = control.touched || !!form?.submitted;
    return shown && (control.invalid || !!form?.hasError('mismatch'));
  }
}
