import { HttpClient } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { Observable, tap } from 'rxjs';
import type {
  ChangePasswordBody,
  CompleteResetBody,
  RequestResetBody,
  SessionInfo,
  SignInBody,
} from '../../../shared/auth';
import { SessionStore } from '../core/session-store';

/** Sign-in and password requests. Sign-out lives in SessionStore, which the shell uses. */
@Injectable({ providedIn: 'root' })
export class AuthApi {
  private readonly http = inject(HttpClient);
  private readonly session = inject(SessionStore);

  /** Signs in and keeps the new session (and its new CSRF token). */
  signIn(body: SignInBody): Observable<SessionInfo> {
    return this.http.post<SessionInfo>('/api/auth/sign-in', body).pipe(tap((info) => this.session.replace(info)));
  }

  changePassword(body: ChangePasswordBody): Observable<void> {
    return this.http.post<void>('/api/auth/password', body);
  }

  /** Mails a reset link if the account exists; the answer never says which. */
  requestReset(body: RequestResetBody): Observable<void> {
    return this.http.post<void>('/api/auth/password-reset', body);
  }

  /** Whether a reset or invitation link still works (204), or why not (400); it stays unused. */
  checkReset(token: string): Observable<void> {
    return this.http.post<void>('/api/auth/password-reset/check', { token });
  }

  /** Sets a password from a reset or invitation link. */
  completeReset(body: CompleteResetBody): Observable<void> {
    return this.http.post<void>('/api/auth/password-reset/complete', body);
  }
}
