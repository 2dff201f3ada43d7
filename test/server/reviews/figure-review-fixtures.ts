import { mkdir, rm, writeFile } from 'node:fs/promises';
import path from 'node:path';
import { expect } from 'chai';
import sharp from 'sharp';
import type { User } from '../../../server/auth/user.entity';
import type { ApiClient } from '../../support/api-client';
import { makeImageRow } from '../../support/catalogue-fixtures';
import { runningServer } from '../../support/test-server';
import { sql } from '../db-state';

/** Image rows of these tests: small, so a figure renders in a blink. */
export const FIXTURE_SIZE = { width: 320, height: 240 };

/**
 * An image row with a real original behind it (a seeded grey gradient with stripes, 8-bit, one band,
 * as the row says), stored through the FileStore, so figures showing it can be rendered.
 */
export async function imageWithOriginal(projectId: string, uploader: User, seed = 1, pixelSizeUm: number | null = 0.5): Promise<string> {
  const imageId = await makeImageRow(projectId, uploader, FIXTURE_SIZE, pixelSizeUm);
  const { width, height } = FIXTURE_SIZE;
  const pixels = Buffer.alloc(width * height);
  for (let y = 0; y < height; y++) for (let x = 0; x < width; x++) pixels[y * width + x] = (x * 3 + y * seed + ((x >> 4) % 2) * 60) % 256;
  const bytes = await sharp(pixels, { raw: { width, height, channels: 1 } }).tiff().toBuffer();
  const ctx = runningServer().ctx;
  const key = `test-originals/${imageId}.tif`;
  const tmp = path.join(ctx.config.storageDir, 'tmp', `fixture-${imageId}.tif`);
  await mkdir(path.dirname(tmp), { recursive: true });
  await writeFile(tmp, bytes);
  try {
    await ctx.files.putFile(key, tmp, 'image/tiff');
  } finally {
    await rm(tmp, { force: true });
  }
  await sql(`UPDATE images SET original_key = $2 WHERE id = $1`, [imageId, key]);
  return imageId;
}

export const figuresPath = (projectId: string) => `/api/projects/${projectId}/figures`;
export const figureReviewPath = (projectId: string, figureId: string) => `${figuresPath(projectId)}/${figureId}/review`;
export const figureThreadsPath = (projectId: string, figureId: string) => `${figuresPath(projectId)}/${figureId}/threads`;

/** A class id of the project by name (the default classes are added by the scenes). */
export async function classIdOf(projectId: string, name: string): Promise<string> {
  const [row] = await sql<{ id: string }>('SELECT id FROM annotation_classes WHERE project_id = $1 AND name = $2', [projectId, name]);
  return row!.id;
}

/**
 * A two-panel figure through the API: panel a shows `imageIds[0]` with the bond interfaces drawn,
 * panel b shows `imageIds[1]` clean. Printed 40 mm wide at 150 dpi, so clearing renders quickly.
 */
export async function makeFigure(client: ApiClient, projectId: string, imageIds: [string, string], title = 'Bond line, two fields'): Promise<{ id: string; version: number }> {
  const interfaces = await classIdOf(projectId, 'Bond interface');
  const res = await client.post(figuresPath(projectId), {
    title,
    columns: 2,
    gapMm: 1,
    widthMm: 40,
    dpi: 150,
    panels: imageIds.map((imageId, i) => ({ imageId, region: { x: 0, y: 0, ...FIXTURE_SIZE }, classIds: i === 0 ? [interfaces] : [], letter: 'ab'[i]!, legend: false })),
  });
  expect(res.status, JSON.stringify(res.body)).to.equal(201);
  return res.body as { id: string; version: number };
}

/** Makes a figure move through the API and insists it worked. */
export async function moveFigure(client: ApiClient, projectId: string, figureId: string, to: 'submit' | 'request-changes' | 'clear' | 'reopen', note = ''): Promise<void> {
  const res = await client.post(`${figureReviewPath(projectId, figureId)}/${to}`, { note });
  expect(res.status, JSON.stringify(res.body)).to.equal(200);
}

/** The review state stored for a figure ('draft' when nobody has moved it yet). */
export async function figureStateOf(figureId: string): Promise<string> {
  const [row] = await sql<{ state: string }>(`SELECT state FROM review_states WHERE subject_type = 'figure' AND subject_id = $1`, [figureId]);
  return row?.state ?? 'draft';
}

/** Everything a figure's review move or comment may write, for "nothing changed" checks. */
export async function figureReviewRecords(projectId: string, figureId: string): Promise<unknown> {
  return {
    figure: await sql('SELECT version, title, spec FROM figures WHERE id = $1', [figureId]),
    state: await sql('SELECT * FROM review_states WHERE subject_id = $1', [figureId]),
    events: await sql('SELECT id FROM review_events WHERE subject_id = $1 ORDER BY seq', [figureId]),
    clearances: await sql('SELECT id FROM figure_clearances WHERE figure_id = $1 ORDER BY seq', [figureId]),
    threads: await sql('SELECT * FROM comment_threads WHERE figure_id = $1 ORDER BY id', [figureId]),
    comments: await sql('SELECT c.* FROM comments c JOIN comment_threads t ON t.id = c.thread_id WHERE t.figure_id = $1 ORDER BY c.id', [figureId]),
    activity: await sql('SELECT id FROM activity_events WHERE project_id = $1 ORDER BY seq', [projectId]),
    notifications: await sql('SELECT id FROM notifications WHERE project_id = $1 ORDER BY id', [projectId]),
  };
}

/** Notifications written for one person about one figure, oldest first. */
export function figureNotificationsFor(userId: string, figureId: string): Promise<{ kind: string; status: string; thread_id: string | null; image_id: string | null; facts: Record<string, string> }[]> {
  return sql('SELECT kind, status, thread_id, image_id, facts FROM notifications WHERE recipient_id = $1 AND figure_id = $2 ORDER BY created_at', [userId, figureId]);
}

/** A downloaded file's bytes and headers. */
export async function download(client: ApiClient, url: string): Promise<{ status: number; type: string | null; bytes: Buffer }> {
  const res = await fetch(`${client.baseUrl}${url}`, { headers: await client.authHeaders() });
  return { status: res.status, type: res.headers.get('content-type'), bytes: Buffer.from(await res.arrayBuffer()) };
}
