/**
 * Who may do what. One table, read by the server to enforce and by the client
 * to hide controls; the README's permission matrix is checked against it in tests.
 */

export const SITE_ROLES = ['admin', 'member'] as const;
export type SiteRole = (typeof SITE_ROLES)[number];

export const PROJECT_ROLES = ['lead', 'researcher', 'reviewer', 'guest'] as const;
export type ProjectRole = (typeof PROJECT_ROLES)[number];

export const PROJECT_ACTIONS = [
  'read',
  'upload',
  'editMetadata',
  'annotate',
  'measure',
  'comment',
  'submitForReview',
  'decideReview',
  'reopenReview',
  'manageMembers',
  'editProject',
  'delete',
] as const;
export type ProjectAction = (typeof PROJECT_ACTIONS)[number];

/** Plain-language names used in the UI and in the README's table. */
export const ACTION_LABELS: Record<ProjectAction, string> = {
  read: 'Read (browse, view, download)',
  upload: 'Upload images',
  editMetadata: 'Edit metadata',
  annotate: 'Annotate',
  measure: 'Measure',
  comment: 'Comment',
  submitForReview: 'Change review state: submit for review',
  decideReview: 'Change review state: request changes / clear',
  reopenReview: 'Change review state: reopen a cleared item',
  manageMembers: 'Manage members',
  editProject: 'Edit or archive the project',
  delete: 'Delete',
};

export const PERMISSIONS: Record<ProjectAction, readonly ProjectRole[]> = {
  read: ['lead', 'researcher', 'reviewer', 'guest'],
  upload: ['lead', 'researcher'],
  editMetadata: ['lead', 'researcher'],
  annotate: ['lead', 'researcher'],
  measure: ['lead', 'researcher'],
  comment: ['lead', 'researcher', 'reviewer'],
  submitForReview: ['lead', 'researcher'],
  decideReview: ['reviewer'],
  reopenReview: ['lead'],
  manageMembers: ['lead'],
  editProject: ['lead'],
  delete: ['lead'],
};

/**
 * Whether a user may do `action` in a project. Site admins oversee every
 * project with a lead's rights (a review decision still needs a reviewer's
 * membership); everyone else needs a membership.
 */
export function can(siteRole: SiteRole, projectRole: ProjectRole | null, action: ProjectAction): boolean {
  if (siteRole === 'admin' && PERMISSIONS[action].includes('lead')) return true;
  return projectRole !== null && PERMISSIONS[action].includes(projectRole);
}
