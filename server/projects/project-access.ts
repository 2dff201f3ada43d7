import type { Request, RequestHandler, Response } from 'express';
import type { DataSource } from 'typeorm';
import { can, type ProjectAction, type ProjectRole } from '../../shared/roles';
import { AppError } from '../http/app-error';
import { currentUser } from '../http/require-auth';
import { ProjectMembership } from './project-membership.entity';

/** The caller's role in the project of `req.params.projectId`, set by `requireProjectAction`. */
export function projectRoleOf(res: Response): ProjectRole | null {
  return (res.locals['projectRole'] as ProjectRole | null | undefined) ?? null;
}

/**
 * Enforces the shared permission table for project routes. Non-members get 404,
 * so project ids cannot be probed; members without the right get 403.
 * Put it after `validate({ params })` so the id is known to be a uuid.
 */
export function requireProjectAction(ds: DataSource, action: ProjectAction): RequestHandler {
  return async (req: Request, res: Response, next) => {
    const user = currentUser(req);
    const projectId = String(req.params['projectId']);
    const exists = await ds.query('SELECT 1 FROM projects WHERE id = $1', [projectId]);
    const membership = await ds.getRepository(ProjectMembership).findOneBy({ projectId, userId: user.id });
    const role = membership?.role ?? null;
    if (exists.length === 0 || (role === null && user.siteRole !== 'admin')) throw AppError.notFound('The project');
    if (!can(user.siteRole, role, action)) {
      throw AppError.forbidden(`Your role in this project (${role ?? 'none'}) may not do this.`);
    }
    res.locals['projectRole'] = role;
    next();
  };
}
