import { expect } from 'chai';
import { ApiClient, mountApp } from '../../support/api-client';
import { makeProject, makeUser, signedIn, TEST_PASSWORD, unique } from '../../support/fixtures';
import { projectIdByCode, projectState } from '../db-state';
import { expectApiError } from '../error-shape';

describe('http: CSRF tokens on state-changing requests', () => {
  let app: Awaited<ReturnType<typeof mountApp>>;
  before(async () => (app = await mountApp()));
  after(() => app.close());

  it('when a project is created without the x-csrf-token header, then 403 csrf_token_invalid and no project exists', async () => {
    const client = await signedIn(app.url, await makeUser());
    const code = `CS-${unique().toUpperCase()}`;

    const res = await client.request('POST', '/api/projects', { code, name: 'Forged creation' }, { csrf: false });

    expectApiError(res, 403, 'csrf_token_invalid');
    expect(await projectIdByCode(code)).to.equal(null);
  });

  it('when a project is created with a wrong token, then 403 csrf_token_invalid and no project exists', async () => {
    const client = await signedIn(app.url, await makeUser());
    const code = `CS-${unique().toUpperCase()}`;
    client.csrfToken = 'a-token-this-session-never-had';

    const res = await client.post('/api/projects', { code, name: 'Forged creation' });

    expectApiError(res, 403, 'csrf_token_invalid');
    expect(await projectIdByCode(code)).to.equal(null);
  });

  it('when a project is edited without the header, then 403 and the project is unchanged', async () => {
    const lead = await makeUser();
    const project = await makeProject([[lead, 'lead']]);
    const client = await signedIn(app.url, lead);
    const before = await projectState(project.id);

    const res = await client.request('PATCH', `/api/projects/${project.id}`, { name: 'Renamed by a forged form' }, { csrf: false });

    expectApiError(res, 403, 'csrf_token_invalid');
    expect(await projectState(project.id)).to.deep.equal(before);
  });

  it('when a member is removed with a wrong token, then 403 and the membership stays', async () => {
    const lead = await makeUser();
    const guest = await makeUser();
    const project = await makeProject([[lead, 'lead'], [guest, 'guest']]);
    const client = await signedIn(app.url, lead);
    client.csrfToken = client.csrfToken.split('').reverse().join('');
    const before = await projectState(project.id);

    const res = await client.delete(`/api/projects/${project.id}/members/${guest.id}`);

    expectApiError(res, 403, 'csrf_token_invalid');
    expect(await projectState(project.id)).to.deep.equal(before);
  });

  it('when the token from another session is sent, then 403 and nothing changes', async () => {
    const lead = await makeUser();
    const project = await makeProject([[lead, 'lead']]);
    const victim = await signedIn(app.url, lead);
    const other = await signedIn(app.url, await makeUser());
    victim.csrfToken = other.csrfToken;
    const before = await projectState(project.id);

    const res = await victim.patch(`/api/projects/${project.id}`, { status: 'archived' });

    expectApiError(res, 403, 'csrf_token_invalid');
    expect(await projectState(project.id)).to.deep.equal(before);
  });

  it('when the token seen before sign-in is sent after sign-in, then 403 and the new token works', async () => {
    const user = await makeUser();
    const client = new ApiClient(app.url);
    const { csrfToken: early } = await client.loadSession();
    const signIn = await client.signIn(user.email, TEST_PASSWORD);
    expect(signIn.status).to.equal(200);
    const code = `CS-${unique().toUpperCase()}`;

    client.csrfToken = early;
    const stale = await client.post('/api/projects', { code, name: 'With the old token' });
    client.csrfToken = signIn.body.csrfToken;
    const fresh = await client.post('/api/projects', { code, name: 'With the new token' });

    expectApiError(stale, 403, 'csrf_token_invalid');
    expect(fresh.status).to.equal(201);
    expect(fresh.body.name).to.equal('With the new token');
  });

  it('when a sign-in is posted without a token, then 403 and no session is made for the user', async () => {
    const user = await makeUser();
    const client = new ApiClient(app.url);

    const res = await client.request('POST', '/api/auth/sign-in', { email: user.email, password: TEST_PASSWORD }, { csrf: false });

    expectApiError(res, 403, 'csrf_token_invalid');
    expect((await client.get('/api/auth/session')).body.user).to.equal(null);
  });

  it('when a GET is sent without a token, then it is answered (reads need no token)', async () => {
    const client = await signedIn(app.url, await makeUser());
    client.csrfToken = '';
    const res = await client.get('/api/projects');
    expect(res.status).to.equal(200);
  });
});
