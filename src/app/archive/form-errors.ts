import { isApiErrorBody, type FieldProblem } from '../../../shared/api-error';

/**
 * Places the server's field problems beside the right control of a nested
 * form, keeping list indices (`body.route.2.params.reductionPct` goes to the
 * third step's reduction). Structural types keep it free of Angular.
 */

/** The part of an Angular control this needs. */
export interface ErrorTarget {
  /** Present on groups and arrays, which have no place to show a message. */
  controls?: unknown;
  errors: Record<string, unknown> | null;
  setErrors(errors: Record<string, unknown> | null): void;
  markAsTouched(): void;
}

export interface ControlTree {
  get(path: string): ErrorTarget | null;
}

/** The field problems of a failed response body, or [] when it carries none. */
export function fieldProblems(body: unknown): FieldProblem[] {
  return isApiErrorBody(body) ? (body.error.details ?? []) : [];
}

/**
 * `body.route.2.params.reductionPct` → `route.2.reductionPct`: the form keeps
 * step parameters beside the other step fields. `rename` maps other paths a
 * form lays out differently (e.g. `preparation.etchant` → `etchant`).
 */
export function controlPath(field: string, rename: Readonly<Record<string, string>> = {}): string {
  const parts = field.split('.');
  if (parts[0] === 'body') parts.shift();
  const path = parts.filter((p) => p !== 'params').join('.');
  return rename[path] ?? path;
}

/**
 * Sets each problem as a `server` error on its control (and marks it touched,
 * so it shows at once). Problems about a whole list or group (`body.layers`:
 * "at least one layer") have no field to sit beside; they come back with the
 * others no control took, for a line under the form.
 */
export function placeFieldErrors(form: ControlTree, problems: readonly FieldProblem[], rename: Readonly<Record<string, string>> = {}): string[] {
  const leftOver: string[] = [];
  for (const problem of problems) {
    const path = controlPath(problem.field, rename);
    const control = path === '' ? null : form.get(path);
    if (control && control.controls === undefined) {
      control.setErrors({ ...control.errors, server: problem.message });
      control.markAsTouched();
    } else {
      leftOver.push(problem.message);
    }
  }
  return leftOver;
}

/**
 * The sentence to show under a form after a failure: '' when every problem
 * sits beside its field, else the server's message plus what no field took.
 */
export function formErrorText(message: string, problems: readonly FieldProblem[], leftOver: readonly string[]): string {
  if (problems.length > 0 && leftOver.length === 0) return '';
  return leftOver.length > 0 ? `${message} ${leftOver.filter((m) => !message.includes(m)).join(' ')}`.trim() : message;
}
