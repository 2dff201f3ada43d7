import { Pipe, PipeTransform } from '@angular/core';
import { ValidationErrors } from '@angular/forms';
import { validationMessage } from './validation-message';

/**
 * `{{ form.controls.email.errors | validationMessage }}` inside a mat-error.
 * Pure pipe: forms replace the errors object whenever validity changes.
 */
@Pipe({ name: 'validationMessage' })
export class ValidationMessagePipe implements PipeTransform {
  transform(errors: ValidationErrors | null | undefined): string {
    return validationMessage(errors);
  }
}
