/**
 * Text for a form control's first validation error. Pure: takes the plain
 * `errors` object Angular forms keep, so mocha can run it without Angular.
 */
export function validationMessage(errors: Record<string, unknown> | null | undefined): string {
  if (!errors) return '';
  // A message from the server wins: it knows rules the client does not.
  if (typeof errors['server'] === 'string') return errors['server'];
  if (errors['required']) return 'Required.';
  if (errors['email']) return 'Enter a valid e-mail address.';
  const min = errors['minlength'] as { requiredLength: number } | undefined;
  if (min) return `Use at least ${min.requiredLength} characters.`;
  const max = errors['maxlength'] as { requiredLength: number } | undefined;
  if (max) return `Use at most ${max.requiredLength} characters.`;
  if (errors['mismatch']) return 'The two passwords differ.';
  if (typeof errors['pattern'] === 'object') return 'Check the format.';
  const first = Object.values(errors).find((value) => typeof value === 'string');
  return typeof first === 'string' ? first : 'Check this field.';
}
