import type { User } from '../../server/auth/user.entity';
import type { Project } from '../../server/projects/project.entity';
import { PERMISSIONS, PROJECT_ACTIONS, PROJECT_ROLES, type ProjectAction, type ProjectRole } from '../../shared/roles';
import { ApiClient } from '../support/api-client';
import { makeProject, makeUser, signedIn } from '../support/fixtures';

/** Everyone a route can meet: the four project roles, a signed-in stranger, a site admin who is not a member, and nobody. */
export const ACTORS = [...PROJECT_ROLES, 'non-member', 'site-admin', 'signed-out'] as const;
export type Actor = (typeof ACTORS)[number];

/** How an actor reads in a test title. */
export function who(actor: Actor): string {
  if (actor === 'signed-out') return 'caller who is not signed in';
  if (actor === 'site-admin') return 'site admin who is not a member';
  if (actor === 'non-member') return 'signed-in non-member';
  return actor;
}

export function isProjectRole(actor: Actor): actor is ProjectRole {
  return (PROJECT_ROLES as readonly string[]).includes(actor);
}

/**
 * What a project route must answer, from the shared table: nobody signed in → 401,
 * a stranger → 404 (the project is invisible), a site admin → a lead's rights,
 * a member → allowed or 403 as PERMISSIONS says.
 */
export function expectedOutcome(actor: Actor, action: ProjectAction): 'allowed' | 401 | 403 | 404 {
  if (actor === 'signed-out') return 401;
  if (actor === 'non-member') return 404;
  const role: ProjectRole = actor === 'site-admin' ? 'lead' : actor;
  return PERMISSIONS[action].includes(role) ? 'allowed' : 403;
}

/** The actions the project page should offer an actor who can see it. */
export function expectedAllowed(actor: ProjectRole | 'site-admin'): ProjectAction[] {
  return PROJECT_ACTIONS.filter((a) => expectedOutcome(actor, a) === 'allowed');
}

export interface Scene {
  project: Project;
  /** A lead other than the actor, so "last lead" rules never get in the way. */
  owner: User;
  /** A guest member the member routes act on. */
  target: User;
  /** The acting user; null when signed out. */
  user: User | null;
  client: ApiClient;
}

/** A fresh project with an owner, a target member and the actor in the given role. */
export async function sceneFor(baseUrl: string, actor: Actor): Promise<Scene> {
  const owner = await makeUser();
  const target = await makeUser();
  const user = actor === 'signed-out' ? null : await makeUser(actor === 'site-admin' ? 'admin' : 'member');
  const members: [User, ProjectRole][] = [
    [owner, 'lead'],
    [target, 'guest'],
  ];
  if (user && isProjectRole(actor)) members.push([user, actor]);
  const project = await makeProject(members);
  const client = user ? await signedIn(baseUrl, user) : new ApiClient(baseUrl);
  if (!user) await client.loadSession();
  return { project, owner, target, user, client };
}
