import { expect } from 'chai';
import { ApiClient, type ApiClient as Client, mountApp } from '../../support/api-client';
import { makeUser, signedIn, unique } from '../../support/fixtures';
import { tokenIn, waitForMail } from '../../support/mail-box';
import { testConfig } from '../../support/test-config';
import { passwordTokens, sql, userIdByEmail, userState } from '../db-state';
import { expectApiError, fieldsOf } from '../error-shape';

describe('admin: inviting people', () => {
  let app: Awaited<ReturnType<typeof mountApp>>;
  let admin: Client;
  let adminName: string;
  before(async () => {
    app = await mountApp();
    const user = await makeUser('admin');
    adminName = user.displayName;
    admin = await signedIn(app.url, user);
  });
  after(() => app.close());

  const newEmail = () => `invitee-${unique()}@example.test`;

  it('when an admin invites someone, then 201 with an account that has no password yet', async () => {
    const email = newEmail();

    const res = await admin.post('/api/admin/users', { email: email.toUpperCase(), displayName: 'Hedda Morrow' });

    expect(res.status).to.equal(201);
    expect(res.body).to.include({ email, displayName: 'Hedda Morrow', siteRole: 'member', active: true, hasPassword: false, lastSignInAt: null });
    expect(res.body.id).to.equal(await userIdByEmail(email));
    const tokens = await passwordTokens(res.body.id);
    expect(tokens.map((t) => t.purpose)).to.deep.equal(['invite']);
  });

  it('when invited, then the mail names the inviter and its link sets the password, after which the person can sign in', async () => {
    const email = newEmail();
    await admin.post('/api/admin/users', { email, displayName: 'Tomas Quill', siteRole: 'admin' });
    expectApiError(await new ApiClient(app.url).signIn(email, 'chosen-by-tomas-1'), 401, 'bad_credentials');

    const mail = await waitForMail(email, /you are invited/);
    const set = await new ApiClient(app.url).post('/api/auth/password-reset/complete', { token: tokenIn(mail), newPassword: 'chosen-by-tomas-1' });
    const signIn = await new ApiClient(app.url).signIn(email, 'chosen-by-tomas-1');

    expect(mail.text).to.include(adminName);
    expect(mail.text).to.include(`${testConfig.publicUrl}/reset-password?token=`);
    expect(set.status).to.equal(204);
    expect(signIn.status).to.equal(200);
    expect(signIn.body.user).to.include({ email, siteRole: 'admin' });
    const listed = await admin.get(`/api/admin/users?q=${encodeURIComponent(email)}`);
    expect(listed.body.items[0]).to.include({ hasPassword: true });
    expect(listed.body.items[0].lastSignInAt).to.be.a('string');
  });

  it('when the e-mail already has an account (in any letter case), then 409 naming body.email and nothing changes', async () => {
    const existing = await makeUser();
    const before = await userState(existing.id);

    const res = await admin.post('/api/admin/users', { email: existing.email.toUpperCase(), displayName: 'A second account' });

    expectApiError(res, 409, 'conflict');
    expect(fieldsOf(res)).to.deep.equal(['body.email']);
    expect(await userState(existing.id)).to.deep.equal(before);
    expect(await passwordTokens(existing.id)).to.have.length(0);
  });

  for (const [what, body, fields] of [
    ['an address that is not one', { email: 'not-an-address', displayName: 'Valid Name' }, ['body.email']],
    ['a one-letter name and an unknown site role', { email: 'EMAIL', displayName: 'X', siteRole: 'owner' }, ['body.displayName', 'body.siteRole']],
    ['an unknown field', { email: 'EMAIL', displayName: 'Valid Name', password: 'preset-password' }, ['body']],
  ] as const) {
    it(`when the invitation has ${what}, then 422 naming ${fields.join(' and ')} and no account is made`, async () => {
      const email = newEmail();
      const payload = { ...body, email: body.email === 'EMAIL' ? email : body.email };

      const res = await admin.post('/api/admin/users', payload);

      expectApiError(res, 422, 'validation_failed');
      expect(fieldsOf(res)).to.have.members([...fields]);
      expect(await sql('SELECT 1 FROM users WHERE email = $1', [payload.email])).to.have.length(0);
    });
  }
});
