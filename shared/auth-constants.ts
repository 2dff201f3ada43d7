/**
 * Plain constants of sign-in, in a module without zod so the client's first
 * download does not carry the schema library just to read them.
 */
export const CSRF_HEADER = 'x-csrf-token';

/** Passwords: long enough to resist guessing, short enough to hash cheaply. */
export const PASSWORD_MIN = 10;
export const PASSWORD_MAX = 200;
