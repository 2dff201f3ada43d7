import path from 'node:path';
import type { Config } from '../config';
import type { FileStore } from './file-store';
import { LocalFileStore } from './local-file-store';
import { S3FileStore } from './s3-file-store';

/** The store the configuration names: `storage/files` locally, or the configured S3 bucket. */
export function createFileStore(config: Config): FileStore {
  if (config.files.driver === 's3') return new S3FileStore(config.files.s3);
  return new LocalFileStore(path.join(config.storageDir, 'files'));
}
