import { mkdir, readdir, rm } from 'node:fs/promises';
import path from 'node:path';
import type { Logger } from 'pino';
import sharp from 'sharp';
import type { DataSource } from 'typeorm';
import { deepZoomLevelCount, TILE_SIZE, totalTileCount } from '../../shared/tile-pyramid';
import type { Config } from '../config';
import { Image } from '../images/image.entity';
import { imageKeys, PREVIEW_EDGE, THUMBNAIL_EDGE } from '../images/image-keys';
import type { FileStore } from '../storage/file-store';
import { displaySource } from './display-source';

/** What a derivatives run needs; the worker and the tests build it from an app context. */
export interface DerivativesDeps {
  dataSource: DataSource;
  files: FileStore;
  config: Config;
  logger: Logger;
}

/** Which delivery of the job this is, from pg-boss, to tell a last attempt from one that will be retried. */
export interface Attempt {
  retryCount: number;
  retryLimit: number;
}

/** A failure that another attempt cannot fix (the file itself is bad): the image fails at once. */
export class PermanentJobError extends Error {}

const TILE_NAME = /^(\d+)_(\d+)\.jpeg$/;

/**
 * Makes the thumbnail, the preview and the Deep Zoom tile set of one image and marks it ready.
 * Idempotent: every file has a fixed key (tiles are cleared before they are written again) and
 * the row is only updated, so a retry or a second delivery never duplicates files or rows.
 */
export async function makeDerivatives(deps: DerivativesDeps, imageId: string, attempt: Attempt): Promise<void> {
  const images = deps.dataSource.getRepository(Image);
  const image = await images.findOneBy({ id: imageId });
  // Deleted since it was queued, or finished by an earlier delivery: nothing to do.
  if (!image || image.state === 'ready') return;
  await images.update({ id: imageId }, { state: 'processing', progress: 1, attempts: image.attempts + 1, updatedAt: new Date() });
  const progress = progressWriter(deps, imageId);
  const work = path.join(deps.config.storageDir, 'tmp', 'jobs', imageId);
  await rm(work, { recursive: true, force: true });
  await mkdir(work, { recursive: true });
  try {
    const source = deps.files.pathOnDisk?.(image.originalKey) ?? (await download(deps.files, image.originalKey, path.join(work, 'original')));
    const display = await decoding(() => displaySource(source, image, deps.config.images.maxPixels));
    const { projectId } = image;

    const preview = path.join(work, 'preview.jpg');
    await decoding(() => display().resize(PREVIEW_EDGE, PREVIEW_EDGE, { fit: 'inside', withoutEnlargement: true }).jpeg({ quality: 85 }).toFile(preview));
    const thumbnail = path.join(work, 'thumbnail.jpg');
    // From the preview, not the original: one full decode fewer (the preview is already 8-bit and flattened).
    await decoding(() => sharp(preview).resize(THUMBNAIL_EDGE, THUMBNAIL_EDGE, { fit: 'inside', withoutEnlargement: true }).jpeg({ quality: 80 }).toFile(thumbnail));
    await progress.set(10);

    const expected = totalTileCount(image.width, image.height);
    const pyramid = path.join(work, 'pyramid');
    const watching = setInterval(() => void countTiles(`${pyramid}_files`).then((n) => progress.set(10 + Math.floor((70 * n) / expected))), 500);
    try {
      await decoding(() => display().jpeg({ quality: 85 }).tile({ size: TILE_SIZE, overlap: 0, layout: 'dz' }).toFile(pyramid));
    } finally {
      clearInterval(watching);
    }
    await progress.set(80);

    await deps.files.putFile(imageKeys.preview(projectId, imageId), preview, 'image/jpeg');
    await deps.files.putFile(imageKeys.thumbnail(projectId, imageId), thumbnail, 'image/jpeg');
    await deps.files.deletePrefix(imageKeys.tiles(projectId, imageId));
    const uploaded = await uploadTiles(deps.files, `${pyramid}_files`, projectId, imageId, (n) => progress.set(80 + Math.floor((19 * n) / expected)));
    if (uploaded !== expected) throw new Error(`The tiler wrote ${uploaded} tiles; the pyramid needs ${expected}.`);

    const done = await images.update({ id: imageId }, { state: 'ready', progress: 100, failureReason: null, pyramidLevels: deepZoomLevelCount(image.width, image.height), updatedAt: new Date() });
    // Deleted while we worked: take our files away with it.
    if (!done.affected) await deps.files.deletePrefix(imageKeys.derivatives(projectId, imageId));
  } catch (err) {
    const final = err instanceof PermanentJobError || attempt.retryCount >= attempt.retryLimit;
    const reason = reasonOf(err);
    deps.logger.warn({ err, imageId, final }, 'derivatives failed');
    await images.update(
      { id: imageId },
      final
        ? { state: 'failed', progress: 0, failureReason: reason, updatedAt: new Date() }
        : { state: 'queued', progress: 0, failureReason: `Attempt ${attempt.retryCount + 1} failed (${reason}); it will be tried again.`, updatedAt: new Date() },
    );
    // pg-boss retries what throws, with back-off; a final failure is recorded and not thrown.
    if (!final) throw err;
  } finally {
    progress.stop();
    await rm(work, { recursive: true, force: true });
  }
}

