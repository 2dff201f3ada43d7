import type { EntityManager } from 'typeorm';
import type { NotificationKind } from '../../shared/notifications';
import type { ReviewSubject } from '../reviews/review-subject';
import type { NotificationFacts } from './notification.entity';

/** One event to tell people about. */
export interface NotifyInput {
  kind: NotificationKind;
  recipientIds: readonly string[];
  actorId: string;
  projectId: string;
  /** The image or figure it is about; the mail links there. */
  subject: ReviewSubject;
  threadId?: string | null;
  facts: NotificationFacts;
}

/**
 * Writes one notification per recipient, in the caller's transaction, so it commits or rolls back
 * with the change it tells about. Nobody hears of their own doing; accounts that are inactive, no
 * longer in the project or set to "off" get nothing. Immediate ones wait for the worker's relay,
 * the rest for the daily digest. Returns the recipients written.
 */
export async function notify(m: EntityManager, input: NotifyInput): Promise<string[]> {
  const ids = [...new Set(input.recipientIds)].filter((id) => id !== input.actorId);
  if (ids.length === 0) return [];
  const rows: { recipient_id: string }[] = await m.query(
    `INSERT INTO notifications (recipient_id, kind, project_id, image_id, figure_id, thread_id, actor_id, facts, status)
     SELECT u.id, $2, $3, $4, $8, $5, $6, $7,
            CASE COALESCE(s.delivery, 'immediate') WHEN 'immediate' THEN 'queued' ELSE 'awaiting_digest' END
       FROM users u
       LEFT JOIN notification_settings s ON s.user_id = u.id
      WHERE u.id = ANY($1::uuid[]) AND u.active
        AND COALESCE(s.delivery, 'immediate') <> 'off'
        AND (u.site_role = 'admin' OR EXISTS (SELECT 1 FROM project_memberships pm WHERE pm.project_id = $3 AND pm.user_id = u.id))
     RETURNING recipient_id`,
    [
      ids,
      input.kind,
      input.projectId,
      input.subject.type === 'image' ? input.subject.id : null,
      input.threadId ?? null,
      input.actorId,
      JSON.stringify(input.facts),
      input.subject.type === 'figure' ? input.subject.id : null,
    ],
  );
  return rows.map((r) => r.recipient_id);
}

/** The names a message about this image needs, read in the same transaction. */
export async function imageFacts(m: EntityManager, imageId: string, actorId: string): Promise<NotificationFacts> {
  const [row] = await m.query(
    `SELECT p.code AS project_code, i.original_name, (SELECT display_name FROM users WHERE id = $2) AS actor_name
       FROM images i JOIN projects p ON p.id = i.project_id WHERE i.id = $1`,
    [imageId, actorId],
  );
  return { projectCode: row?.project_code ?? '', imageName: row?.original_name ?? 'an image', actorName: row?.actor_name ?? 'Someone' };
}

/** The names a message about this figure needs, read in the same transaction. */
export async function figureFacts(m: EntityManager, figureId: string, actorId: string): Promise<NotificationFacts> {
  const [row] = await m.query(
    `SELECT p.code AS project_code, f.title, (SELECT display_name FROM users WHERE id = $2) AS actor_name
       FROM figures f JOIN projects p ON p.id = f.project_id WHERE f.id = $1`,
    [figureId, actorId],
  );
  return { projectCode: row?.project_code ?? '', figureTitle: row?.title ?? 'a figure', actorName: row?.actor_name ?? 'Someone' };
}

/** The names a message about `subject` needs. */
export function subjectFacts(m: EntityManager, subject: ReviewSubject, actorId: string): Promise<NotificationFacts> {
  return subject.type === 'image' ? imageFacts(m, subject.id, actorId) : figureFacts(m, subject.id, actorId);
}

/** The start of a comment for a message: first 200 characters, on one line. */
export function excerpt(body: string): string {
  const flat = body.replace(/\s+/g, ' ').trim();
  return flat.length > 200 ? `${flat.slice(0, 199)}…` : flat;
}
