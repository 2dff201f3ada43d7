import { randomBytes } from 'node:crypto';
import { mkdtemp, rm, writeFile } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import { expect } from 'chai';
import type { User } from '../../../server/auth/user.entity';
import { addDefaultAnnotationClasses } from '../../../server/annotations/default-classes';
import { imageKeys } from '../../../server/images/image-keys';
import type { InterceptMark } from '../../../shared/measurements/measurements';
import type { ApiClient, ApiResponse } from '../../support/api-client';
import { makeImageRow } from '../../support/catalogue-fixtures';
import { makeProject, makeUser, signedIn } from '../../support/fixtures';
import { runningServer } from '../../support/test-server';
import { sql } from '../db-state';

/** A project with one member per role, the default annotation classes and one image row (no file) with a pixel size. */
export interface MeasureScene {
  projectId: string;
  specimenId: string;
  imageId: string;
  researcherUser: User;
  researcher: ApiClient;
  lead: ApiClient;
  reviewer: ApiClient;
  guest: ApiClient;
  /** Annotation class ids by name. */
  classes: Record<string, string>;
}

export async function measureScene(url: string, size = { width: 2000, height: 1500 }, pixelSizeUm: number | null = 0.5): Promise<MeasureScene> {
  const [r, l, v, g] = await Promise.all([makeUser(), makeUser(), makeUser(), makeUser()]);
  const projectId = (await makeProject([[r, 'researcher'], [l, 'lead'], [v, 'reviewer'], [g, 'guest']])).id;
  await addDefaultAnnotationClasses(runningServer().ctx.dataSource.manager, projectId);
  const imageId = await makeImageRow(projectId, r, size, pixelSizeUm);
  const [{ specimen_id: specimenId }] = await sql<{ specimen_id: string }>('SELECT specimen_id FROM images WHERE id = $1', [imageId]);
  const [researcher, lead, reviewer, guest] = await Promise.all([signedIn(url, r), signedIn(url, l), signedIn(url, v), signedIn(url, g)]);
  const classes = Object.fromEntries((await sql<{ id: string; name: string }>('SELECT id, name FROM annotation_classes WHERE project_id = $1', [projectId])).map((c) => [c.name, c.id]));
  return { projectId, specimenId: specimenId!, imageId, researcherUser: r, researcher, lead, reviewer, guest, classes };
}

/** Another image row (no file) on the scene's specimen, for fields across one specimen. */
export async function addImage(s: MeasureScene, size = { width: 2000, height: 1500 }, pixelSizeUm = 0.5): Promise<string> {
  const [image] = await sql<{ id: string }>(
    `INSERT INTO images (project_id, specimen_id, uploader_id, modality, original_name, sha256, byte_size, format, width, height, bit_depth, channels,
                         original_key, pixel_size_um, pixel_size_source, state, pyramid_levels)
     VALUES ($1, $2, $3, 'lom_bright_field', $4, $5, 1000, 'tiff', $6, $7, 8, 1, 'fixture', $8, 'user', 'ready', 13) RETURNING id`,
    [s.projectId, s.specimenId, s.researcherUser.id, `field-${randomBytes(3).toString('hex')}.tif`, randomBytes(32).toString('hex'), size.width, size.height, pixelSizeUm],
  );
  return image!.id;
}

export const measurementsPath = (s: { projectId: string }, imageId: string) => `/api/projects/${s.projectId}/images/${imageId}/measurements`;

/** Draws an annotation through the API (as the researcher) and returns its id. */
export async function draw(s: MeasureScene, imageId: string, className: string, kind: string, points: [number, number][], label = ''): Promise<string> {
  const res = await s.researcher.post(`/api/projects/${s.projectId}/images/${imageId}/annotations`, { classId: s.classes[className], kind, points, label });
  expect(res.status, JSON.stringify(res.body)).to.equal(201);
  return res.body.id as string;
}

/** `n` crossings spread evenly along a horizontal test line at y from x0 to x1 (ends excluded). */
export function crossingsAlongRow(line: number, y: number, x0: number, x1: number, n: number, kind: InterceptMark['kind'] = 'crossing'): InterceptMark[] {
  return Array.from({ length: n }, (_, i) => ({ x: x0 + ((x1 - x0) * (i + 0.5)) / n, y, line, kind, status: 'confirmed' as const }));
}

/** `n` crossings along a vertical test line at x. */
export function crossingsAlongColumn(line: number, x: number, y0: number, y1: number, n: number): InterceptMark[] {
  return Array.from({ length: n }, (_, i) => ({ x, y: y0 + ((y1 - y0) * (i + 0.5)) / n, line, kind: 'crossing' as const, status: 'confirmed' as const }));
}

/** `n` marks spread evenly around a circle. */
export function marksOnCircle(line: number, centre: [number, number], r: number, n: number, kind: InterceptMark['kind'] = 'crossing', phase = 0.1): InterceptMark[] {
  return Array.from({ length: n }, (_, i) => {
    const a = phase + (2 * Math.PI * i) / n;
    return { x: centre[0] + r * Math.cos(a), y: centre[1] + r * Math.sin(a), line, kind, status: 'confirmed' as const };
  });
}

/** Every stored row of an image's measurements, their history and the image's activity, for "nothing changed" checks. */
export async function measurementState(imageId: string): Promise<unknown> {
  return {
    rows: await sql('SELECT * FROM measurements WHERE image_id = $1 ORDER BY id', [imageId]),
    history: await sql('SELECT * FROM measurement_history WHERE image_id = $1 ORDER BY seq', [imageId]),
    activity: await sql('SELECT * FROM activity_events WHERE image_id = $1 ORDER BY seq', [imageId]),
  };
}

/** Fails with the body when the status is not the expected one. */
export function expectStatus(res: ApiResponse, status: number): void {
  expect(res.status, JSON.stringify(res.body)).to.equal(status);
}

/** Puts real bytes behind an image row, so routes that read its pixels have something to read. */
export async function giveOriginal(projectId: string, imageId: string, bytes: Buffer): Promise<void> {
  const dir = await mkdtemp(path.join(os.tmpdir(), 'etchfile-measure-'));
  const file = path.join(dir, 'original');
  await writeFile(file, bytes);
  const key = imageKeys.original(projectId, randomBytes(32).toString('hex'));
  await runningServer().ctx.files.putFile(key, file, 'application/octet-stream');
  await rm(dir, { recursive: true, force: true });
  await sql('UPDATE images SET original_key = $2 WHERE id = $1', [imageId, key]);
}
