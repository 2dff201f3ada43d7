import type { Readable } from 'node:stream';

/**
 * Where originals and derivatives live: a local folder by default, or an S3-compatible bucket.
 * Keys are slash-separated paths that the server builds itself (never from user input).
 */
export interface FileStore {
  /**
   * Stores the file at `localPath` under `key`, replacing what was there. The source may be
   * moved rather than copied, so callers remove it afterwards only if it still exists.
   */
  putFile(key: string, localPath: string, contentType: string): Promise<void>;
  /** The object's bytes as a stream, or null when there is no such object. */
  get(key: string): Promise<Readable | null>;
  /** Size of the object, or null when there is none. */
  stat(key: string): Promise<{ size: number } | null>;
  /** Removes the object; removing a missing object is not an error (deletes must be retryable). */
  delete(key: string): Promise<void>;
  /** Every key under a prefix (e.g. `images/<id>/`), sorted. */
  list(prefix: string): Promise<string[]>;
  /** Removes every object under a prefix; returns how many went. */
  deletePrefix(prefix: string): Promise<number>;
  /** A path to read the object in place, for stores on the local disk (saves copying a 2 GB original). */
  pathOnDisk?(key: string): string | null;
}

const KEY = /^[A-Za-z0-9_-][A-Za-z0-9._-]*(\/[A-Za-z0-9_-][A-Za-z0-9._-]*)*$/;

/** Refuses keys that could leave the store's root (`..`, absolute paths, empty segments). */
export function assertSafeKey(key: string): void {
  if (!KEY.test(key) || key.split('/').some((s) => s === '..' || s === '.')) {
    throw new Error(`Refusing an unsafe storage key: ${JSON.stringify(key)}`);
  }
}

/** Same rule for prefixes, which end in a slash. */
export function assertSafePrefix(prefix: string): void {
  if (!prefix.endsWith('/')) throw new Error(`A storage prefix ends with "/": ${JSON.stringify(prefix)}`);
  assertSafeKey(prefix.slice(0, -1));
}
