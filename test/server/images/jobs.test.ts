import { randomUUID } from 'node:crypto';
import { expect } from 'chai';
import { makeDerivatives } from '../../../server/jobs/derivatives.job';
import { DERIVATIVES_QUEUE } from '../../../server/jobs/queue';
import { mountApp } from '../../support/api-client';
import { runningServer } from '../../support/test-server';
import { sql } from '../db-state';
import { expectApiError } from '../error-shape';
import { startFakeS3 } from '../storage/fake-s3';
import { archiveScene, fieldsFor, png, tiff, upload, waitForState } from './image-fixtures';

const deps = () => {
  const { dataSource, files, config, logger } = runningServer().ctx;
  return { dataSource, files, config, logger };
};

describe('images: derivatives jobs', () => {
  let app: Awaited<ReturnType<typeof mountApp>>;
  before(async () => (app = await mountApp()));
  after(() => app.close());

  it('when a finished job runs again, then no file or row is duplicated and the image stays ready', async () => {
    const s = await archiveScene(app.url);
    const res = await upload(s.client, s.project.id, await tiff(600, 300), 'again.tif', fieldsFor(s));
    await waitForState(res.body.image.id, ['ready']);
    const before = await runningServer().ctx.files.list(`projects/${s.project.id}/`);
    // Force a second full run, as a retried delivery would after a crash just before "ready".
    await sql(`UPDATE images SET state = 'processing' WHERE id = $1`, [res.body.image.id]);
    await makeDerivatives(deps(), res.body.image.id, { retryCount: 0, retryLimit: 3 });
    expect(await runningServer().ctx.files.list(`projects/${s.project.id}/`)).to.deep.equal(before);
    const rows = await sql('SELECT state, progress FROM images WHERE project_id = $1', [s.project.id]);
    expect(rows).to.deep.equal([{ state: 'ready', progress: 100 }]);
  });

  it('when the original cannot be decoded, then the image fails at once with the reason, and retry is refused until then', async () => {
    const s = await archiveScene(app.url);
    const res = await upload(s.client, s.project.id, await png(), 'soon-broken.png', fieldsFor(s));
    const id = res.body.image.id;
    await waitForState(id, ['ready']);
    expectApiError(await s.client.post(`/api/projects/${s.project.id}/images/${id}/retry`), 409, 'conflict');
    // Damage the kept original behind the app's back, then make it again.
    const [{ original_key }] = await sql<{ original_key: string }>('SELECT original_key FROM images WHERE id = $1', [id]);
    const { writeFile } = await import('node:fs/promises');
    await writeFile(runningServer().ctx.files.pathOnDisk!(original_key)!, Buffer.from('\x89PNG\r\n\x1a\nbroken'));
    await sql(`UPDATE images SET state = 'queued' WHERE id = $1`, [id]);
    await makeDerivatives(deps(), id, { retryCount: 0, retryLimit: 3 });
    const [row] = await sql('SELECT state, failure_reason FROM images WHERE id = $1', [id]);
    expect(row!['state']).to.equal('failed');
    expect(row!['failure_reason']).to.match(/could not be decoded/);
    const detail = await s.client.get(`/api/projects/${s.project.id}/images/${id}`);
    expect(detail.body.processing).to.include({ state: 'failed' });
    expect(detail.body.processing.failureReason).to.match(/could not be decoded/);
  });

  it('when a failed image is retried, then 202, it is queued again and the worker makes it ready', async () => {
    const s = await archiveScene(app.url);
    const res = await upload(s.client, s.project.id, await png(), 'retry.png', fieldsFor(s));
    const id = res.body.image.id;
    await waitForState(id, ['ready']);
    await sql(`UPDATE images SET state = 'failed', failure_reason = 'disk full (simulated)', pyramid_levels = NULL WHERE id = $1`, [id]);
    const retried = await s.client.post(`/api/projects/${s.project.id}/images/${id}/retry`);
    expect(retried.status, JSON.stringify(retried.body)).to.equal(202);
    expect(retried.body.processing).to.include({ state: 'queued', failureReason: null });
    expect((await waitForState(id, ['ready']))['state']).to.equal('ready');
  });

  it('when a worker dies holding a job, then after the job expires it is retried and the image becomes ready', async () => {
    const s = await archiveScene(app.url);
    const res = await upload(s.client, s.project.id, await png(), 'orphan.png', fieldsFor(s));
    const id = res.body.image.id;
    await waitForState(id, ['ready']);
    await sql(`UPDATE images SET state = 'processing', progress = 35, pyramid_levels = NULL WHERE id = $1`, [id]);
    const boss = runningServer().ctx.jobs.boss;
    // A job no live worker polls for yet (starts in an hour), taken by a "worker" that then dies.
    const jobId = randomUUID();
    await boss.send(DERIVATIVES_QUEUE, { imageId: id }, { id: jobId, startAfter: new Date(Date.now() + 3600_000), expireInSeconds: 1, retryLimit: 2, retryDelay: 0 });
    const [taken] = await boss.fetch(DERIVATIVES_QUEUE, { ignoreStartAfter: true, batchSize: 1 });
    expect(taken?.id).to.equal(jobId);
    await new Promise((r) => setTimeout(r, 1500));
    await boss.expire();
    expect((await boss.getJobById(DERIVATIVES_QUEUE, jobId))?.state).to.equal('retry');
    expect((await waitForState(id, ['ready'], 20_000))['state']).to.equal('ready');
  });

  it('when the store is S3, then the derivatives land in the bucket with the same layout', async function () {
    this.timeout(30_000);
    const fake = await startFakeS3('etchfile-jobs');
    try {
      const s = await archiveScene(app.url);
      const res = await upload(s.client, s.project.id, await tiff(300, 300), 's3.tif', fieldsFor(s));
      const id = res.body.image.id;
      await waitForState(id, ['ready']);
      // Copy the original into the bucket, then make the derivatives there.
      const [{ original_key }] = await sql<{ original_key: string }>('SELECT original_key FROM images WHERE id = $1', [id]);
      const { copyFile, mkdtemp } = await import('node:fs/promises');
      const tmp = `${await mkdtemp('/tmp/etchfile-s3job-')}/original`;
      await copyFile(runningServer().ctx.files.pathOnDisk!(original_key)!, tmp);
      await fake.store.putFile(original_key, tmp, 'image/tiff');
      await sql(`UPDATE images SET state = 'queued' WHERE id = $1`, [id]);
      await makeDerivatives({ ...deps(), files: fake.store }, id, { retryCount: 0, retryLimit: 3 });
      const local = (await runningServer().ctx.files.list(`projects/${s.project.id}/images/`)).sort();
      expect(await fake.store.list(`projects/${s.project.id}/images/`)).to.deep.equal(local);
      expect((await sql('SELECT state FROM images WHERE id = $1', [id]))[0]!['state']).to.equal('ready');
    } finally {
      await fake.close();
    }
  });
});
