import type { AbstractControl, ValidationErrors, ValidatorFn } from '@angular/forms';

/**
 * Number checks whose errors carry the sentence to show, so `validationMessage`
 * prints them as they are. An empty control passes; `Validators.required` says so.
 */
export function numberWithin(rule: { min?: number; max?: number; above?: number; below?: number; integer?: boolean }, message: string): ValidatorFn {
  return (control: AbstractControl): ValidationErrors | null => {
    const v = control.value as number | null | '';
    if (v === null || v === '' || v === undefined) return null;
    const n = Number(v);
    const bad =
      !Number.isFinite(n) ||
      (rule.min !== undefined && n < rule.min) ||
      (rule.max !== undefined && n > rule.max) ||
      (rule.above !== undefined && n <= rule.above) ||
      (rule.below !== undefined && n >= rule.below) ||
      (rule.integer === true && !Number.isInteger(n));
    return bad ? { range: message } : null;
  };
}

/** A text check whose error carries the sentence to show; empty text passes. */
export function textMatching(pattern: RegExp, message: string): ValidatorFn {
  return (control: AbstractControl): ValidationErrors | null => {
    const v = String(control.value ?? '').trim();
    return v === '' || pattern.test(v) ? null : { format: message };
  };
}

/** The code rule samples and specimens share with the server. */
export const CODE_PATTERN = /^[A-Za-z0-9][A-Za-z0-9._-]{0,39}$/;
export const CODE_MESSAGE = 'Use 1-40 letters, digits, dots, hyphens or underscores.';
