import { Router } from 'express';
import {
  addMemberBody,
  changeMemberBody,
  createProjectBody,
  listProjectsQuery,
  memberParams,
  projectIdParams,
  updateProjectBody,
} from '../../shared/projects';
import type { AppContext } from '../app-context';
import { requireSignedIn } from '../http/require-auth';
import { validate } from '../http/validate';
import { requireProjectAction } from './project-access';
import { ProjectsController } from './projects.controller';

export function projectsRouter(ctx: AppContext): Router {
  const c = new ProjectsController(ctx);
  const may = (action: Parameters<typeof requireProjectAction>[1]) => requireProjectAction(ctx.dataSource, action);
  const router = Router();
  router.use(requireSignedIn);
  router.get('/', validate({ query: listProjectsQuery }), c.list);
  router.post('/', validate({ body: createProjectBody }), c.create);
  router.get('/:projectId', validate({ params: projectIdParams }), may('read'), c.get);
  // Access is checked before the body, so a caller without the right learns nothing from validation messages.
  router.patch('/:projectId', validate({ params: projectIdParams }), may('editProject'), validate({ body: updateProjectBody }), c.update);
  router.post('/:projectId/members', validate({ params: projectIdParams }), may('manageMembers'), validate({ body: addMemberBody }), c.addMember);
  router.patch('/:projectId/members/:userId', validate({ params: memberParams }), may('manageMembers'), validate({ body: changeMemberBody }), c.changeMember);
  router.delete('/:projectId/members/:userId', validate({ params: memberParams }), may('manageMembers'), c.removeMember);
  return router;
}
