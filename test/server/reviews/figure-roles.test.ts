import { sql } from '../db-state';
import type { Scene } from '../role-actors';
import { eachReviewRouteForEachActor, type ReviewRouteCase } from './review-route-matrix';
import { figureReviewRecords, FIXTURE_SIZE, imageWithOriginal } from './figure-review-fixtures';

/** What a route needs to succeed when the role allows it: the figure in a review state and a thread on it in a given status. */
interface Ready {
  figureId: string;
  threadId: string;
}


const figure = (s: Scene, r: Ready) => `/api/projects/${s.project.id}/figures/${r.figureId}`;
const thread = (s: Scene, r: Ready) => `${figure(s, r)}/threads/${r.threadId}`;
const ROUTES: ReviewRouteCase<Ready>[] = [
  { route: 'GET …/review', action: 'read', ok: 200, call: (c, s, r) => c.get(`${figure(s, r)}/review`) },
  { route: 'POST …/review/submit', action: 'submitForReview', ok: 200, call: (c, s, r) => c.post(`${figure(s, r)}/review/submit`, {}) },
  { route: 'POST …/review/request-changes', action: 'decideReview', ok: 200, state: 'with_reviewers', call: (c, s, r) => c.post(`${figure(s, r)}/review/request-changes`, { note: 'Redo.' }) },
  // Clearing needs every thread resolved, and renders the figure from the panel image's original.
  { route: 'POST …/review/clear', action: 'decideReview', ok: 200, state: 'with_reviewers', thread: 'resolved', call: (c, s, r) => c.post(`${figure(s, r)}/review/clear`, {}) },
  { route: 'POST …/review/reopen', action: 'reopenReview', ok: 200, state: 'cleared', call: (c, s, r) => c.post(`${figure(s, r)}/review/reopen`, {}) },
  { route: 'GET …/review/clearances', action: 'read', ok: 200, call: (c, s, r) => c.get(`${figure(s, r)}/review/clearances`) },
  { route: 'GET …/threads', action: 'read', ok: 200, call: (c, s, r) => c.get(`${figure(s, r)}/threads`) },
  { route: 'POST …/threads', action: 'comment', ok: 201, call: (c, s, r) => c.post(`${figure(s, r)}/threads`, { anchor: { kind: 'panel', panel: 0 }, body: 'Why?' }) },
  { route: 'POST …/threads/:id/comments', action: 'comment', ok: 201, thread: 'open', call: (c, s, r) => c.post(`${thread(s, r)}/comments`, { body: 'Because.' }) },
  { route: 'POST …/threads/:id/resolve', action: 'comment', ok: 200, thread: 'open', call: (c, s, r) => c.post(`${thread(s, r)}/resolve`) },
  { route: 'POST …/threads/:id/reopen', action: 'comment', ok: 200, thread: 'resolved', call: (c, s, r) => c.post(`${thread(s, r)}/reopen`) },
];

/** A one-panel figure in the state the route needs, and a thread on it (opened by the lead) in the status it needs. */
async function ready(s: Scene, r: ReviewRouteCase<Ready>): Promise<Ready> {
  const imageId = await imageWithOriginal(s.project.id, s.owner);
  const spec = { columns: 1, gapMm: 1, commonScaleBar: true, widthMm: 30, dpi: 100, panels: [{ imageId, region: { x: 0, y: 0, ...FIXTURE_SIZE }, classIds: [], legend: false, letter: 'a', scaleBar: { lengthUm: null, position: 'bottom-right', colour: 'auto', show: true } }] };
  const [row] = await sql<{ id: string }>(`INSERT INTO figures (project_id, title, spec, created_by) VALUES ($1, 'Role plate', $2, $3) RETURNING id`, [s.project.id, JSON.stringify(spec), s.owner.id]);
  const figureId = row!.id;
  if (r.state) {
    await sql(
      `INSERT INTO review_states (subject_type, subject_id, project_id, figure_id, state, submitted_by, submitted_at, updated_by) VALUES ('figure', $1, $2, $1, $3, $4, now(), $4)`,
      [figureId, s.project.id, r.state, s.owner.id],
    );
  }
  const resolved = r.thread === 'resolved';
  const [t] = await sql<{ id: string }>(
    `INSERT INTO comment_threads (project_id, figure_id, anchor_kind, anchor, created_by, status, resolved_by, resolved_at)
     VALUES ($1, $2, 'figure', '{"kind":"figure"}', $3, $4, $5, $6) RETURNING id`,
    [s.project.id, figureId, s.owner.id, resolved ? 'resolved' : 'open', resolved ? s.owner.id : null, resolved ? new Date() : null],
  );
  await sql(`INSERT INTO comments (thread_id, author_id, body) VALUES ($1, $2, 'Opening remark.')`, [t!.id, s.owner.id]);
  return { figureId, threadId: t!.id };
}

describe('reviews: the roles matrix on every figure review and comment route (from PERMISSIONS)', function () {
  this.timeout(30_000);
  eachReviewRouteForEachActor(ROUTES, ready, (s, t) => figureReviewRecords(s.project.id, t.figureId), 'figure');
});
