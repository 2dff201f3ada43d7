import { randomUUID } from 'node:crypto';
import { createReadStream } from 'node:fs';
import { copyFile, mkdir, readdir, rename, rm, stat } from 'node:fs/promises';
import path from 'node:path';
import type { Readable } from 'node:stream';
import { assertSafeKey, assertSafePrefix, type FileStore } from './file-store';

/** Objects as files under one folder; keys map to relative paths. */
export class LocalFileStore implements FileStore {
  constructor(readonly root: string) {}

  async putFile(key: string, localPath: string, _contentType: string): Promise<void> {
    const target = this.pathOf(key);
    await mkdir(path.dirname(target), { recursive: true });
    try {
      // Same file system: a rename is instant and atomic, which matters for 2 GB originals.
      await rename(localPath, target);
    } catch (err) {
      // EXDEV: the upload folder is on another file system; copy beside the target, then rename into place.
      if ((err as NodeJS.ErrnoException).code !== 'EXDEV') throw err;
      const partial = `${target}.partial-${randomUUID()}`;
      await copyFile(localPath, partial);
      await rename(partial, target);
    }
  }

  async get(key: string): Promise<Readable | null> {
    if (!(await this.stat(key))) return null;
    return createReadStream(this.pathOf(key));
  }

  async stat(key: string): Promise<{ size: number } | null> {
    try {
      const s = await stat(this.pathOf(key));
      return s.isFile() ? { size: s.size } : null;
    } catch (err) {
      // ENOENT/ENOTDIR: no such object, which callers ask about on purpose.
      if (['ENOENT', 'ENOTDIR'].includes((err as NodeJS.ErrnoException).code ?? '')) return null;
      throw err;
    }
  }

  async delete(key: string): Promise<void> {
    await rm(this.pathOf(key), { force: true });
  }

  async list(prefix: string): Promise<string[]> {
    assertSafePrefix(prefix);
    const dir = path.join(this.root, prefix);
    try {
      const entries = await readdir(dir, { recursive: true, withFileTypes: true });
      return entries
        .filter((e) => e.isFile())
        .map((e) => prefix + path.relative(dir, path.join(e.parentPath, e.name)).split(path.sep).join('/'))
        .sort();
    } catch (err) {
      // ENOENT: nothing was ever stored under this prefix.
      if ((err as NodeJS.ErrnoException).code === 'ENOENT') return [];
      throw err;
    }
  }

  async deletePrefix(prefix: string): Promise<number> {
    const keys = await this.list(prefix);
    await rm(path.join(this.root, prefix), { recursive: true, force: true });
    return keys.length;
  }

  pathOnDisk(key: string): string {
    return this.pathOf(key);
  }

  private pathOf(key: string): string {
    assertSafeKey(key);
    return path.join(this.root, ...key.split('/'));
  }
}
