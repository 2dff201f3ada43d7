import { HttpErrorResponse, HttpInterceptorFn, HttpRequest } from '@angular/common/http';
import { inject } from '@angular/core';
import { catchError, from, switchMap, throwError } from 'rxjs';
import { CSRF_HEADER } from '../../../shared/auth-constants';
import { isApiErrorBody } from '../../../shared/api-error';
import { SessionStore } from './session-store';

const UNSAFE_METHODS = new Set(['POST', 'PUT', 'PATCH', 'DELETE']);

/**
 * Sends the session's CSRF token on state-changing requests. If the server
 * rejects the token (the session rotated in another tab, or expired), it
 * fetches a fresh session once and retries, so the user never sees that.
 */
export const csrfInterceptor: HttpInterceptorFn = (request, next) => {
  if (!UNSAFE_METHODS.has(request.method)) return next(request);
  const session = inject(SessionStore);
  return next(withToken(request, session.csrfToken())).pipe(
    catchError((error: unknown) => {
      if (!isStaleToken(error)) return throwError(() => error);
      return from(session.load()).pipe(switchMap(() => next(withToken(request, session.csrfToken()))));
    }),
  );
};

function withToken(request: HttpRequest<unknown>, token: string): HttpRequest<unknown> {
  return token ? request.clone({ setHeaders: { [CSRF_HEADER]: token } }) : request;
}

function isStaleToken(error: unknown): boolean {
  return (
    error instanceof HttpErrorResponse &&
    error.status === 403 &&
    isApiErrorBody(error.error) &&
    error.error.error.code === 'csrf_token_invalid'
  );
}
