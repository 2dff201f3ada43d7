import type { EntityManager } from 'typeorm';
import type { Page } from '../../shared/paging';
import type {
  AddMemberBody,
  CreateProjectBody,
  ListProjectsQuery,
  ProjectDetail,
  ProjectMember,
  ProjectSummary,
  UpdateProjectBody,
} from '../../shared/projects';
import type { ProjectRole } from '../../shared/roles';
import type { AppContext } from '../app-context';
import { recordActivity } from '../activity/record-activity';
import { addDefaultAnnotationClasses } from '../annotations/default-classes';
import { User } from '../auth/user.entity';
import { AppError } from '../http/app-error';
import { ProjectMembership } from './project-membership.entity';
import { Project } from './project.entity';
import { toProjectDetail, toProjectMember, toProjectSummary } from './project.mapper';

const SORT_COLUMNS: Record<ListProjectsQuery['sort'], string> = {
  name: 'p.name',
  code: 'p.code',
  status: 'p.status',
  createdAt: 'p.created_at',
  updatedAt: 'p.updated_at',
};

/** Projects and their members. Access is checked by the routes; these rules keep the data sound. */
export class ProjectsService {
  constructor(private readonly ctx: AppContext) {}

  private get ds() {
    return this.ctx.dataSource;
  }

  /** Members see their projects; site admins see all. */
  async list(user: Express.User, query: ListProjectsQuery): Promise<Page<ProjectSummary>> {
    const qb = this.ds
      .getRepository(Project)
      .createQueryBuilder('p')
      .leftJoin(ProjectMembership, 'mine', 'mine.project_id = p.id AND mine.user_id = :uid', { uid: user.id })
      .addSelect('mine.role', 'my_role')
      .addSelect('(SELECT count(*) FROM project_memberships pm WHERE pm.project_id = p.id)::int', 'member_count');
    if (user.siteRole !== 'admin') qb.andWhere('mine.user_id IS NOT NULL');
    if (query.status !== 'all') qb.andWhere('p.status = :status', { status: query.status });
    if (query.q) {
      qb.andWhere('(p.name ILIKE :q OR p.code ILIKE :q OR p.description ILIKE :q)', { q: `%${escapeLike(query.q)}%` });
    }
    const total = await qb.getCount();
    const { entities, raw } = await qb
      .orderBy(SORT_COLUMNS[query.sort], query.dir === 'asc' ? 'ASC' : 'DESC')
      .addOrderBy('p.id', 'ASC')
      .offset(query.page * query.pageSize)
      .limit(query.pageSize)
      .getRawAndEntities();
    const items = entities.map((p, i) => toProjectSummary(p, Number(raw[i].member_count), raw[i].my_role ?? null));
    return { items, total, page: query.page, pageSize: query.pageSize };
  }

  /** The creator becomes the project's first lead; the project starts with the usual annotation classes. */
  async create(user: Express.User, body: CreateProjectBody): Promise<ProjectDetail> {
    const id = await this.ds.transaction(async (m) => {
      if (await m.existsBy(Project, { code: body.code })) {
        throw new AppError(409, 'conflict', `A project with code ${body.code} already exists.`, [
          { field: 'body.code', message: 'This code is taken.' },
        ]);
      }
      const project = await m.save(m.create(Project, body));
      await m.insert(ProjectMembership, { projectId: project.id, userId: user.id, role: 'lead' });
      await addDefaultAnnotationClasses(m, project.id);
      await recordActivity(m, { projectId: project.id, actorId: user.id, action: 'project.created', summary: `created the project ${body.code}` });
      return project.id;
    });
    return this.detail(user, id, 'lead');
  }

  async detail(user: Express.User, projectId: string, myRole: ProjectRole | null): Promise<ProjectDetail> {
    const project = await this.ds.getRepository(Project).findOneByOrFail({ id: projectId });
    return toProjectDetail(project, await this.members(projectId), user.siteRole, myRole);
  }

