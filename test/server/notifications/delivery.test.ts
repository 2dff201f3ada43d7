import { expect } from 'chai';
import { DIGEST_QUEUE } from '../../../server/notifications/mail-queue';
import { startDigestIfDue } from '../../../server/notifications/digest';
import { ApiClient, mountApp } from '../../support/api-client';
import { makeImageRow } from '../../support/catalogue-fixtures';
import { makeUser } from '../../support/fixtures';
import { waitForMail } from '../../support/mail-box';
import { runningServer } from '../../support/test-server';
import { sql } from '../db-state';
import { mailsTo } from '../mail-links';
import { move, reviewScene, threadsPath, type ReviewScene } from '../reviews/review-fixtures';
import { deliveries, eventually, MAIL_WAIT_MS } from './notification-fixtures';

describe('notifications: immediate, daily digest or off', () => {
  let app: Awaited<ReturnType<typeof mountApp>>;
  let s: ReviewScene;
  const ctx = () => runningServer().ctx;
  const choose = async (c: ApiClient, delivery: string) => expect((await c.request('PUT', '/api/me/notification-settings', { delivery })).status).to.equal(200);
  const fresh = () => makeImageRow(s.projectId, s.people.researcher, { width: 2000, height: 1500 }, 0.5);

  /** A second reviewer who keeps immediate mail: their mail shows the relay has been round. */
  async function witness(): Promise<{ email: string; id: string }> {
    const user = await makeUser();
    await sql(`INSERT INTO project_memberships (project_id, user_id, role) VALUES ($1, $2, 'reviewer')`, [s.projectId, user.id]);
    return user;
  }

  beforeEach(async () => {
    app ??= await mountApp();
    s = await reviewScene(app.url);
  });
  after(() => app.close());

  it('when a reviewer chose off, then nothing is written or sent for them, while others are told', async () => {
    const other = await witness();
    await choose(s.reviewer, 'off');
    const imageId = await fresh();
    await move(s.researcher, s, imageId, 'submit');
    await waitForMail(other.email, /submitted fixture\.tif for review/, MAIL_WAIT_MS);
    expect(await deliveries(s.people.reviewer.id, imageId)).to.deep.equal([]);
    expect(await mailsTo(s.people.reviewer.email)).to.deep.equal([]);
  });

  it('when a reviewer chose the daily digest, then nothing goes out at once, and the digest job sends one mail with every item and its link', async () => {
    const other = await witness();
    await choose(s.reviewer, 'daily');
    const imageId = await fresh();
    await move(s.researcher, s, imageId, 'submit');
    const thread = (await s.lead.post(threadsPath(s, imageId), { anchor: { kind: 'point', at: [7, 7] }, body: 'Please look at the bond line first.', mentions: [s.people.reviewer.id] })).body;
    await waitForMail(other.email, /submitted fixture\.tif for review/, MAIL_WAIT_MS);
    expect((await deliveries(s.people.reviewer.id, imageId)).map((n) => [n.kind, n.status])).to.deep.equal([['review_requested', 'awaiting_digest'], ['mention', 'awaiting_digest']]);
    expect(await mailsTo(s.people.reviewer.email)).to.deep.equal([]);

    await ctx().jobs.boss.send(DIGEST_QUEUE, {});

    const digest = await waitForMail(s.people.reviewer.email, /^Etchfile daily digest: 2 notifications$/, MAIL_WAIT_MS);
    const base = `${ctx().config.publicUrl}/projects/${s.projectId}/images/${imageId}`;
    expect(digest.text).to.contain(`- ${s.people.researcher.displayName} submitted fixture.tif for review\n  ${base}\n`);
    expect(digest.text).to.contain(`- ${s.people.lead.displayName} mentioned you on fixture.tif: “Please look at the bond line first.”\n  ${base}?thread=${thread.id}`);
    await eventually('both marked sent', async () => (await deliveries(s.people.reviewer.id, imageId)).every((n) => n.status === 'sent'));
    expect(await mailsTo(s.people.reviewer.email)).to.have.length(1);
  });

  it('when someone switches to off while items wait for their digest, then the digest drops them and sends nothing', async () => {
    await choose(s.reviewer, 'daily');
    const imageId = await fresh();
    await move(s.researcher, s, imageId, 'submit');
    expect((await deliveries(s.people.reviewer.id, imageId)).map((n) => n.status)).to.deep.equal(['awaiting_digest']);
    await choose(s.reviewer, 'off');

    await ctx().jobs.boss.send(DIGEST_QUEUE, {});

    await eventually('dropped', async () => (await deliveries(s.people.reviewer.id, imageId))[0]!.status === 'dropped');
    expect(await mailsTo(s.people.reviewer.email)).to.deep.equal([]);
  });

  it('when the digest hour comes, then the first check that day starts it and every later check that day does not', async () => {
    const deps = { dataSource: ctx().dataSource, mailer: ctx().mailer, config: ctx().config, logger: ctx().logger };
    const hour = ctx().config.notifications.digestHourUtc;
    // A day far ahead, so the running worker's own daily check never shares it.
    const day = '2041-03-14';
    await sql('DELETE FROM notification_digest_days WHERE day = $1', [day]);
    const at = (h: number) => new Date(`${day}T${String(h).padStart(2, '0')}:30:00Z`);
    if (hour > 0) expect(await startDigestIfDue(deps, ctx().jobs.boss, at(hour - 1)), 'before the hour').to.equal(false);
    expect(await startDigestIfDue(deps, ctx().jobs.boss, at(hour)), 'at the hour').to.equal(true);
    expect(await startDigestIfDue(deps, ctx().jobs.boss, at(23)), 'later that day').to.equal(false);
    expect(await sql('SELECT day FROM notification_digest_days WHERE day = $1', [day])).to.have.length(1);
  });
});
