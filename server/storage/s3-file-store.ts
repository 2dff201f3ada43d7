import { createReadStream } from 'node:fs';
import { stat } from 'node:fs/promises';
import type { Readable } from 'node:stream';
import {
  DeleteObjectCommand,
  DeleteObjectsCommand,
  GetObjectCommand,
  HeadObjectCommand,
  ListObjectsV2Command,
  PutObjectCommand,
  S3Client,
} from '@aws-sdk/client-s3';
import { assertSafeKey, assertSafePrefix, type FileStore } from './file-store';

export interface S3Settings {
  endpoint?: string;
  region: string;
  bucket: string;
  accessKeyId?: string;
  secretAccessKey?: string;
  /** Needed by most self-hosted S3 servers (and the fake one in the tests). */
  forcePathStyle: boolean;
}

/** Objects in one bucket of an S3-compatible service. */
export class S3FileStore implements FileStore {
  private readonly s3: S3Client;
  private readonly bucket: string;

  constructor(settings: S3Settings) {
    this.bucket = settings.bucket;
    this.s3 = new S3Client({
      region: settings.region,
      endpoint: settings.endpoint,
      forcePathStyle: settings.forcePathStyle,
      // Newer SDKs send streamed bodies as aws-chunked with trailing checksums, which many
      // S3-compatible servers store verbatim; checksums only where the API requires them.
      requestChecksumCalculation: 'WHEN_REQUIRED',
      responseChecksumValidation: 'WHEN_REQUIRED',
      credentials: settings.accessKeyId && settings.secretAccessKey ? { accessKeyId: settings.accessKeyId, secretAccessKey: settings.secretAccessKey } : undefined,
    });
  }

  async putFile(key: string, localPath: string, contentType: string): Promise<void> {
    assertSafeKey(key);
    const { size } = await stat(localPath);
    // A single PUT takes up to 5 GB, above the upload limit; ContentLength lets the SDK stream the file.
    await this.s3.send(new PutObjectCommand({ Bucket: this.bucket, Key: key, Body: createReadStream(localPath), ContentLength: size, ContentType: contentType }));
  }

  async get(key: string): Promise<Readable | null> {
    assertSafeKey(key);
    try {
      const res = await this.s3.send(new GetObjectCommand({ Bucket: this.bucket, Key: key }));
      return res.Body as Readable;
    } catch (err) {
      if (isNotFound(err)) return null;
      throw err;
    }
  }

  async stat(key: string): Promise<{ size: number } | null> {
    assertSafeKey(key);
    try {
      const res = await this.s3.send(new HeadObjectCommand({ Bucket: this.bucket, Key: key }));
      return { size: res.ContentLength ?? 0 };
    } catch (err) {
      if (isNotFound(err)) return null;
      throw err;
    }
  }

  async delete(key: string): Promise<void> {
    assertSafeKey(key);
    await this.s3.send(new DeleteObjectCommand({ Bucket: this.bucket, Key: key }));
  }

  async list(prefix: string): Promise<string[]> {
    assertSafePrefix(prefix);
    const keys: string[] = [];
    let token: string | undefined;
    do {
      const page = await this.s3.send(new ListObjectsV2Command({ Bucket: this.bucket, Prefix: prefix, ContinuationToken: token }));
      for (const o of page.Contents ?? []) if (o.Key) keys.push(o.Key);
      token = page.IsTruncated ? page.NextContinuationToken : undefined;
    } while (token);
    return keys.sort();
  }

  async deletePrefix(prefix: string): Promise<number> {
    const keys = await this.list(prefix);
    // DeleteObjects takes at most 1000 keys per call (S3 API reference).
    for (let i = 0; i < keys.length; i += 1000) {
      const batch = keys.slice(i, i + 1000).map((Key) => ({ Key }));
      await this.s3.send(new DeleteObjectsCommand({ Bucket: this.bucket, Delete: { Objects: batch, Quiet: true } }));
    }
    return keys.length;
  }

  /** Closes the client's sockets (tests and shutdown). */
  destroy(): void {
    this.s3.destroy();
  }
}

// The SDK reports a missing object as NoSuchKey on GET and as a bare 404 NotFound on HEAD.
function isNotFound(err: unknown): boolean {
  const e = err as { name?: string; $metadata?: { httpStatusCode?: number } };
  return e?.name === 'NoSuchKey' || e?.name === 'NotFound' || e?.$metadata?.httpStatusCode === 404;
}