  async update(user: Express.User, projectId: string, body: UpdateProjectBody, myRole: ProjectRole | null): Promise<ProjectDetail> {
    await this.ds.transaction(async (m) => {
      await m.update(Project, { id: projectId }, body);
      const what = body.status ? (body.status === 'archived' ? 'archived the project' : 'restored the project') : `edited ${Object.keys(body).join(' and ')}`;
      await recordActivity(m, { projectId, actorId: user.id, action: 'project.updated', summary: what });
    });
    return this.detail(user, projectId, myRole);
  }

  async addMember(actor: Express.User, projectId: string, body: AddMemberBody): Promise<ProjectMember> {
    return this.ds.transaction(async (m) => {
      const user = await m.findOneBy(User, { email: body.email });
      if (!user) {
        throw new AppError(404, 'not_found', `No account uses ${body.email}. Ask a site administrator to invite them first.`, [
          { field: 'body.email', message: 'No account uses this address.' },
        ]);
      }
      if (!user.active) throw AppError.conflict(`The account ${body.email} is deactivated.`);
      if (await m.existsBy(ProjectMembership, { projectId, userId: user.id })) {
        throw AppError.conflict(`${user.displayName} is already a member of this project.`);
      }
      await m.insert(ProjectMembership, { projectId, userId: user.id, role: body.role });
      await m.update(Project, { id: projectId }, { updatedAt: new Date() });
      await recordActivity(m, { projectId, actorId: actor.id, action: 'member.added', summary: `added ${user.displayName} as ${body.role}` });
      return toProjectMember(await m.findOneOrFail(ProjectMembership, { where: { projectId, userId: user.id }, relations: { user: true } }));
    });
  }

  async changeMemberRole(actor: Express.User, projectId: string, userId: string, role: ProjectRole): Promise<ProjectMember> {
    return this.ds.transaction(async (m) => {
      const membership = await this.lockedMembership(m, projectId, userId);
      if (membership.role === 'lead' && role !== 'lead') await this.keepOneLead(m, projectId);
      const before = membership.role;
      membership.role = role;
      await m.save(membership);
      await recordActivity(m, { projectId, actorId: actor.id, action: 'member.changed', summary: `made ${membership.user.displayName} ${role} (was ${before})` });
      return toProjectMember(membership);
    });
  }

  async removeMember(actor: Express.User, projectId: string, userId: string): Promise<void> {
    await this.ds.transaction(async (m) => {
      const membership = await this.lockedMembership(m, projectId, userId);
      if (membership.role === 'lead') await this.keepOneLead(m, projectId);
      await m.delete(ProjectMembership, { projectId, userId });
      await recordActivity(m, { projectId, actorId: actor.id, action: 'member.removed', summary: `removed ${membership.user.displayName} (${membership.role})` });
    });
  }

  private members(projectId: string): Promise<ProjectMembership[]> {
    return this.ds.getRepository(ProjectMembership).find({
      where: { projectId },
      relations: { user: true },
      order: { role: 'ASC', addedAt: 'ASC' },
    });
  }

  private async lockedMembership(m: EntityManager, projectId: string, userId: string): Promise<ProjectMembership> {
    // Lock the project's memberships so two leads demoting each other at once cannot leave none.
    await m.query('SELECT 1 FROM project_memberships WHERE project_id = $1 FOR UPDATE', [projectId]);
    const membership = await m.findOne(ProjectMembership, { where: { projectId, userId }, relations: { user: true } });
    if (!membership) throw AppError.notFound('That member');
    return membership;
  }

  private async keepOneLead(m: EntityManager, projectId: string): Promise<void> {
    const leads = await m.countBy(ProjectMembership, { projectId, role: 'lead' });
    if (leads <= 1) throw AppError.conflict('A project needs at least one lead. Make someone else lead first.');
  }
}

function escapeLike(text: string): string {
  return text.replace(/[\\%_]/g, (c) => `\\${c}`);
}
