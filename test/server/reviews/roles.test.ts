import { makeImageRow } from '../../support/catalogue-fixtures';
import { sql } from '../db-state';
import type { Scene } from '../role-actors';
import { eachReviewRouteForEachActor, type ReviewRouteCase } from './review-route-matrix';
import { reviewRecords } from './review-fixtures';

/** What a route needs to succeed when the role allows it: the image's review state and a thread in a given status. */
interface Ready {
  imageId: string;
  threadId: string;
}


const image = (s: Scene, r: Ready) => `/api/projects/${s.project.id}/images/${r.imageId}`;
const thread = (s: Scene, r: Ready) => `${image(s, r)}/threads/${r.threadId}`;
const ROUTES: ReviewRouteCase<Ready>[] = [
  { route: 'GET …/review', action: 'read', ok: 200, call: (c, s, r) => c.get(`${image(s, r)}/review`) },
  { route: 'POST …/review/submit', action: 'submitForReview', ok: 200, call: (c, s, r) => c.post(`${image(s, r)}/review/submit`, {}) },
  { route: 'POST …/review/request-changes', action: 'decideReview', ok: 200, state: 'with_reviewers', call: (c, s, r) => c.post(`${image(s, r)}/review/request-changes`, { note: 'Redo.' }) },
  // Clearing needs every thread resolved.
  { route: 'POST …/review/clear', action: 'decideReview', ok: 200, state: 'with_reviewers', thread: 'resolved', call: (c, s, r) => c.post(`${image(s, r)}/review/clear`, {}) },
  { route: 'POST …/review/reopen', action: 'reopenReview', ok: 200, state: 'cleared', call: (c, s, r) => c.post(`${image(s, r)}/review/reopen`, {}) },
  { route: 'GET …/review/snapshots', action: 'read', ok: 200, call: (c, s, r) => c.get(`${image(s, r)}/review/snapshots`) },
  { route: 'GET …/threads', action: 'read', ok: 200, call: (c, s, r) => c.get(`${image(s, r)}/threads`) },
  { route: 'POST …/threads', action: 'comment', ok: 201, call: (c, s, r) => c.post(`${image(s, r)}/threads`, { anchor: { kind: 'point', at: [1, 2] }, body: 'Why?' }) },
  { route: 'POST …/threads/:id/comments', action: 'comment', ok: 201, thread: 'open', call: (c, s, r) => c.post(`${thread(s, r)}/comments`, { body: 'Because.' }) },
  { route: 'POST …/threads/:id/resolve', action: 'comment', ok: 200, thread: 'open', call: (c, s, r) => c.post(`${thread(s, r)}/resolve`) },
  { route: 'POST …/threads/:id/reopen', action: 'comment', ok: 200, thread: 'resolved', call: (c, s, r) => c.post(`${thread(s, r)}/reopen`) },
  { route: 'GET /comment-counts', action: 'read', ok: 200, call: (c, s) => c.get(`/api/projects/${s.project.id}/comment-counts`) },
];

/** An image in the state the route needs, and a thread (opened by the project's lead) in the status it needs. */
async function ready(s: Scene, r: ReviewRouteCase<Ready>): Promise<Ready> {
  const imageId = await makeImageRow(s.project.id, s.owner);
  if (r.state) {
    await sql(
      `INSERT INTO review_states (subject_type, subject_id, project_id, image_id, state, submitted_by, submitted_at, updated_by) VALUES ('image', $1, $2, $1, $3, $4, now(), $4)`,
      [imageId, s.project.id, r.state, s.owner.id],
    );
  }
  const resolved = r.thread === 'resolved';
  const [row] = await sql<{ id: string }>(
    `INSERT INTO comment_threads (project_id, image_id, anchor_kind, anchor, created_by, status, resolved_by, resolved_at)
     VALUES ($1, $2, 'point', '{"kind":"point","at":[3,4]}', $3, $4, $5, $6) RETURNING id`,
    [s.project.id, imageId, s.owner.id, resolved ? 'resolved' : 'open', resolved ? s.owner.id : null, resolved ? new Date() : null],
  );
  await sql(`INSERT INTO comments (thread_id, author_id, body) VALUES ($1, $2, 'Opening remark.')`, [row!.id, s.owner.id]);
  return { imageId, threadId: row!.id };
}

describe('reviews: the roles matrix on every review and comment route (from PERMISSIONS)', function () {
  eachReviewRouteForEachActor(ROUTES, ready, (s, t) => reviewRecords(s.project.id, t.imageId));
});
