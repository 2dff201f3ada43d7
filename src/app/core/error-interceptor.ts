import { HttpErrorResponse, HttpInterceptorFn } from '@angular/common/http';
import { inject } from '@angular/core';
import { MatSnackBar } from '@angular/material/snack-bar';
import { Router } from '@angular/router';
import { catchError, throwError } from 'rxjs';
import { apiErrorMessage } from './api-error-message';
import { SessionStore } from './session-store';

/**
 * Handles the failures no single screen can: a lost session sends the user
 * to sign in (and back afterwards); server and network failures get a
 * snack bar. Every error is rethrown, so 4xx answers reach the calling form.
 */
export const errorInterceptor: HttpInterceptorFn = (request, next) => {
  const router = inject(Router);
  const snackBar = inject(MatSnackBar);
  const session = inject(SessionStore);
  return next(request).pipe(
    catchError((error: unknown) => {
      if (!(error instanceof HttpErrorResponse)) return throwError(() => error);
      const failure = apiErrorMessage(error);
      if (failure.code === 'not_signed_in') {
        session.forgetUser();
        const current = router.url;
        if (!current.startsWith('/sign-in')) {
          void router.navigate(['/sign-in'], { queryParams: { returnUrl: current } });
        }
      } else if (error.status === 0 || error.status >= 500) {
        snackBar.open(failure.message, 'Dismiss', { duration: 8000 });
      }
      return throwError(() => error);
    }),
  );
};
