import { z } from 'zod';
import { PASSWORD_MAX, PASSWORD_MIN } from './auth-constants';
import type { SiteRole } from './roles';

/** The signed-in user as the client sees it. */
export interface SessionUser {
  id: string;
  email: string;
  displayName: string;
  siteRole: SiteRole;
}

/** Answer of `GET /api/auth/session` and `POST /api/auth/sign-in`. */
export interface SessionInfo {
  user: SessionUser | null;
  /** Send back as the `x-csrf-token` header on every state-changing request. */
  csrfToken: string;
  /** Local mode shows the demo accounts on the sign-in page; production never does. */
  demoAccounts: DemoAccount[] | null;
}

export interface DemoAccount {
  email: string;
  password: string;
  role: string;
}

export { CSRF_HEADER, PASSWORD_MAX, PASSWORD_MIN } from './auth-constants';

const email = z.string().trim().toLowerCase().pipe(z.email({ error: 'Enter a valid e-mail address.' }));
const newPassword = z
  .string()
  .min(PASSWORD_MIN, { error: `Use at least ${PASSWORD_MIN} characters.` })
  .max(PASSWORD_MAX, { error: `Use at most ${PASSWORD_MAX} characters.` });

export const signInBody = z.strictObject({
  email,
  password: z.string().min(1, { error: 'Enter your password.' }).max(PASSWORD_MAX),
});
export type SignInBody = z.infer<typeof signInBody>;

export const changePasswordBody = z.strictObject({
  currentPassword: z.string().min(1, { error: 'Enter your current password.' }).max(PASSWORD_MAX),
  newPassword,
});
export type ChangePasswordBody = z.infer<typeof changePasswordBody>;

export const requestResetBody = z.strictObject({ email });
export type RequestResetBody = z.infer<typeof requestResetBody>;

const resetToken = z.string().regex(/^[A-Za-z0-9_-]{20,100}$/, { error: 'This link is not a valid reset link.' });

export const completeResetBody = z.strictObject({ token: resetToken, newPassword });

/** POST /api/auth/password-reset/check: whether a link still works, asked when its page opens (nothing is used up). */
export const checkResetBody = z.strictObject({ token: resetToken });
export type CheckResetBody = z.infer<typeof checkResetBody>;
export type CompleteResetBody = z.infer<typeof completeResetBody>;
