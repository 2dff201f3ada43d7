import { expect } from 'chai';
import type { User } from '../../../server/auth/user.entity';
import { addDefaultAnnotationClasses } from '../../../server/annotations/default-classes';
import type { ApiClient } from '../../support/api-client';
import { makeImageRow } from '../../support/catalogue-fixtures';
import { makeProject, makeUser, signedIn } from '../../support/fixtures';
import { runningServer } from '../../support/test-server';
import { sql } from '../db-state';

/** A project with one member per role, a signed-in stranger, the default annotation classes and one image row. */
export interface ReviewScene {
  projectId: string;
  imageId: string;
  people: { lead: User; researcher: User; reviewer: User; guest: User; outsider: User };
  lead: ApiClient;
  researcher: ApiClient;
  reviewer: ApiClient;
  guest: ApiClient;
  outsider: ApiClient;
}

export async function reviewScene(url: string): Promise<ReviewScene> {
  const [lead, researcher, reviewer, guest, outsider] = await Promise.all([makeUser(), makeUser(), makeUser(), makeUser(), makeUser()]);
  const projectId = (await makeProject([[lead, 'lead'], [researcher, 'researcher'], [reviewer, 'reviewer'], [guest, 'guest']])).id;
  await addDefaultAnnotationClasses(runningServer().ctx.dataSource.manager, projectId);
  const imageId = await makeImageRow(projectId, researcher, { width: 2000, height: 1500 }, 0.5);
  const clients = await Promise.all([lead, researcher, reviewer, guest, outsider].map((u) => signedIn(url, u)));
  return {
    projectId,
    imageId,
    people: { lead, researcher, reviewer, guest, outsider },
    lead: clients[0]!,
    researcher: clients[1]!,
    reviewer: clients[2]!,
    guest: clients[3]!,
    outsider: clients[4]!,
  };
}

export const reviewPath = (s: { projectId: string }, imageId: string) => `/api/projects/${s.projectId}/images/${imageId}/review`;
export const threadsPath = (s: { projectId: string }, imageId: string) => `/api/projects/${s.projectId}/images/${imageId}/threads`;

/** Makes a move through the API and insists it worked. */
export async function move(client: ApiClient, s: { projectId: string }, imageId: string, to: 'submit' | 'request-changes' | 'clear' | 'reopen', note = ''): Promise<void> {
  const res = await client.post(`${reviewPath(s, imageId)}/${to}`, { note });
  expect(res.status, JSON.stringify(res.body)).to.equal(200);
}

/** Submitted by the researcher and cleared by the reviewer. */
export async function clearImage(s: ReviewScene, imageId = s.imageId): Promise<void> {
  await move(s.researcher, s, imageId, 'submit');
  await move(s.reviewer, s, imageId, 'clear', 'Scale and interfaces checked.');
}

/** A stored measurement row, as the measuring bench leaves one, for snapshots and pins. */
export async function measurementRow(s: ReviewScene, imageId: string, umPerPx = 0.5): Promise<string> {
  const [row] = await sql<{ id: string }>(
    `INSERT INTO measurements (project_id, image_id, kind, definition, layout, result, where_label, um_per_px, pixel_size_source, author_id, updated_by)
     VALUES ($1, $2, 'intercept', $3, '{}', $4, 'layer 2', $5, 'user', $6, $6) RETURNING id`,
    [s.projectId, imageId, JSON.stringify({ kind: 'intercept', pattern: 'lines' }), JSON.stringify({ kind: 'intercept', meanInterceptUm: 20.1, g: 8.0 }), umPerPx, s.people.researcher.id],
  );
  return row!.id;
}

/** Everything a review move or a comment may write, for "nothing changed" checks. */
export async function reviewRecords(projectId: string, imageId: string): Promise<unknown> {
  return {
    state: await sql('SELECT * FROM review_states WHERE subject_id = $1', [imageId]),
    events: await sql('SELECT id FROM review_events WHERE subject_id = $1 ORDER BY seq', [imageId]),
    snapshots: await sql('SELECT id FROM review_snapshots WHERE subject_id = $1 ORDER BY seq', [imageId]),
    threads: await sql('SELECT * FROM comment_threads WHERE image_id = $1 ORDER BY id', [imageId]),
    comments: await sql('SELECT c.* FROM comments c JOIN comment_threads t ON t.id = c.thread_id WHERE t.image_id = $1 ORDER BY c.id', [imageId]),
    activity: await sql('SELECT id FROM activity_events WHERE project_id = $1 ORDER BY seq', [projectId]),
    notifications: await sql('SELECT id FROM notifications WHERE project_id = $1 ORDER BY id', [projectId]),
  };
}

/** Notifications written for one person about one image, oldest first. */
export function notificationsFor(userId: string, imageId: string): Promise<{ kind: string; status: string; thread_id: string | null; facts: Record<string, string> }[]> {
  return sql('SELECT kind, status, thread_id, facts FROM notifications WHERE recipient_id = $1 AND image_id = $2 ORDER BY created_at', [userId, imageId]);
}

/** The review state stored for an image ('draft' when nobody has moved it yet). */
export async function stateOf(imageId: string): Promise<string> {
  const [row] = await sql<{ state: string }>('SELECT state FROM review_states WHERE subject_id = $1', [imageId]);
  return row?.state ?? 'draft';
}
