import type { RequestHandler } from 'express';
import type { AddMemberBody, ChangeMemberBody, CreateProjectBody, ListProjectsQuery, UpdateProjectBody } from '../../shared/projects';
import type { AppContext } from '../app-context';
import { currentUser } from '../http/require-auth';
import { projectRoleOf } from './project-access';
import { ProjectsService } from './projects.service';

/** HTTP in, service call, HTTP out for projects and members. */
export class ProjectsController {
  private readonly service: ProjectsService;

  constructor(ctx: AppContext) {
    this.service = new ProjectsService(ctx);
  }

  list: RequestHandler = async (req, res) => {
    res.json(await this.service.list(currentUser(req), req.query as unknown as ListProjectsQuery));
  };

  create: RequestHandler = async (req, res) => {
    res.status(201).json(await this.service.create(currentUser(req), req.body as CreateProjectBody));
  };

  get: RequestHandler = async (req, res) => {
    res.json(await this.service.detail(currentUser(req), String(req.params['projectId']), projectRoleOf(res)));
  };

  update: RequestHandler = async (req, res) => {
    const id = String(req.params['projectId']);
    res.json(await this.service.update(currentUser(req), id, req.body as UpdateProjectBody, projectRoleOf(res)));
  };

  addMember: RequestHandler = async (req, res) => {
    res.status(201).json(await this.service.addMember(currentUser(req), String(req.params['projectId']), req.body as AddMemberBody));
  };

  changeMember: RequestHandler = async (req, res) => {
    const { projectId, userId } = req.params as { projectId: string; userId: string };
    res.json(await this.service.changeMemberRole(currentUser(req), projectId, userId, (req.body as ChangeMemberBody).role));
  };

  removeMember: RequestHandler = async (req, res) => {
    const { projectId, userId } = req.params as { projectId: string; userId: string };
    await this.service.removeMember(currentUser(req), projectId, userId);
    res.status(204).end();
  };
}
