import { SESSION_COOKIE } from '../../server/http/session';
import type { ApiResponse } from '../support/api-client';

/** The session cookie a response set, as `name=value` plus its attributes (lower-cased), or null. */
export function sessionCookieSet(res: ApiResponse): { pair: string; attributes: string[] } | null {
  const line = res.headers.getSetCookie().find((c) => c.startsWith(`${SESSION_COOKIE}=`));
  if (!line) return null;
  const [pair, ...attributes] = line.split(';').map((part) => part.trim());
  return { pair: pair!, attributes: attributes.map((a) => a.toLowerCase()) };
}

/** A bare GET carrying exactly the given cookie, like a browser tab that kept an old one. */
export async function getWithCookie(baseUrl: string, path: string, cookiePair: string): Promise<{ status: number; body: any }> {
  const res = await fetch(baseUrl + path, { headers: { cookie: cookiePair } });
  const text = await res.text();
  return { status: res.status, body: text ? JSON.parse(text) : text };
}
