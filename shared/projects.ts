import { z } from 'zod';
import { pagingQuery } from './paging';
import { PROJECT_ROLES, type ProjectAction, type ProjectRole } from './roles';

export const PROJECT_STATUSES = ['active', 'archived'] as const;
export type ProjectStatus = (typeof PROJECT_STATUSES)[number];

/** A row of the project list. */
export interface ProjectSummary {
  id: string;
  code: string;
  name: string;
  description: string;
  status: ProjectStatus;
  memberCount: number;
  /** The caller's own role; null for a site admin who is not a member. */
  myRole: ProjectRole | null;
  createdAt: string;
  updatedAt: string;
}

/** The project page: the summary plus members and what the caller may do. */
export interface ProjectDetail extends ProjectSummary {
  members: ProjectMember[];
  /** Actions the caller may take here, from the shared permission table. */
  allowed: ProjectAction[];
}

export interface ProjectMember {
  userId: string;
  email: string;
  displayName: string;
  role: ProjectRole;
  addedAt: string;
}

export const PROJECT_SORT_FIELDS = ['name', 'code', 'status', 'createdAt', 'updatedAt'] as const;

export const listProjectsQuery = z.strictObject({
  ...pagingQuery,
  sort: z.enum(PROJECT_SORT_FIELDS).default('name'),
  q: z.string().trim().max(100).default(''),
  status: z.enum(['active', 'archived', 'all']).default('active'),
});
export type ListProjectsQuery = z.infer<typeof listProjectsQuery>;

const code = z
  .string()
  .trim()
  .regex(/^[A-Z0-9][A-Z0-9-]{1,19}$/, { error: 'Use 2-20 capital letters, digits or hyphens, e.g. LAM-24.' });
const name = z.string().trim().min(3, { error: 'Use at least 3 characters.' }).max(120, { error: 'Use at most 120 characters.' });
const description = z.string().trim().max(2000, { error: 'Use at most 2000 characters.' });

export const createProjectBody = z.strictObject({ code, name, description: description.default('') });
export type CreateProjectBody = z.infer<typeof createProjectBody>;

export const updateProjectBody = z
  .strictObject({ name, description, status: z.enum(PROJECT_STATUSES) })
  .partial()
  .refine((v) => Object.keys(v).length > 0, { error: 'Send at least one field to change.' });
export type UpdateProjectBody = z.infer<typeof updateProjectBody>;

export const addMemberBody = z.strictObject({
  email: z.string().trim().toLowerCase().pipe(z.email({ error: 'Enter a valid e-mail address.' })),
  role: z.enum(PROJECT_ROLES),
});
export type AddMemberBody = z.infer<typeof addMemberBody>;

export const changeMemberBody = z.strictObject({ role: z.enum(PROJECT_ROLES) });
export type ChangeMemberBody = z.infer<typeof changeMemberBody>;

export const projectIdParams = z.strictObject({ projectId: z.uuid({ error: 'Not a valid project id.' }) });
export const memberParams = z.strictObject({
  projectId: z.uuid({ error: 'Not a valid project id.' }),
  userId: z.uuid({ error: 'Not a valid user id.' }),
});
