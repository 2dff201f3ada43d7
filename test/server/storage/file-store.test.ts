import { createHash, randomBytes } from 'node:crypto';
import { existsSync } from 'node:fs';
import { mkdtemp, rm, writeFile } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import type { Readable } from 'node:stream';
import { expect } from 'chai';
import type { FileStore } from '../../../server/storage/file-store';
import { LocalFileStore } from '../../../server/storage/local-file-store';
import { unique } from '../../support/fixtures';
import { startFakeS3, type FakeS3 } from './fake-s3';

async function bytesOf(stream: Readable): Promise<Buffer> {
  const chunks: Buffer[] = [];
  for await (const c of stream) chunks.push(c as Buffer);
  return Buffer.concat(chunks);
}

const sha = (b: Buffer) => createHash('sha256').update(b).digest('hex');

/** The same behaviour is asked of every store; `make` gives a fresh one. */
function describeStore(name: string, make: () => Promise<{ store: FileStore; close(): Promise<void> }>) {
  describe(`file store: ${name}`, () => {
    let store: FileStore;
    let close: () => Promise<void>;
    let scratch: string;

    before(async () => {
      ({ store, close } = await make());
      scratch = await mkdtemp(path.join(os.tmpdir(), 'etchfile-store-test-'));
    });
    after(async () => {
      await close();
      await rm(scratch, { recursive: true, force: true });
    });

    async function scratchFile(bytes: Buffer): Promise<string> {
      const file = path.join(scratch, unique());
      await writeFile(file, bytes);
      return file;
    }

    it('when a file is put, then it reads back byte for byte with its size', async () => {
      const bytes = randomBytes(300_000);
      const key = `t/${unique()}/original`;
      await store.putFile(key, await scratchFile(bytes), 'application/octet-stream');
      expect(await store.stat(key)).to.deep.equal({ size: bytes.length });
      expect(sha(await bytesOf((await store.get(key))!))).to.equal(sha(bytes));
    });

    it('when a key is put twice, then the second content replaces the first', async () => {
      const key = `t/${unique()}/thumb.jpg`;
      await store.putFile(key, await scratchFile(Buffer.from('first')), 'image/jpeg');
      await store.putFile(key, await scratchFile(Buffer.from('second!')), 'image/jpeg');
      expect((await bytesOf((await store.get(key))!)).toString()).to.equal('second!');
    });

    it('when an object is missing, then stat and get answer null and delete does not fail', async () => {
      const key = `t/${unique()}/nothing`;
      expect(await store.stat(key)).to.equal(null);
      expect(await store.get(key)).to.equal(null);
      await store.delete(key);
    });

    it('when objects sit under a prefix, then list names exactly them and deletePrefix removes exactly them', async () => {
      const base = `t/${unique()}`;
      const inside = [`${base}/tiles/0/0_0.jpg`, `${base}/tiles/1/0_0.jpg`, `${base}/tiles/1/1_0.jpg`];
      const beside = `${base}/thumb.jpg`;
      for (const k of [...inside, beside]) await store.putFile(k, await scratchFile(Buffer.from(k)), 'image/jpeg');
      expect(await store.list(`${base}/tiles/`)).to.deep.equal([...inside].sort());
      expect(await store.deletePrefix(`${base}/tiles/`)).to.equal(3);
      expect(await store.list(`${base}/tiles/`)).to.deep.equal([]);
      expect(await store.stat(beside)).to.not.equal(null);
    });

    it('when a key tries to climb out of the store, then it is refused before any I/O', async () => {
      for (const bad of ['../etc/passwd', 'a/../../b', '/abs', 'a//b', '']) {
        let failed = false;
        try {
          await store.stat(bad);
        } catch {
          failed = true;
        }
        expect(failed, bad).to.equal(true);
      }
    });
  });
}

describeStore('local folder', async () => {
  const root = await mkdtemp(path.join(os.tmpdir(), 'etchfile-local-store-'));
  return { store: new LocalFileStore(root), close: () => rm(root, { recursive: true, force: true }) };
});

describeStore('S3 (s3rver on loopback)', async () => {
  const fake: FakeS3 = await startFakeS3();
  return fake;
});

describe('file store: local folder specifics', () => {
  it('when a file is put, then the source is moved into the store rather than left behind', async () => {
    const root = await mkdtemp(path.join(os.tmpdir(), 'etchfile-local-store-'));
    const source = path.join(root, 'incoming');
    await writeFile(source, 'x');
    await new LocalFileStore(path.join(root, 'files')).putFile('a/b', source, 'text/plain');
    expect(existsSync(source)).to.equal(false);
    expect(existsSync(path.join(root, 'files', 'a', 'b'))).to.equal(true);
    await rm(root, { recursive: true, force: true });
  });
});
