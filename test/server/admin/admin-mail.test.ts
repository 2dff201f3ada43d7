import { expect } from 'chai';
import { randomUUID } from 'node:crypto';
import type { KeptMail } from '../../../shared/admin';
import { ApiClient, type ApiClient as Client, mountApp } from '../../support/api-client';
import { makeUser, signedIn } from '../../support/fixtures';
import { tokenIn } from '../../support/mail-box';
import { passwordTokens, userState } from '../db-state';
import { expectApiError } from '../error-shape';
import { mailsTo, waitForNextMail } from '../mail-links';

describe('admin: reset links and the mail outbox', () => {
  let app: Awaited<ReturnType<typeof mountApp>>;
  let admin: Client;
  before(async () => {
    app = await mountApp();
    admin = await signedIn(app.url, await makeUser('admin'));
  });
  after(() => app.close());

  it('when an admin sends a reset link, then 202, the mail arrives, and its link sets a new password', async () => {
    const user = await makeUser();
    const seen = await mailsTo(user.email);

    const res = await admin.post(`/api/admin/users/${user.id}/reset`);

    expect(res.status).to.equal(202);
    const mail = await waitForNextMail(user.email, /set a new password/, seen);
    const set = await new ApiClient(app.url).post('/api/auth/password-reset/complete', { token: tokenIn(mail), newPassword: 'admin-sent-link-pass' });
    expect(set.status).to.equal(204);
    expect((await new ApiClient(app.url).signIn(user.email, 'admin-sent-link-pass')).status).to.equal(200);
  });

  it('when the person never set a password, then the reset sends a fresh invitation instead', async () => {
    const user = await makeUser('member', { passwordHash: null });
    const seen = await mailsTo(user.email);

    const res = await admin.post(`/api/admin/users/${user.id}/reset`);

    expect(res.status).to.equal(202);
    await waitForNextMail(user.email, /you are invited/, seen);
    expect((await passwordTokens(user.id)).map((t) => t.purpose)).to.deep.equal(['invite']);
  });

  it('when the account is deactivated, then 409 and no link is issued', async () => {
    const user = await makeUser('member', { active: false });
    const before = await userState(user.id);

    const res = await admin.post(`/api/admin/users/${user.id}/reset`);

    expectApiError(res, 409, 'conflict');
    expect(await passwordTokens(user.id)).to.have.length(0);
    expect(await userState(user.id)).to.deep.equal(before);
  });

  it('when the user does not exist, then 404', async () => {
    expectApiError(await admin.post(`/api/admin/users/${randomUUID()}/reset`), 404, 'not_found');
  });

  it('when an admin opens the outbox, then the kept messages are listed newest first with sender, recipients, subject and text', async () => {
    const user = await makeUser();
    await admin.post(`/api/admin/users/${user.id}/reset`);
    await admin.post(`/api/admin/users/${user.id}/reset`);

    const res = await admin.get('/api/admin/mail');

    expect(res.status).to.equal(200);
    const mine: KeptMail[] = res.body.filter((m: KeptMail) => m.to.includes(user.email));
    expect(mine).to.have.length(2);
    for (const mail of mine) {
      expect(mail).to.have.all.keys('id', 'receivedAt', 'from', 'to', 'subject', 'text');
      expect(mail.from).to.match(/@etchfile\.invalid$/);
      expect(mail.subject).to.match(/set a new password/);
      expect(mail.text).to.include(user.displayName);
    }
    const times = (res.body as KeptMail[]).map((m) => Date.parse(m.receivedAt));
    expect(times).to.deep.equal([...times].sort((a, b) => b - a));
    // Only the newer link works: asking again replaced the first.
    const works = await Promise.all(
      mine.map((m) => new ApiClient(app.url).post('/api/auth/password-reset/complete', { token: tokenIn(m), newPassword: 'outbox-checked-pass' })),
    );
    expect(works.map((r) => r.status)).to.deep.equal([204, 400]);
  });
});
