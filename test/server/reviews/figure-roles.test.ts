import { expect } from 'chai';
import type { ProjectAction } from '../../../shared/roles';
import type { ApiClient } from '../../support/api-client';
import { mountApp } from '../../support/api-client';
import { sql } from '../db-state';
import { ACTORS, expectedOutcome, sceneFor, who, type Scene } from '../role-actors';
import { figureReviewRecords, FIXTURE_SIZE, imageWithOriginal } from './figure-review-fixtures';

/** What a route needs to succeed when the role allows it: the figure in a review state and a thread on it in a given status. */
interface Ready {
  figureId: string;
  threadId: string;
}

interface RouteCase {
  route: string;
  action: ProjectAction;
  ok: number;
  /** The review state the figure must be in for the move to be possible. */
  state?: 'with_reviewers' | 'cleared';
  /** The status the thread must have for the route to be possible. */
  thread?: 'open' | 'resolved';
  call(c: ApiClient, s: Scene, r: Ready): Promise<{ status: number; body: unknown }>;
}

const figure = (s: Scene, r: Ready) => `/api/projects/${s.project.id}/figures/${r.figureId}`;
const thread = (s: Scene, r: Ready) => `${figure(s, r)}/threads/${r.threadId}`;
const ROUTES: RouteCase[] = [
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
async function ready(s: Scene, r: RouteCase): Promise<Ready> {
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
  let app: Awaited<ReturnType<typeof mountApp>>;
  before(async () => (app = await mountApp()));
  after(() => app.close());

  for (const r of ROUTES) {
    describe(`figure ${r.route} (needs ${r.action})`, () => {
      for (const actor of ACTORS) {
        const outcome = expectedOutcome(actor, r.action);
        it(`when a ${who(actor)} calls it on a figure, then ${outcome === 'allowed' ? r.ok : outcome}${outcome === 'allowed' ? '' : ' and nothing changes'}`, async () => {
          const s = await sceneFor(app.url, actor);
          const target = await ready(s, r);
          const before = await figureReviewRecords(s.project.id, target.figureId);
          const res = await r.call(s.client, s, target);
          expect(res.status, JSON.stringify(res.body)).to.equal(outcome === 'allowed' ? r.ok : outcome);
          if (outcome !== 'allowed') expect(await figureReviewRecords(s.project.id, target.figureId)).to.deep.equal(before);
        });
      }
    });
  }
});
