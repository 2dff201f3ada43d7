import type { ProjectDetail, ProjectMember, ProjectSummary } from '../../shared/projects';
import { can, PROJECT_ACTIONS, type ProjectRole, type SiteRole } from '../../shared/roles';
import type { ProjectMembership } from './project-membership.entity';
import type { Project } from './project.entity';

export function toProjectSummary(project: Project, memberCount: number, myRole: ProjectRole | null): ProjectSummary {
  return {
    id: project.id,
    code: project.code,
    name: project.name,
    description: project.description,
    status: project.status,
    memberCount,
    myRole,
    createdAt: project.createdAt.toISOString(),
    updatedAt: project.updatedAt.toISOString(),
  };
}

export function toProjectMember(m: ProjectMembership): ProjectMember {
  return { userId: m.userId, email: m.user.email, displayName: m.user.displayName, role: m.role, addedAt: m.addedAt.toISOString() };
}

export function toProjectDetail(project: Project, members: ProjectMembership[], siteRole: SiteRole, myRole: ProjectRole | null): ProjectDetail {
  return {
    ...toProjectSummary(project, members.length, myRole),
    members: members.map(toProjectMember),
    allowed: PROJECT_ACTIONS.filter((action) => can(siteRole, myRole, action)),
  };
}
