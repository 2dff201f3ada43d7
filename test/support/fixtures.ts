import { randomUUID } from 'node:crypto';
import type { ProjectRole, SiteRole } from '../../shared/roles';
import { hashPassword } from '../../server/auth/password-hash';
import { User } from '../../server/auth/user.entity';
import { ProjectMembership } from '../../server/projects/project-membership.entity';
import { Project } from '../../server/projects/project.entity';
import { ApiClient } from './api-client';
import { runningServer } from './test-server';

export const TEST_PASSWORD = 'correct-horse-battery';

/** A short unique suffix so every test makes rows of its own. */
export function unique(): string {
  return randomUUID().slice(0, 8);
}

export async function makeUser(siteRole: SiteRole = 'member', fields: Partial<User> = {}): Promise<User> {
  const repo = runningServer().ctx.dataSource.getRepository(User);
  const tag = unique();
  return repo.save(
    repo.create({ email: `user-${tag}@example.test`, displayName: `Test User ${tag}`, siteRole, passwordHash: await hashPassword(TEST_PASSWORD), ...fields }),
  );
}

export async function makeProject(members: [User, ProjectRole][], fields: Partial<Project> = {}): Promise<Project> {
  const ds = runningServer().ctx.dataSource;
  const tag = unique().toUpperCase();
  const project = await ds.getRepository(Project).save({ code: `T-${tag}`, name: `Test project ${tag}`, description: '', ...fields });
  for (const [user, role] of members) await ds.getRepository(ProjectMembership).insert({ projectId: project.id, userId: user.id, role });
  return project;
}

/** A client already signed in as `user` (made with TEST_PASSWORD). */
export async function signedIn(baseUrl: string, user: User): Promise<ApiClient> {
  const client = new ApiClient(baseUrl);
  const res = await client.signIn(user.email, TEST_PASSWORD);
  if (res.status !== 200) throw new Error(`sign-in for ${user.email} failed: ${res.status} ${JSON.stringify(res.body)}`);
  return client;
}
