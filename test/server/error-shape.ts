import { expect } from 'chai';
import type { ApiError, ApiErrorCode, FieldProblem } from '../../shared/api-error';
import type { ApiResponse } from '../support/api-client';

/**
 * Asserts the HTTP status and that the body is exactly the shared error shape
 * `{ error: { status, code, message, details? } }` with that status and code.
 * Returns the error so a test can check its message and details.
 */
export function expectApiError(res: ApiResponse<unknown>, status: number, code: ApiErrorCode): ApiError {
  expect(res.status, `HTTP status (body: ${JSON.stringify(res.body)})`).to.equal(status);
  expect(res.headers.get('content-type') ?? '').to.match(/^application\/json/);
  expect(res.body).to.be.an('object').that.has.all.keys('error');
  const error = (res.body as { error: ApiError }).error;
  expect(Object.keys(error)).to.satisfy((keys: string[]) => keys.every((k) => ['status', 'code', 'message', 'details'].includes(k)));
  expect(error).to.include({ status, code });
  expect(error.message).to.be.a('string').and.not.equal('');
  if ('details' in error) {
    expect(error.details).to.be.an('array').that.is.not.empty;
    for (const problem of error.details ?? []) {
      expect(problem).to.have.all.keys('field', 'message');
      expect(problem.field).to.be.a('string').and.not.equal('');
      expect(problem.message).to.be.a('string').and.not.equal('');
    }
  }
  return error;
}

/** The fields a validation failure named. */
export function fieldsOf(res: ApiResponse<unknown>): string[] {
  const error = (res.body as { error?: ApiError } | undefined)?.error;
  return (error?.details ?? ([] as FieldProblem[])).map((p) => p.field);
}
