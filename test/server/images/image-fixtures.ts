import { randomBytes } from 'node:crypto';
import { readdir } from 'node:fs/promises';
import path from 'node:path';
import sharp, { type TiffOptions } from 'sharp';
import type { User } from '../../../server/auth/user.entity';
import { Material } from '../../../server/archive/material.entity';
import { SampleLayer } from '../../../server/archive/sample-layer.entity';
import { Sample } from '../../../server/archive/sample.entity';
import { SpecimenLocation } from '../../../server/archive/specimen-location.entity';
import { Specimen } from '../../../server/archive/specimen.entity';
import type { Project } from '../../../server/projects/project.entity';
import type { ProcessingState } from '../../../shared/images';
import type { ProjectRole } from '../../../shared/roles';
import type { ApiClient } from '../../support/api-client';
import { makeProject, makeUser, signedIn, unique } from '../../support/fixtures';
import { runningServer } from '../../support/test-server';
import { testConfig } from '../../support/test-config';
import { sql } from '../db-state';

/** Random pixels, so every test's file has bytes of its own (no accidental duplicates). */
export function noise(width: number, height: number, channels: 1 | 3 | 4 = 3) {
  return sharp(randomBytes(width * height * channels), { raw: { width, height, channels } });
}

/** An 8-bit TIFF (no compression, so its bytes are predictable), optionally with resolution tags or a description. */
export function tiff(width = 320, height = 240, options: TiffOptions = {}, channels: 1 | 3 = 3): Promise<Buffer> {
  const image = noise(width, height, channels);
  if (channels === 1) image.toColourspace('b-w');
  return image.tiff({ compression: 'lzw', ...options }).toBuffer();
}

/** A 16-bit grey TIFF whose samples span `low`…`high` along x (a ramp), from raw Uint16 input. */
export function tiff16(width: number, height: number, low: number, high: number): Promise<Buffer> {
  const px = new Uint16Array(width * height);
  for (let i = 0; i < px.length; i++) px[i] = Math.round(low + ((high - low) * (i % width)) / (width - 1)) ^ (i % 3);
  return sharp(px, { raw: { width, height, channels: 1 } }).toColourspace('grey16').tiff({ compression: 'lzw' }).toBuffer();
}

export const png = (w = 300, h = 200) => noise(w, h).png().toBuffer();
export const jpeg = (w = 300, h = 200) => noise(w, h).jpeg().toBuffer();
export const webp = (w = 300, h = 200) => noise(w, h).webp().toBuffer();

/** A project with a material, a sample, a specimen with one location, and `user` in `role`. */
export interface ArchiveScene {
  project: Project;
  user: User;
  client: ApiClient;
  materialId: string;
  sampleId: string;
  specimenId: string;
  locationId: string;
}

export async function archiveScene(baseUrl: string, role: ProjectRole = 'researcher'): Promise<ArchiveScene> {
  const ds = runningServer().ctx.dataSource;
  const user = await makeUser();
  const project = await makeProject([[user, role]]);
  const tag = unique();
  const material = await ds.getRepository(Material).save({ projectId: project.id, designation: `M-${tag}`, composition: { wtPct: {}, balance: null } });
  const sample = await ds.getRepository(Sample).save({ projectId: project.id, code: `S-${tag}`, name: 'Test laminate' });
  await ds.getRepository(SampleLayer).insert({ sampleId: sample.id, position: 0, materialId: material.id, thicknessMm: 1 });
  const specimen = await ds.getRepository(Specimen).save({
    projectId: project.id,
    sampleId: sample.id,
    code: `SP-${tag}`,
    sectionPlane: 'longitudinal',
    preparation: { steps: [], etchant: '', etchingTimeS: null },
  });
  const location = await ds.getRepository(SpecimenLocation).save({ specimenId: specimen.id, name: 'interface 1, centre' });
  const client = await signedIn(baseUrl, user);
  return { project, user, client, materialId: material.id, sampleId: sample.id, specimenId: specimen.id, locationId: location.id };
}

export interface UploadResponse {
  status: number;
  body: any;
  headers: Headers;
}

/** Sends one file as the client does: multipart with the file in "file" and the fields beside it. */
export async function upload(client: ApiClient, projectId: string, bytes: Buffer, name: string, fields: Record<string, string>): Promise<UploadResponse> {
  const form = new FormData();
  for (const [k, v] of Object.entries(fields)) form.append(k, v);
  form.append('file', new Blob([new Uint8Array(bytes)]), name);
  const res = await fetch(`${client.baseUrl}/api/projects/${projectId}/images`, { method: 'POST', body: form, headers: await client.authHeaders() });
  const text = await res.text();
  return { status: res.status, headers: res.headers, body: (res.headers.get('content-type') ?? '').includes('json') ? JSON.parse(text) : text };
}

/** The usual fields for a scene: its specimen and location, bright field. */
export const fieldsFor = (s: ArchiveScene, extra: Record<string, string> = {}) => ({ specimenId: s.specimenId, locationId: s.locationId, modality: 'lom_bright_field', ...extra });

/** Waits until the image reaches one of `states` (the in-process worker makes derivatives), then returns the row. */
export async function waitForState(imageId: string, states: ProcessingState[] = ['ready', 'failed'], timeoutMs = 30_000): Promise<Record<string, any>> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const [row] = await sql('SELECT * FROM images WHERE id = $1', [imageId]);
    if (row && states.includes(row['state'] as ProcessingState)) return row;
    if (Date.now() > deadline) throw new Error(`image ${imageId} is still ${row?.['state']} after ${timeoutMs} ms`);
    await new Promise((r) => setTimeout(r, 100));
  }
}

/** Files still in the upload folder (should be none once a request has been answered). */
export async function tempUploads(): Promise<string[]> {
  try {
    return await readdir(path.join(testConfig.storageDir, 'tmp', 'uploads'));
  } catch {
    return [];
  }
}

/** What a refused upload must not leave: rows, stored files or temporary files. */
export async function leftovers(projectId: string): Promise<{ rows: number; stored: string[]; temp: string[] }> {
  const [{ n }] = (await sql<{ n: number }>('SELECT count(*)::int AS n FROM images WHERE project_id = $1', [projectId])) as [{ n: number }];
  return { rows: n, stored: await runningServer().ctx.files.list(`projects/${projectId}/`), temp: await tempUploads() };
}

export const NOTHING_LEFT = { rows: 0, stored: [], temp: [] };
