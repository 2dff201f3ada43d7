import { createHash, randomUUID } from 'node:crypto';
import { createWriteStream, mkdirSync } from 'node:fs';
import { rm } from 'node:fs/promises';
import path from 'node:path';
import { Transform } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import type { Request } from 'express';
import type { StorageEngine } from 'multer';

/** What the engine adds to `req.file`: where the bytes are, how many, their SHA-256 and first bytes. */
export interface HashedFile {
  path: string;
  size: number;
  sha256: string;
  /** The first HEAD_BYTES bytes (fewer for a smaller file), for identifying the format by content. */
  head: Buffer;
}

export const HEAD_BYTES = 64;

/**
 * A multer storage engine that writes each upload to a temporary file while computing its
 * SHA-256 and keeping its first bytes, so the format is known without reading the file again.
 * `checkHead` may refuse the file as soon as its first bytes arrive (a PDF is not stored whole first).
 */
export class HashingDiskStorage implements StorageEngine {
  constructor(
    private readonly dir: string,
    private readonly checkHead: (head: Buffer) => Error | null,
  ) {
    mkdirSync(dir, { recursive: true });
  }

  _handleFile(_req: Request, file: Express.Multer.File, cb: (error?: unknown, info?: Partial<Express.Multer.File>) => void): void {
    const target = path.join(this.dir, `${randomUUID()}.part`);
    // Set before writing: when the client disconnects, multer removes pending files that have a path.
    file.path = target;
    const hash = createHash('sha256');
    let size = 0;
    let head = Buffer.alloc(0);
    let checked = false;
    const check = () => {
      checked = true;
      return this.checkHead(head);
    };
    const meter = new Transform({
      transform(chunk: Buffer, _enc, done) {
        hash.update(chunk);
        size += chunk.length;
        if (!checked) {
          head = Buffer.concat([head, chunk.subarray(0, HEAD_BYTES - head.length)]);
          if (head.length >= HEAD_BYTES) {
            const refusal = check();
            if (refusal) return done(refusal);
          }
        }
        done(null, chunk);
      },
      flush(done) {
        done(checked ? null : check());
      },
    });
    pipeline(file.stream, meter, createWriteStream(target, { flags: 'wx' })).then(
      () => cb(null, { path: target, size, sha256: hash.digest('hex'), head } as Partial<Express.Multer.File>),
      async (err: unknown) => {
        await rm(target, { force: true });
        // Keep reading so busboy can finish the request after a refusal.
        file.stream.resume();
        cb(err);
      },
    );
  }

  _removeFile(_req: Request, file: Express.Multer.File, cb: (error: Error | null) => void): void {
    rm(file.path, { force: true }).then(() => cb(null), cb);
  }
}
