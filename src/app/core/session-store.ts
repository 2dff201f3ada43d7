import { HttpClient } from '@angular/common/http';
import { computed, inject, Injectable, signal } from '@angular/core';
import { firstValueFrom } from 'rxjs';
import type { SessionInfo } from '../../../shared/auth';

/**
 * Who is signed in, and the CSRF token to send back. Loaded once at start-up
 * and replaced on every sign-in and sign-out, because the server issues a new
 * token whenever the session changes.
 */
@Injectable({ providedIn: 'root' })
export class SessionStore {
  private readonly http = inject(HttpClient);

  private readonly info = signal<SessionInfo | null>(null);
  private readonly settled = signal(false);

  /** False until the first answer (or failure) of `GET /api/auth/session`. */
  readonly loaded = this.settled.asReadonly();
  readonly user = computed(() => this.info()?.user ?? null);
  readonly csrfToken = computed(() => this.info()?.csrfToken ?? '');
  readonly isSignedIn = computed(() => this.user() !== null);
  readonly isAdmin = computed(() => this.user()?.siteRole === 'admin');
  /** Listed on the sign-in page in local mode; null in production. */
  readonly demoAccounts = computed(() => this.info()?.demoAccounts ?? null);
  /** Local mode keeps sent mail in an outbox and offers demo accounts. */
  readonly isLocalMode = computed(() => this.demoAccounts() !== null);

  /** Fetches the session; a failure leaves the app signed out rather than stuck. */
  async load(): Promise<void> {
    try {
      this.info.set(await firstValueFrom(this.http.get<SessionInfo>('/api/auth/session')));
    } catch {
      // Server or database down: the error interceptor has told the user;
      // keep whatever we knew so a later retry can recover.
    } finally {
      this.settled.set(true);
    }
  }

  /** Takes the answer of a sign-in (new user, new token). */
  replace(info: SessionInfo): void {
    this.info.set(info);
  }

  /** After a 401: the server forgot us (expired or signed out elsewhere). */
  forgetUser(): void {
    this.info.update((info) => (info ? { ...info, user: null } : info));
  }

  /** Ends the session on the server, then fetches a fresh token for the next sign-in. */
  async signOut(): Promise<void> {
    try {
      await firstValueFrom(this.http.post<void>('/api/auth/sign-out', null));
    } catch {
      // Server unreachable: forget the user here anyway; the error
      // interceptor has already said what went wrong.
    }
    this.forgetUser();
    await this.load();
  }
}
