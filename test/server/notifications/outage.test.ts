import { randomUUID } from 'node:crypto';
import { expect } from 'chai';
import { requeueStranded } from '../../../server/notifications/digest';
import { startFakeSmtp } from '../../../server/mail/fake-smtp';
import { mountApp } from '../../support/api-client';
import { makeImageRow } from '../../support/catalogue-fixtures';
import { waitForMail } from '../../support/mail-box';
import { runningServer } from '../../support/test-server';
import { sql } from '../db-state';
import { mailsTo } from '../mail-links';
import { reviewPath, reviewScene, type ReviewScene } from '../reviews/review-fixtures';
import { deliveries, eventually, MAIL_WAIT_MS } from './notification-fixtures';

describe('notifications: nothing is lost while the mail server is down', () => {
  let app: Awaited<ReturnType<typeof mountApp>>;
  let s: ReviewScene;
  const config = () => runningServer().ctx.config;

  before(async () => {
    app = await mountApp();
    s = await reviewScene(app.url);
  });
  after(() => app.close());

  it('when the mail server is down, then the submission still succeeds, the mail job is retried with back-off, and the mail arrives once, when the server is back', async function () {
    this.timeout(90_000);
    const running = runningServer();
    await running.smtp!.close();
    running.smtp = null;
    try {
      const imageId = await makeImageRow(s.projectId, s.people.researcher, { width: 2000, height: 1500 }, 0.5);
      const res = await s.researcher.post(`${reviewPath(s, imageId)}/submit`, {});
      expect(res.status, 'the request is not held up by mail').to.equal(200);

      let jobId = '';
      await eventually('a failed attempt, waiting for its retry', async () => {
        const [n] = await deliveries(s.people.reviewer.id, imageId);
        if (!n?.job_id) return false;
        jobId = n.job_id;
        const [job] = await sql<{ retry_count: number }>('SELECT retry_count FROM pgboss.job WHERE id = $1', [jobId]);
        return (job?.retry_count ?? 0) >= 1;
      }, 30_000);
      expect((await deliveries(s.people.reviewer.id, imageId)).map((n) => n.status)).to.deep.equal(['mailing']);
      const [job] = await sql<{ retry_limit: number; retry_backoff: boolean }>('SELECT retry_limit, retry_backoff FROM pgboss.job WHERE id = $1', [jobId]);
      expect(job).to.deep.equal({ retry_limit: config().notifications.retryLimit, retry_backoff: true });
      expect(await mailsTo(s.people.reviewer.email)).to.deep.equal([]);

      running.smtp = await startFakeSmtp(config().smtp.host, config().smtp.port, config().storageDir);

      await waitForMail(s.people.reviewer.email, /submitted fixture\.tif for review/, 30_000);
      await eventually('marked sent', async () => (await deliveries(s.people.reviewer.id, imageId))[0]!.status === 'sent');
      expect(await mailsTo(s.people.reviewer.email)).to.have.length(1);
    } finally {
      // Later tests need the mail server, whatever happened here.
      running.smtp ??= await startFakeSmtp(config().smtp.host, config().smtp.port, config().storageDir);
    }
  });

  it('when a notification’s mail job is gone without sending it, then it is put back in line and still delivered', async () => {
    const imageId = await makeImageRow(s.projectId, s.people.researcher, { width: 2000, height: 1500 }, 0.5);
    const facts = { projectCode: 'T-LOST', imageName: 'fixture.tif', actorName: s.people.researcher.displayName };
    await sql(
      `INSERT INTO notifications (recipient_id, kind, project_id, image_id, actor_id, facts, status, job_id)
       VALUES ($1, 'review_requested', $2, $3, $4, $5, 'mailing', $6)`,
      [s.people.lead.id, s.projectId, imageId, s.people.researcher.id, JSON.stringify(facts), randomUUID()],
    );
    const ctx = runningServer().ctx;

    expect(await requeueStranded({ dataSource: ctx.dataSource, mailer: ctx.mailer, config: ctx.config, logger: ctx.logger })).to.be.at.least(1);

    await waitForMail(s.people.lead.email, /^\[T-LOST\] .* submitted fixture\.tif for review$/, MAIL_WAIT_MS);
    await eventually('marked sent', async () => (await deliveries(s.people.lead.id, imageId))[0]!.status === 'sent');
  });
});
