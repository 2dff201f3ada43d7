import { mkdtemp, rm } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import S3rver from 's3rver';
import { S3FileStore } from '../../../server/storage/s3-file-store';

export interface FakeS3 {
  store: S3FileStore;
  close(): Promise<void>;
}

/** A fake S3 server on loopback (an ephemeral port, a temporary folder) with one bucket, and a store pointed at it. */
export async function startFakeS3(bucket = 'etchfile-test'): Promise<FakeS3> {
  const directory = await mkdtemp(path.join(os.tmpdir(), 'etchfile-s3-'));
  const server = new S3rver({ address: '127.0.0.1', port: 0, silent: true, directory, configureBuckets: [{ name: bucket }] });
  const { port } = await server.run();
  const store = new S3FileStore({
    endpoint: `http://127.0.0.1:${port}`,
    region: 'us-east-1',
    bucket,
    // s3rver accepts these fixed credentials (its documented defaults).
    accessKeyId: 'S3RVER',
    secretAccessKey: 'S3RVER',
    forcePathStyle: true,
  });
  return {
    store,
    async close() {
      store.destroy();
      await server.close();
      await rm(directory, { recursive: true, force: true });
    },
  };
}
