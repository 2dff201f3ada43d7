import type { Modality } from '../../shared/images';
import type { Page } from '../../shared/paging';
import type { ReviewQueueItem, ReviewQueueQuery, ReviewSubjectType } from '../../shared/reviews';
import { can, type ProjectRole } from '../../shared/roles';
import type { AppContext } from '../app-context';
import { AppError } from '../http/app-error';

interface QueueRow {
  subject_type: ReviewSubjectType;
  subject_id: string;
  name: string;
  project_id: string;
  project_code: string;
  modality: Modality | null;
  specimen_code: string | null;
  panel_count: number | null;
  submitted_by: string;
  submitter_name: string;
  submitted_at: Date;
  open_threads: number;
}

/**
 * A reviewer's queue: images and figures with reviewers in the projects where the caller reviews,
 * oldest submission first. Both kinds come from one query, so paging and order hold across them.
 */
export class ReviewQueueService {
  constructor(private readonly ctx: AppContext) {}

  async queue(user: Express.User, q: ReviewQueueQuery): Promise<Page<ReviewQueueItem>> {
    if (q.projectId) await this.checkReviewer(user, q.projectId);
    const params: unknown[] = [user.id];
    const where = [`r.state = 'with_reviewers'`];
    const add = (clause: (n: string) => string, value: unknown) => {
      params.push(value);
      where.push(clause(`$${params.length}`));
    };
    if (q.projectId) add((n) => `r.project_id = ${n}`, q.projectId);
    // Figures have no modality: asking for one leaves them out.
    if (q.modality) add((n) => `i.modality = ANY(${n}::text[])`, q.modality);
    if (q.submitterId) add((n) => `r.submitted_by = ${n}`, q.submitterId);
    if (q.subjectType) add((n) => `r.subject_type = ${n}`, q.subjectType);
    const from = `
         FROM review_states r
         LEFT JOIN images i ON i.id = r.image_id
         LEFT JOIN specimens s ON s.id = i.specimen_id
         LEFT JOIN figures f ON f.id = r.figure_id
         JOIN projects p ON p.id = r.project_id
         JOIN users u ON u.id = r.submitted_by
         JOIN project_memberships pm ON pm.project_id = r.project_id AND pm.user_id = $1 AND pm.role = 'reviewer'
        WHERE ${where.join(' AND ')}`;
    const [{ total }] = await this.ctx.dataSource.query(`SELECT count(*)::int AS total ${from}`, params);
    const rows: QueueRow[] = await this.ctx.dataSource.query(
      `SELECT r.subject_type, r.subject_id, COALESCE(i.original_name, f.title) AS name, r.project_id, p.code AS project_code,
              i.modality, s.code AS specimen_code, jsonb_array_length(f.spec->'panels') AS panel_count,
              r.submitted_by, u.display_name AS submitter_name, r.submitted_at,
              (SELECT count(*)::int FROM comment_threads t
                WHERE (t.image_id = r.image_id OR t.figure_id = r.figure_id) AND t.status = 'open') AS open_threads
         ${from}
        ORDER BY r.submitted_at ASC, r.subject_id
        LIMIT $${params.length + 1} OFFSET $${params.length + 2}`,
      [...params, q.pageSize, q.page * q.pageSize],
    );
    return {
      items: rows.map((r) => ({
        subjectType: r.subject_type,
        subjectId: r.subject_id,
        name: r.name,
        projectId: r.project_id,
        projectCode: r.project_code,
        modality: r.modality,
        specimenCode: r.specimen_code,
        panelCount: r.panel_count,
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
      throw AppError.forbidden(`Your role in this project (${project.role ?? 'none'}) does not review; the queue lists images and figures waiting for its reviewers.`);
    }
  }
}
