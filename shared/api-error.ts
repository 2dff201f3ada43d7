/**
 * The one body shape every failed API request returns, so the client's
 * error interceptor and every test read failures the same way.
 */
export interface ApiErrorBody {
  error: ApiError;
}

export interface ApiError {
  /** HTTP status, repeated in the body for clients that lose it (downloads, logs). */
  status: number;
  /** Stable machine-readable code, e.g. `validation_failed`, `forbidden`. */
  code: ApiErrorCode;
  /** One sentence a person can act on. */
  message: string;
  /** Per-field problems, present for validation failures. */
  details?: FieldProblem[];
}

export interface FieldProblem {
  /** Dotted path of the offending field, e.g. `body.email` or `query.page`. */
  field: string;
  message: string;
}

export type ApiErrorCode =
  | 'validation_failed'
  | 'malformed_json'
  | 'payload_too_large'
  | 'not_signed_in'
  | 'bad_credentials'
  | 'account_inactive'
  | 'csrf_token_invalid'
  | 'forbidden'
  | 'not_found'
  | 'conflict'
  | 'token_invalid'
  | 'too_many_requests'
  | 'database_unavailable'
  | 'internal_error'
  // Image upload and processing
  | 'unsupported_format'
  | 'image_corrupt'
  | 'image_too_large'
  | 'file_too_large'
  | 'empty_file'
  | 'invalid_file_name'
  | 'duplicate_image'
  | 'upload_incomplete'
  | 'image_not_ready';

/** Narrows an unknown value (e.g. an HttpErrorResponse body) to the shape above. */
export function isApiErrorBody(value: unknown): value is ApiErrorBody {
  if (typeof value !== 'object' || value === null) return false;
  const error = (value as { error?: unknown }).error;
  return (
    typeof error === 'object' &&
    error !== null &&
    typeof (error as ApiError).code === 'string' &&
    typeof (error as ApiError).message === 'string'
  );
}
