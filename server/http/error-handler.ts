import type { ErrorRequestHandler, RequestHandler } from 'express';
import type { ApiErrorBody } from '../../shared/api-error';
import { AppError } from './app-error';
import { isDatabaseDown } from './database-down';

/** Unknown /api routes: the same body shape as every other failure. */
export const apiNotFound: RequestHandler = (req) => {
  throw new AppError(404, 'not_found', `There is no API route ${req.method} ${req.path}.`);
};

/** Turns anything thrown into one of our error bodies; logs what we did not expect. */
export const errorHandler: ErrorRequestHandler = (err, req, res, next) => {
  if (res.headersSent) return next(err);
  const known = toAppError(err);
  if (!known) req.log.error({ err }, 'unexpected error');
  const error = known ?? new AppError(500, 'internal_error', 'Something went wrong on our side; it has been logged.');
  if (error.status === 503) res.setHeader('Retry-After', '5');
  const body: ApiErrorBody = {
    error: { status: error.status, code: error.code, message: error.message, ...(error.details ? { details: error.details } : {}) },
  };
  res.status(error.status).json(body);
};

function toAppError(err: unknown): AppError | null {
  if (err instanceof AppError) return err;
  const type = (err as { type?: unknown })?.type;
  // body-parser marks its own failures with `type`.
  if (type === 'entity.parse.failed') return new AppError(400, 'malformed_json', 'The request body is not valid JSON.');
  if (type === 'entity.too.large') return new AppError(413, 'payload_too_large', 'The request body is too large.');
  if (type === 'encoding.unsupported' || type === 'charset.unsupported') {
    return new AppError(400, 'malformed_json', 'The request body encoding is not supported; send UTF-8 JSON.');
  }
  if (isDatabaseDown(err)) {
    return new AppError(503, 'database_unavailable', 'The database is not reachable right now. Try again in a moment.');
  }
  return null;
}
