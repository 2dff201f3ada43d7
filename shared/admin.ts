import { z } from 'zod';
import { pagingQuery } from './paging';
import { SITE_ROLES, type SiteRole } from './roles';

/** A row of the admin user list. */
export interface UserSummary {
  id: string;
  email: string;
  displayName: string;
  siteRole: SiteRole;
  active: boolean;
  /** False until an invited user has set a password. */
  hasPassword: boolean;
  createdAt: string;
  lastSignInAt: string | null;
}

export const USER_SORT_FIELDS = ['email', 'displayName', 'createdAt', 'lastSignInAt'] as const;

export const listUsersQuery = z.strictObject({
  ...pagingQuery,
  sort: z.enum(USER_SORT_FIELDS).default('email'),
  q: z.string().trim().max(100).default(''),
});
export type ListUsersQuery = z.infer<typeof listUsersQuery>;

const email = z.string().trim().toLowerCase().pipe(z.email({ error: 'Enter a valid e-mail address.' }));
const displayName = z.string().trim().min(2, { error: 'Use at least 2 characters.' }).max(80, { error: 'Use at most 80 characters.' });

/** Creates the account and e-mails an invitation link to set its password. */
export const inviteUserBody = z.strictObject({
  email,
  displayName,
  siteRole: z.enum(SITE_ROLES).default('member'),
});
export type InviteUserBody = z.infer<typeof inviteUserBody>;

export const updateUserBody = z
  .strictObject({ displayName, siteRole: z.enum(SITE_ROLES), active: z.boolean() })
  .partial()
  .refine((v) => Object.keys(v).length > 0, { error: 'Send at least one field to change.' });
export type UpdateUserBody = z.infer<typeof updateUserBody>;

export const userIdParams = z.strictObject({ userId: z.uuid({ error: 'Not a valid user id.' }) });

/** A message kept by the local fake SMTP server (local mode only). */
export interface KeptMail {
  id: string;
  receivedAt: string;
  from: string;
  to: string[];
  subject: string;
  text: string;
}