/** Runs a sharp step; a failure to decode the original is permanent, anything else may be retried. */
async function decoding<T>(step: () => Promise<T>): Promise<T> {
  try {
    return await step();
  } catch (err) {
    const message = String((err as Error)?.message ?? err);
    if (/ENOSPC|no space|EMFILE|ENOMEM|out of memory/i.test(message)) throw err;
    throw new PermanentJobError(`The image could not be decoded: ${message.split('\n')[0]}`);
  }
}

/** Copies an original out of a store that has no local path (S3) into `target`. */
export async function download(files: FileStore, key: string, target: string): Promise<string> {
  const stream = await files.get(key);
  if (!stream) throw new PermanentJobError('The original file is missing from storage.');
  const { createWriteStream } = await import('node:fs');
  const { pipeline } = await import('node:stream/promises');
  await pipeline(stream, createWriteStream(target));
  return target;
}

async function countTiles(dir: string): Promise<number> {
  try {
    return (await readdir(dir, { recursive: true })).filter((name) => name.endsWith('.jpeg')).length;
  } catch {
    // The tiler has not made its folder yet.
    return 0;
  }
}

/**
 * Puts `<level>/<col>_<row>.jpeg` files into the store as `tiles/<level>/<col>_<row>.jpg`. Only
 * names of that shape go: the tiler's vips-properties.xml (the image's full metadata) stays behind.
 */
async function uploadTiles(files: FileStore, dir: string, projectId: string, imageId: string, onCount: (n: number) => Promise<void>): Promise<number> {
  const jobs: { file: string; level: number; column: number; row: number }[] = [];
  for (const level of await readdir(dir)) {
    if (!/^\d+$/.test(level)) continue;
    for (const name of await readdir(path.join(dir, level))) {
      const m = TILE_NAME.exec(name);
      if (m) jobs.push({ file: path.join(dir, level, name), level: Number(level), column: Number(m[1]), row: Number(m[2]) });
    }
  }
  let next = 0;
  let uploaded = 0;
  const lane = async () => {
    while (next < jobs.length) {
      const t = jobs[next++]!;
      await files.putFile(imageKeys.tile(projectId, imageId, t.level, t.column, t.row), t.file, 'image/jpeg');
      if (++uploaded % 200 === 0) await onCount(uploaded);
    }
  };
  // A few uploads in flight hide S3 round trips; the local store barely notices.
  await Promise.all(Array.from({ length: 8 }, lane));
  return uploaded;
}

/** Writes progress to the row at most every half second and only when it grows. */
function progressWriter(deps: DerivativesDeps, imageId: string) {
  let shown = 1;
  let last = 0;
  let stopped = false;
  return {
    async set(pct: number) {
      const value = Math.min(99, Math.max(shown, Math.floor(pct)));
      if (stopped || value === shown || Date.now() - last < 500) return;
      shown = value;
      last = Date.now();
      await deps.dataSource.query(`UPDATE images SET progress = $2 WHERE id = $1 AND state = 'processing'`, [imageId, value]);
    },
    stop() {
      stopped = true;
    },
  };
}

function reasonOf(err: unknown): string {
  return String((err as Error)?.message ?? err).split('\n')[0]!.slice(0, 500);
}
