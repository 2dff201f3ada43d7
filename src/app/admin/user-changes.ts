import type { UpdateUserBody, UserSummary } from '../../../shared/admin';

/** One change an administrator can make to an account from the user list. */
export interface UserChange {
  /** Menu item text, e.g. "Deactivate". */
  label: string;
  icon: string;
  body: UpdateUserBody;
  /** Asked first when the change takes rights away or grants many. */
  confirmation: { title: string; message: string; confirmLabel: string } | null;
  /** Said once the server accepted it. */
  done: string;
}

/**
 * The changes that make sense for `user`, seen by the administrator `myUserId`.
 * Nothing is offered on one's own row, so an admin cannot lock themself out.
 * Pure.
 */
export function userChanges(user: UserSummary, myUserId: string | null): UserChange[] {
  if (user.id === myUserId) return [];
  const name = user.displayName;
  const role: UserChange =
    user.siteRole === 'admin'
      ? {
          label: 'Make member',
          icon: 'person',
          body: { siteRole: 'member' },
          confirmation: {
            title: `Make ${name} a member?`,
            message: `${name} will no longer administer the site: no user management, and only the projects they belong to.`,
            confirmLabel: 'Make member',
          },
          done: `${name} is now a member.`,
        }
      : {
          label: 'Make admin',
          icon: 'admin_panel_settings',
          body: { siteRole: 'admin' },
          confirmation: {
            title: `Make ${name} a site administrator?`,
            message: `${name} will manage every account and hold a lead's rights in every project.`,
            confirmLabel: 'Make admin',
          },
          done: `${name} is now a site administrator.`,
        };
  const activity: UserChange = user.active
    ? {
        label: 'Deactivate',
        icon: 'block',
        body: { active: false },
        confirmation: {
          title: `Deactivate ${name}?`,
          message: `${name} will not be able to sign in. Their work stays in its projects, and you can reactivate the account later.`,
          confirmLabel: 'Deactivate',
        },
        done: `${name} is deactivated.`,
      }
    : {
        label: 'Reactivate',
        icon: 'check_circle',
        body: { active: true },
        confirmation: null,
        done: `${name} can sign in again.`,
      };
  return [role, activity];
}
