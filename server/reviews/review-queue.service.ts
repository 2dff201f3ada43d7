import type { Modality } from '../../shared/images';
import type { Page } from '../../shared/paging';
import type { ReviewQueueItem, ReviewQueueQuery } from '../../shared/reviews';
import { can, type ProjectRole } from '../../shared/roles';
import type { AppContext } from '../app-context';
import { AppError } from '../http/app-error';

interface QueueRow {
  image_id: string;
  project_id: string;
  project_code: string;
  original_name: string;
  modality: Modality;
  specimen_code: string;
  submitted_by: string;
  submitter_name: string;
  submitted_at: Date;
  open_threads: number;
}

/** A reviewer's queue: images with reviewers in the projects where the caller reviews, oldest submission first. */
export class ReviewQueueService {
  constructor(private readonly ctx: AppContext) {}

  async queue(user: Express.User, q: ReviewQueueQuery): Promise<Page<ReviewQueueItem>> {
    if (q.projectId) await this.checkReviewer(user, q.projectId);
    const params: unknown[] = [user.id];
    const where = [`r.subject_type = 'image'`, `r.state = 'with_reviewers'`];
    const add = (clause: (n: string) => string, value: unknown) => {
      params.push(value);
      where.push(clause(`$${params.length}`));
    };
    if (q.projectId) add((n) => `i.project_id = ${n}`, q.projectId);
    if (q.modality) add((n) => `i.modality = ANY(${n}::text[])`, q.modality);
    if (q.submitterId) add((n) => `r.submitted_by = ${n}`, q.submitterId);
    const from = `
         FROM review_states r
         JOIN images i ON i.id = r.image_id
         JOIN projects p ON p.id = i.project_id
         JOIN specimens s ON s.id = i.specimen_id
         JOIN users u ON u.id = r.submitted_by
         JOIN project_memberships pm ON pm.project_id = i.project_id AND pm.user_id = $1 AND pm.role = 'reviewer'
        WHERE ${where.join(' AND ')}`;
    const [{ total }] = await this.ctx.dataSource.query(`SELECT count(*)::int AS total ${from}`, params);
    const rows: QueueRow[] = await this.ctx.dataSource.query(
      `SELECT i.id AS image_id, i.project_id, p.code AS project_code, i.original_name, i.modality, s.code AS specimen_code,
              r.submitted_by, u.display_name AS submitter_name, r.submitted_at,
              (SELECT count(*)::int FROM comment_threads t WHERE t.image_id = i.id AND t.status = 'open') AS open_threads
         ${from}
        ORDER BY r.submitted_at ASC, i.id
        LIMIT $${params.length + 1} OFFSET $${params.length + 2}`,
      [...params, q.pageSize, q.page * q.pageSize],
    );
    return {
      items: rows.map((r) => ({
        imageId: r.image_id,
        projectId: r.project_id,
        projectCode: r.project_code,
        imageName: r.original_name,
        modality: r.modality,
        specimenCode: r.specimen_code,
        submittedBy: { id: r.submitted_by, name: r.submitter_name },
        submittedAt: new Date(r.submitted_at).toISOString(),
        openThreads: r.open_threads,
      })),
      total: total as number,
      page: q.page,
      pageSize: q.pageSize,
    };
  }

  /** Asking for one project's queue: strangers cannot see it (404), members who do not review get 403. */
  private async checkReviewer(user: Express.User, projectId: string): Promise<void> {
    const [project]: { role: ProjectRole | null }[] = await this.ctx.dataSource.query(
      `SELECT (SELECT role FROM project_memberships WHERE project_id = p.id AND user_id = $2) AS role FROM projects p WHERE p.id = $1`,
      [projectId, user.id],
    );
    if (!project || (project.role === null && user.siteRole !== 'admin')) throw AppError.notFound('The project');
    if (!can(user.siteRole, project.role, 'decideReview')) {
      throw AppError.forbidden(`Your role in this project (${project.role ?? 'none'}) does not review; the queue lists images waiting for its reviewers.`);
    }
  }
}
