import { expect } from 'chai';
import { ApiClient, mountApp } from '../../support/api-client';
import { makeUser, signedIn, TEST_PASSWORD } from '../../support/fixtures';
import { getWithCookie, sessionCookieSet } from '../cookies';
import { sessionCount, userState } from '../db-state';
import { expectApiError, fieldsOf } from '../error-shape';

describe('auth: sign-in and sign-out', () => {
  let app: Awaited<ReturnType<typeof mountApp>>;
  before(async () => (app = await mountApp()));
  after(() => app.close());

  it('when the right password is sent, then 200 with the user and a new CSRF token', async () => {
    const user = await makeUser();
    const client = new ApiClient(app.url);
    const before = await client.loadSession();

    const res = await client.signIn(user.email, TEST_PASSWORD);

    expect(res.status).to.equal(200);
    expect(res.body.user).to.deep.equal({ id: user.id, email: user.email, displayName: user.displayName, siteRole: 'member' });
    expect(res.body.csrfToken).to.be.a('string').with.length.greaterThan(10);
    expect(res.body.csrfToken).to.not.equal(before.csrfToken);
  });

  it('when signing in, then the session cookie is httpOnly and SameSite=Lax and gets a new session id', async () => {
    const user = await makeUser();
    const client = new ApiClient(app.url);
    const first = await client.get('/api/auth/session');
    const before = sessionCookieSet(first);
    client.csrfToken = first.body.csrfToken;

    const res = await client.signIn(user.email, TEST_PASSWORD);

    const after = sessionCookieSet(res);
    expect(before, 'cookie set before sign-in').to.not.equal(null);
    expect(after, 'cookie set at sign-in').to.not.equal(null);
    expect(after!.attributes).to.include('httponly');
    expect(after!.attributes).to.include('samesite=lax');
    expect(after!.pair).to.not.equal(before!.pair);
    // The id from before sign-in was not promoted to a signed-in session.
    expect((await getWithCookie(app.url, '/api/projects', before!.pair)).status).to.equal(401);
    expect((await getWithCookie(app.url, '/api/projects', after!.pair)).status).to.equal(200);
  });

  it('when a user signs in, then lastSignInAt is recorded', async () => {
    const user = await makeUser();
    expect((await userState(user.id))!['last_sign_in_at']).to.equal(null);
    const started = Date.now();

    await signedIn(app.url, user);

    const at = (await userState(user.id))!['last_sign_in_at'] as Date;
    expect(at).to.be.instanceOf(Date);
    expect(at.getTime()).to.be.within(started - 2000, Date.now() + 2000);
  });

  it('when the e-mail is typed in capitals with spaces, then the sign-in still works', async () => {
    const user = await makeUser();
    const res = await new ApiClient(app.url).signIn(`  ${user.email.toUpperCase()} `, TEST_PASSWORD);
    expect(res.status).to.equal(200);
    expect(res.body.user?.id).to.equal(user.id);
  });

  it('when the password is wrong, then 401 bad_credentials and no session or sign-in time is stored', async () => {
    const user = await makeUser();
    const before = await userState(user.id);
    const client = new ApiClient(app.url);

    const res = await client.signIn(user.email, 'not-the-password');

    expectApiError(res, 401, 'bad_credentials');
    expect(await userState(user.id)).to.deep.equal(before);
    expect(await sessionCount(user.id)).to.equal(0);
    expect((await client.get('/api/auth/session')).body.user).to.equal(null);
  });

  it('when the account does not exist, then 401 with the same message as a wrong password', async () => {
    const user = await makeUser();
    const wrong = await new ApiClient(app.url).signIn(user.email, 'not-the-password');

    const unknown = await new ApiClient(app.url).signIn(`nobody-${user.id.slice(0, 8)}@example.test`, TEST_PASSWORD);

    expectApiError(unknown, 401, 'bad_credentials');
    expect(unknown.body).to.deep.equal(wrong.body);
  });

  it('when a deactivated user signs in with the right password, then 403 account_inactive and no session', async () => {
    const user = await makeUser('member', { active: false });
    const before = await userState(user.id);

    const res = await new ApiClient(app.url).signIn(user.email, TEST_PASSWORD);

    expectApiError(res, 403, 'account_inactive');
    expect(await userState(user.id)).to.deep.equal(before);
    expect(await sessionCount(user.id)).to.equal(0);
  });

  it('when a deactivated user signs in with a wrong password, then 401 bad_credentials, so only the owner learns the state', async () => {
    const user = await makeUser('member', { active: false });
    const res = await new ApiClient(app.url).signIn(user.email, 'not-the-password');
    expectApiError(res, 401, 'bad_credentials');
  });

  it('when an invited user without a password tries to sign in, then 401 bad_credentials', async () => {
    const user = await makeUser('member', { passwordHash: null });
    const res = await new ApiClient(app.url).signIn(user.email, TEST_PASSWORD);
    expectApiError(res, 401, 'bad_credentials');
    expect(await sessionCount(user.id)).to.equal(0);
  });

  it('when the sign-in body lacks the password and has an unknown field, then 422 naming both and nothing stored', async () => {
    const user = await makeUser();
    const client = new ApiClient(app.url);
    await client.loadSession();

    const res = await client.post('/api/auth/sign-in', { email: user.email, remember: true });

    expectApiError(res, 422, 'validation_failed');
    expect(fieldsOf(res)).to.include('body.password');
    expect(res.body.error.details.some((d: { message: string }) => d.message.includes('remember'))).to.equal(true);
    expect(await sessionCount(user.id)).to.equal(0);
  });

  it('when a signed-in user signs out, then 204 and the old cookie no longer authenticates', async () => {
    const user = await makeUser();
    const client = await signedIn(app.url, user);
    const cookie = sessionCookieSet(await client.get('/api/auth/session'))!.pair;
    expect((await getWithCookie(app.url, '/api/projects', cookie)).status).to.equal(200);

    const res = await client.post('/api/auth/sign-out');

    expect(res.status).to.equal(204);
    const replay = await getWithCookie(app.url, '/api/projects', cookie);
    expect(replay.status).to.equal(401);
    expect(replay.body.error.code).to.equal('not_signed_in');
    expect(await sessionCount(user.id)).to.equal(0);
  });

  it('when nobody is signed in and sign-out is posted, then 401 not_signed_in', async () => {
    const client = new ApiClient(app.url);
    await client.loadSession();
    expectApiError(await client.post('/api/auth/sign-out'), 401, 'not_signed_in');
  });
});
