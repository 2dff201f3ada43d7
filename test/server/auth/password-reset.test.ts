import { expect } from 'chai';
import { ApiClient, mountApp } from '../../support/api-client';
import { makeUser, signedIn, TEST_PASSWORD, unique } from '../../support/fixtures';
import { tokenIn, waitForMail } from '../../support/mail-box';
import { testConfig } from '../../support/test-config';
import { passwordTokens, sql, userState } from '../db-state';
import { expectApiError, fieldsOf } from '../error-shape';
import { mailsTo, waitForNextMail } from '../mail-links';

const SUBJECT = /set a new password/;
const NEW_PASSWORD = 'pearlite-lamellae-42';

describe('auth: password reset by e-mailed link', () => {
  let app: Awaited<ReturnType<typeof mountApp>>;
  before(async () => (app = await mountApp()));
  after(() => app.close());

  async function requestReset(email: string) {
    const client = new ApiClient(app.url);
    return client.post('/api/auth/password-reset', { email });
  }

  async function completeReset(token: string, newPassword = NEW_PASSWORD) {
    return new ApiClient(app.url).post('/api/auth/password-reset/complete', { token, newPassword });
  }

  /** Asks for a link for `email` and returns the token from the mail that arrives. */
  async function linkFor(email: string): Promise<string> {
    const seen = await mailsTo(email);
    expect((await requestReset(email)).status).to.equal(202);
    return tokenIn(await waitForNextMail(email, SUBJECT, seen));
  }

  it('when a reset is asked for a known and an unknown e-mail, then both get 202 with the same body', async () => {
    const user = await makeUser();
    const nobody = `nobody-${unique()}@example.test`;

    const known = await requestReset(user.email);
    const unknown = await requestReset(nobody);

    expect(known.status).to.equal(202);
    expect(unknown.status).to.equal(202);
    expect(unknown.body).to.deep.equal(known.body);
    expect(known.body.message).to.be.a('string').and.not.equal('');
    expect(await sql('SELECT 1 FROM users WHERE email = $1', [nobody])).to.have.length(0);
  });

  it('when a known user asks, then a mail with a one-time link to this server arrives', async () => {
    const user = await makeUser();

    await requestReset(user.email);

    const mail = await waitForMail(user.email, SUBJECT);
    expect(mail.text).to.include(`${testConfig.publicUrl}/reset-password?token=`);
    expect(mail.text).to.include(user.displayName);
    expect(await passwordTokens(user.id)).to.have.length(1);
  });

  it('when a deactivated user asks, then 202 but no link is issued', async () => {
    const user = await makeUser('member', { active: false });

    const res = await requestReset(user.email);

    expect(res.status).to.equal(202);
    expect(await passwordTokens(user.id)).to.have.length(0);
  });

  it('when the link\'s token is sent with a new password, then 204, the new password works and the old one fails', async () => {
    const user = await makeUser();
    const token = await linkFor(user.email);

    const res = await completeReset(token);

    expect(res.status).to.equal(204);
    expectApiError(await new ApiClient(app.url).signIn(user.email, TEST_PASSWORD), 401, 'bad_credentials');
    expect((await new ApiClient(app.url).signIn(user.email, NEW_PASSWORD)).status).to.equal(200);
  });

  it('when the password is reset, then every session of that user ends', async () => {
    const user = await makeUser();
    const session = await signedIn(app.url, user);
    const token = await linkFor(user.email);

    expect((await completeReset(token)).status).to.equal(204);

    expectApiError(await session.get('/api/projects'), 401, 'not_signed_in');
  });

  it('when a used link is sent again, then 400 token_invalid saying it was already used, and the password stays', async () => {
    const user = await makeUser();
    const token = await linkFor(user.email);
    expect((await completeReset(token)).status).to.equal(204);
    const before = await userState(user.id);

    const res = await completeReset(token, 'another-new-password');

    expect(expectApiError(res, 400, 'token_invalid').message).to.match(/already been used/);
    expect(await userState(user.id)).to.deep.equal(before);
  });

  it('when the same link is sent twice at once, then exactly one request sets the password', async () => {
    const user = await makeUser();
    const token = await linkFor(user.email);

    const results = await Promise.all([completeReset(token, 'first-racer-password'), completeReset(token, 'second-racer-password')]);

    expect(results.map((r) => r.status).sort()).to.deep.equal([204, 400]);
    const winner = results[0]!.status === 204 ? 'first-racer-password' : 'second-racer-password';
    expect((await new ApiClient(app.url).signIn(user.email, winner)).status).to.equal(200);
  });

  it('when the link has expired, then 400 token_invalid saying so, and the password stays', async () => {
    const user = await makeUser();
    const token = await linkFor(user.email);
    await sql(`UPDATE password_tokens SET expires_at = now() - interval '1 minute' WHERE user_id = $1`, [user.id]);
    const before = await userState(user.id);

    const res = await completeReset(token);

    expect(expectApiError(res, 400, 'token_invalid').message).to.match(/expired/);
    expect(await userState(user.id)).to.deep.equal(before);
    expect((await passwordTokens(user.id))[0]!.used_at).to.equal(null);
  });

  it('when a newer link was asked for, then the older one no longer works', async () => {
    const user = await makeUser();
    const older = await linkFor(user.email);
    const newer = await linkFor(user.email);
    const before = await userState(user.id);

    const res = await completeReset(older);

    expectApiError(res, 400, 'token_invalid');
    expect(await userState(user.id)).to.deep.equal(before);
    expect((await completeReset(newer)).status).to.equal(204);
  });

  it('when a well-formed token nobody issued is sent, then 400 token_invalid and no password changes', async () => {
    const user = await makeUser();
    await linkFor(user.email);
    const before = await userState(user.id);

    const res = await completeReset('A'.repeat(43));

    expect(expectApiError(res, 400, 'token_invalid').message).to.match(/not valid/);
    expect(await userState(user.id)).to.deep.equal(before);
  });

  it('when a link is checked before use, then 204 and it stays usable; used, expired or unknown links are 400 with the reason', async () => {
    const user = await makeUser();
    const token = await linkFor(user.email);
    const check = (t: string) => new ApiClient(app.url).post('/api/auth/password-reset/check', { token: t });

    expect((await check(token)).status).to.equal(204);
    expect((await passwordTokens(user.id))[0]!.used_at, 'checking uses nothing up').to.equal(null);
    expect((await completeReset(token)).status).to.equal(204);
    expect(expectApiError(await check(token), 400, 'token_invalid').message).to.match(/already been used/);

    const second = await linkFor(user.email);
    await sql(`UPDATE password_tokens SET expires_at = now() - interval '1 minute' WHERE user_id = $1 AND used_at IS NULL`, [user.id]);
    expect(expectApiError(await check(second), 400, 'token_invalid').message).to.match(/expired/);

    expect(expectApiError(await check('x'.repeat(43)), 400, 'token_invalid').message).to.match(/not valid/);
    const garbage = await check('no good!');
    expectApiError(garbage, 422, 'validation_failed');
    expect(fieldsOf(garbage)).to.deep.equal(['body.token']);
  });

  it('when the token is garbage, then 422 naming body.token', async () => {
    const res = await completeReset('<script>alert(1)</script>');
    expectApiError(res, 422, 'validation_failed');
    expect(fieldsOf(res)).to.deep.equal(['body.token']);
  });

  it('when the new password is too short, then 422 and the link stays usable', async () => {
    const user = await makeUser();
    const token = await linkFor(user.email);
    const before = await userState(user.id);

    const res = await completeReset(token, 'short');

    expectApiError(res, 422, 'validation_failed');
    expect(fieldsOf(res)).to.deep.equal(['body.newPassword']);
    expect(await userState(user.id)).to.deep.equal(before);
    expect((await completeReset(token)).status).to.equal(204);
  });

  it('when the account was deactivated after the link was sent, then 403 and the link is not used up', async () => {
    const user = await makeUser();
    const token = await linkFor(user.email);
    await sql('UPDATE users SET active = false WHERE id = $1', [user.id]);
    const before = await userState(user.id);

    const res = await completeReset(token);

    expectApiError(res, 403, 'account_inactive');
    expect(await userState(user.id)).to.deep.equal(before);
    expect((await passwordTokens(user.id))[0]!.used_at).to.equal(null);
  });

  it('when the e-mail is not an address, then 422 naming body.email', async () => {
    const res = await requestReset('not-an-address');
    expectApiError(res, 422, 'validation_failed');
    expect(fieldsOf(res)).to.deep.equal(['body.email']);
  });

  it(`when one address asks ${testConfig.signInLimit.max} times, then the next request is 429 and sends nothing`, async () => {
    const user = await makeUser();
    for (let i = 0; i < testConfig.signInLimit.max; i++) expect((await requestReset(user.email)).status).to.equal(202);
    const sent = (await mailsTo(user.email)).length;
    const tokens = await passwordTokens(user.id);

    const res = await requestReset(user.email);

    expect(expectApiError(res, 429, 'too_many_requests').message).to.match(/wait \d+ minutes?/i);
    expect((await mailsTo(user.email)).length).to.equal(sent);
    expect(await passwordTokens(user.id)).to.deep.equal(tokens);
  });
});
