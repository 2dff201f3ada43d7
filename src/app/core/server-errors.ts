import { FormGroup } from '@angular/forms';
import { ApiErrorMessage } from './api-error-message';

/**
 * Puts the server's per-field messages beside their fields (as a `server`
 * error, cleared by the next edit) and returns what is left to show under
 * the form: '' when every problem already sits beside its field.
 */
export function applyServerErrors(form: FormGroup, failure: ApiErrorMessage): string {
  const leftOver: string[] = [];
  for (const [key, message] of Object.entries(failure.fieldErrors)) {
    const control = key === '' ? null : form.get(key);
    if (control) {
      control.setErrors({ ...control.errors, server: message });
      control.markAsTouched();
    } else {
      leftOver.push(message);
    }
  }
  const placedAll = Object.keys(failure.fieldErrors).length > 0 && leftOver.length === 0;
  if (placedAll) return '';
  return leftOver.length > 0 ? `${failure.message} ${leftOver.join(' ')}` : failure.message;
}
