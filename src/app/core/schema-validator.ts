import { AbstractControl, ValidationErrors, ValidatorFn } from '@angular/forms';

/** The slice of a zod schema this needs; structural so the client never names zod's types. */
interface FieldSchema {
  safeParse(value: unknown): { success: boolean; error?: { issues: readonly { message: string }[] } };
}

/**
 * Checks a control against the same shared schema the server validates with,
 * so both sides reject a value with the same words. The error is
 * `{ schema: message }`, which `validationMessage` shows as it is.
 */
export function schemaValidator(schema: FieldSchema): ValidatorFn {
  return (control: AbstractControl): ValidationErrors | null => {
    const result = schema.safeParse(control.value);
    if (result.success) return null;
    return { schema: result.error?.issues[0]?.message ?? 'Check this field.' };
  };
}
