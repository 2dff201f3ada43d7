import type { ApiErrorCode, FieldProblem } from '../../shared/api-error';

/** The one error type services and middleware throw; the error handler turns it into the shared body shape. */
export class AppError extends Error {
  constructor(
    readonly status: number,
    readonly code: ApiErrorCode,
    message: string,
    readonly details?: FieldProblem[],
  ) {
    super(message);
    this.name = 'AppError';
  }

  static notFound(what: string): AppError {
    return new AppError(404, 'not_found', `${what} was not found.`);
  }

  static forbidden(message: string): AppError {
    return new AppError(403, 'forbidden', message);
  }

  static conflict(message: string): AppError {
    return new AppError(409, 'conflict', message);
  }
}
