import type { EntityManager } from 'typeorm';
import { subjectColumn, type ReviewSubject } from './review-subject';

/**
 * Everyone involved in the review of an image or a figure: whoever submitted it, the reviewers who
 * asked for changes or cleared it, and everyone who wrote in or was mentioned in one of its threads.
 */
export async function involvedInReview(m: EntityManager, subject: ReviewSubject): Promise<string[]> {
  const rows: { id: string }[] = await m.query(
    `SELECT submitted_by AS id FROM review_states WHERE subject_type = $2 AND subject_id = $1 AND submitted_by IS NOT NULL
     UNION SELECT actor_id FROM review_events WHERE subject_type = $2 AND subject_id = $1 AND reason IN ('requestChanges', 'clear')
     UNION SELECT ${participantsOf(`t.${subjectColumn(subject)} = $1`)}`,
    [subject.id, subject.type],
  );
  return rows.map((r) => r.id);
}

/** Who wrote in a thread or was mentioned in it. */
export async function threadParticipants(m: EntityManager, threadId: string): Promise<string[]> {
  const rows: { id: string }[] = await m.query(`SELECT DISTINCT ${participantsOf('t.id = $1')}`, [threadId]);
  return rows.map((r) => r.id);
}

/** The select list and joins giving authors and mentioned members of the threads matching `where`. */
function participantsOf(where: string): string {
  return `p.id FROM comment_threads t
            JOIN comments c ON c.thread_id = t.id
            CROSS JOIN LATERAL unnest(array_append(c.mentions, c.author_id)) AS p(id)
           WHERE ${where}`;
}

/** Project members holding `role`, e.g. the reviewers to tell about a submission. */
export async function membersWithRole(m: EntityManager, projectId: string, role: string): Promise<string[]> {
  const rows: { user_id: string }[] = await m.query(`SELECT user_id FROM project_memberships WHERE project_id = $1 AND role = $2`, [projectId, role]);
  return rows.map((r) => r.user_id);
}
