import { isApiErrorBody, type ApiErrorCode } from '../../../shared/api-error';

/** What a form needs from a failed request: one sentence, and messages per field. */
export interface ApiErrorMessage {
  message: string;
  /** Keyed by the last part of the server's field path (`body.email` → `email`). */
  fieldErrors: Record<string, string>;
  /** The server's error code, or null when the body was not ours (network, proxy). */
  code: ApiErrorCode | null;
  status: number;
}

/**
 * The part of an HttpErrorResponse this reads. Kept structural so the
 * function stays free of Angular and runs under mocha as it is.
 */
export interface FailedResponse {
  status: number;
  error: unknown;
}

/** Turns a failed HTTP response into text a form can show. Pure. */
export function apiErrorMessage(response: FailedResponse): ApiErrorMessage {
  const { status, error } = response;
  if (isApiErrorBody(error)) {
    const fieldErrors: Record<string, string> = {};
    for (const problem of error.error.details ?? []) {
      const key = fieldKey(problem.field);
      // Keep the first message per field: it is the one to fix first.
      if (!(key in fieldErrors)) fieldErrors[key] = problem.message;
    }
    return { message: error.error.message, fieldErrors, code: error.error.code, status };
  }
  return { message: fallbackMessage(status), fieldErrors: {}, code: null, status };
}

const REQUEST_PARTS = new Set(['body', 'query', 'params']);

/** `body.email` → `email`, `body.members.0.role` → `role`, `body` → `` (the whole form). Pure. */
export function fieldKey(field: string): string {
  const parts = field.split('.').filter((part) => part !== '' && !/^\d+$/.test(part));
  const last = parts.at(-1) ?? '';
  return parts.length === 1 && REQUEST_PARTS.has(last) ? '' : last;
}

function fallbackMessage(status: number): string {
  if (status === 0) return 'The server cannot be reached. Check the connection and try again.';
  if (status === 429) return 'Too many attempts. Wait a minute and try again.';
  if (status >= 500) return `The server could not complete the request (HTTP ${status}). Try again shortly.`;
  return `The request was refused (HTTP ${status}).`;
}
