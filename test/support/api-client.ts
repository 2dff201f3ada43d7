import type { AddressInfo } from 'node:net';
import type { Server } from 'node:http';
import { CSRF_HEADER, type SessionInfo } from '../../shared/auth';
import { createApp } from '../../server/app';
import type { AppContext } from '../../server/app-context';
import { runningServer } from './test-server';

export interface ApiResponse<T = any> {
  status: number;
  body: T;
  headers: Headers;
}

/**
 * A browser-like client: keeps the session cookie, fetches a CSRF token before
 * the first state-changing request and sends it back, like the Angular app does.
 */
export class ApiClient {
  private cookie = '';
  csrfToken = '';

  constructor(readonly baseUrl: string) {}

  get<T = any>(path: string): Promise<ApiResponse<T>> {
    return this.request<T>('GET', path);
  }
  post<T = any>(path: string, body?: unknown): Promise<ApiResponse<T>> {
    return this.request<T>('POST', path, body);
  }
  patch<T = any>(path: string, body?: unknown): Promise<ApiResponse<T>> {
    return this.request<T>('PATCH', path, body);
  }
  delete<T = any>(path: string): Promise<ApiResponse<T>> {
    return this.request<T>('DELETE', path);
  }

  /** Loads the session (and a CSRF token) the way the app does on start. */
  async loadSession(): Promise<SessionInfo> {
    const res = await this.get<SessionInfo>('/api/auth/session');
    this.csrfToken = res.body.csrfToken;
    return res.body;
  }

  async signIn(email: string, password: string): Promise<ApiResponse<SessionInfo>> {
    if (!this.csrfToken) await this.loadSession();
    const res = await this.post<SessionInfo>('/api/auth/sign-in', { email, password });
    if (res.status === 200) this.csrfToken = res.body.csrfToken;
    return res;
  }

  /** The cookie and CSRF headers this client sends, for requests made without it (multipart uploads, raw sockets). */
  async authHeaders(): Promise<Record<string, string>> {
    if (!this.csrfToken) await this.loadSession();
    return { [CSRF_HEADER]: this.csrfToken, ...(this.cookie ? { cookie: this.cookie } : {}) };
  }

  /** Sends any body as-is (raw strings for malformed JSON tests) with the given headers. */
  async raw(method: string, path: string, body: string, headers: Record<string, string>): Promise<ApiResponse> {
    if (!this.csrfToken) await this.loadSession();
    return this.send(method, path, body, { [CSRF_HEADER]: this.csrfToken, ...headers });
  }

  async request<T>(method: string, path: string, body?: unknown, opts: { csrf?: boolean } = {}): Promise<ApiResponse<T>> {
    const headers: Record<string, string> = {};
    if (method !== 'GET' && opts.csrf !== false) {
      if (!this.csrfToken) await this.loadSession();
      headers[CSRF_HEADER] = this.csrfToken;
    }
    if (body !== undefined) headers['content-type'] = 'application/json';
    return this.send(method, path, body === undefined ? undefined : JSON.stringify(body), headers);
  }

  private async send(method: string, path: string, body: string | undefined, headers: Record<string, string>): Promise<ApiResponse> {
    const res = await fetch(this.baseUrl + path, {
      method,
      body,
      headers: { ...headers, ...(this.cookie ? { cookie: this.cookie } : {}) },
      redirect: 'manual',
    });
    const setCookie = res.headers.getSetCookie().find((c) => c.startsWith('etchfile.sid='));
    if (setCookie) this.cookie = setCookie.split(';')[0]!;
    const text = await res.text();
    const type = res.headers.get('content-type') ?? '';
    return { status: res.status, headers: res.headers, body: type.includes('json') && text ? JSON.parse(text) : text };
  }
}

/** Mounts `createApp()` for one test file on an ephemeral port, sharing the run's database and mailer. */
export async function mountApp(overrides: Partial<AppContext> = {}): Promise<{ url: string; close(): Promise<void> }> {
  const ctx = { ...runningServer().ctx, ...overrides };
  const server: Server = createApp(ctx).listen(0, '127.0.0.1');
  await new Promise<void>((resolve) => server.once('listening', resolve));
  const { port } = server.address() as AddressInfo;
  return {
    url: `http://127.0.0.1:${port}`,
    close: () =>
      new Promise<void>((resolve) => {
        server.close(() => resolve());
        server.closeAllConnections();
      }),
  };
}
