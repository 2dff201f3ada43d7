import { csrfSync } from 'csrf-sync';
import type { RequestHandler } from 'express';
import { CSRF_HEADER } from '../../shared/auth';
import { AppError } from './app-error';

/**
 * Synchroniser tokens kept in the session: every state-changing request must
 * echo the session's token in a header a cross-site form cannot set.
 */
const csrf = csrfSync({
  getTokenFromRequest: (req) => {
    const value = req.headers[CSRF_HEADER];
    return typeof value === 'string' ? value : undefined;
  },
});

export const requireCsrfToken: RequestHandler = (req, _res, next) => {
  if (['GET', 'HEAD', 'OPTIONS'].includes(req.method) || csrf.isRequestValid(req)) return next();
  throw new AppError(403, 'csrf_token_invalid', 'The security token is missing or out of date. Reload the page and try again.');
};

type Req = Parameters<RequestHandler>[0];

/** The session's token, made on first use. */
export function csrfTokenFor(req: Req): string {
  return csrf.generateToken(req);
}

/** A new token after sign-in or sign-out, so a token seen before it stops working. */
export function renewCsrfToken(req: Req): string {
  return csrf.generateToken(req, true);
}
