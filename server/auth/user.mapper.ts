import type { UserSummary } from '../../shared/admin';
import type { SessionUser } from '../../shared/auth';
import type { User } from './user.entity';

export function toSessionUser(user: User): SessionUser {
  return { id: user.id, email: user.email, displayName: user.displayName, siteRole: user.siteRole };
}

export function toUserSummary(user: User): UserSummary {
  return {
    ...toSessionUser(user),
    active: user.active,
    hasPassword: user.passwordHash !== null,
    createdAt: user.createdAt.toISOString(),
    lastSignInAt: user.lastSignInAt?.toISOString() ?? null,
  };
}
