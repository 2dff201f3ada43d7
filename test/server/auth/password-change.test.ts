import { expect } from 'chai';
import { ApiClient, mountApp } from '../../support/api-client';
import { makeUser, signedIn, TEST_PASSWORD } from '../../support/fixtures';
import { sessionCount, userState } from '../db-state';
import { expectApiError, fieldsOf } from '../error-shape';
import { ACTORS, sceneFor, who } from '../role-actors';

describe('auth: changing one\'s own password', () => {
  let app: Awaited<ReturnType<typeof mountApp>>;
  before(async () => (app = await mountApp()));
  after(() => app.close());

  const NEW_PASSWORD = 'granular-ferrite-etched';

  it('when the current password is wrong, then 422 naming body.currentPassword and the hash is unchanged', async () => {
    const user = await makeUser();
    const client = await signedIn(app.url, user);
    const before = await userState(user.id);

    const res = await client.post('/api/auth/password', { currentPassword: 'not-the-password', newPassword: NEW_PASSWORD });

    expectApiError(res, 422, 'validation_failed');
    expect(fieldsOf(res)).to.deep.equal(['body.currentPassword']);
    expect(await userState(user.id)).to.deep.equal(before);
  });

  it('when the new password is too short, then 422 naming body.newPassword and the hash is unchanged', async () => {
    const user = await makeUser();
    const client = await signedIn(app.url, user);
    const before = await userState(user.id);

    const res = await client.post('/api/auth/password', { currentPassword: TEST_PASSWORD, newPassword: 'short' });

    expectApiError(res, 422, 'validation_failed');
    expect(fieldsOf(res)).to.deep.equal(['body.newPassword']);
    expect(await userState(user.id)).to.deep.equal(before);
  });

  it('when the body is empty, then 422 naming both fields and the hash is unchanged', async () => {
    const user = await makeUser();
    const client = await signedIn(app.url, user);
    const before = await userState(user.id);

    const res = await client.post('/api/auth/password', {});

    expectApiError(res, 422, 'validation_failed');
    expect(fieldsOf(res)).to.have.members(['body.currentPassword', 'body.newPassword']);
    expect(await userState(user.id)).to.deep.equal(before);
  });

  it('when the change succeeds, then 204 and the new password signs in while the old one does not', async () => {
    const user = await makeUser();
    const client = await signedIn(app.url, user);

    const res = await client.post('/api/auth/password', { currentPassword: TEST_PASSWORD, newPassword: NEW_PASSWORD });

    expect(res.status).to.equal(204);
    expectApiError(await new ApiClient(app.url).signIn(user.email, TEST_PASSWORD), 401, 'bad_credentials');
    expect((await new ApiClient(app.url).signIn(user.email, NEW_PASSWORD)).status).to.equal(200);
  });

  it('when the change succeeds, then the user\'s other sessions end and the one that changed it stays signed in', async () => {
    const user = await makeUser();
    const bystander = await makeUser();
    const laptop = await signedIn(app.url, user);
    const microscopePc = await signedIn(app.url, user);
    const otherPerson = await signedIn(app.url, bystander);
    expect(await sessionCount(user.id)).to.equal(2);

    const res = await laptop.post('/api/auth/password', { currentPassword: TEST_PASSWORD, newPassword: NEW_PASSWORD });

    expect(res.status).to.equal(204);
    expectApiError(await microscopePc.get('/api/projects'), 401, 'not_signed_in');
    expect((await laptop.get('/api/projects')).status).to.equal(200);
    expect((await otherPerson.get('/api/projects')).status).to.equal(200);
    expect(await sessionCount(user.id)).to.equal(1);
  });

  it('when nobody is signed in, then 401 not_signed_in', async () => {
    const client = new ApiClient(app.url);
    await client.loadSession();
    const res = await client.post('/api/auth/password', { currentPassword: TEST_PASSWORD, newPassword: NEW_PASSWORD });
    expectApiError(res, 401, 'not_signed_in');
  });

  describe('POST /api/auth/password for every role', () => {
    for (const actor of ACTORS) {
      const signedOut = actor === 'signed-out';
      it(`when a ${who(actor)} changes their password, then ${signedOut ? '401' : '204'}`, async () => {
        const { client, user } = await sceneFor(app.url, actor);
        const before = user ? await userState(user.id) : undefined;

        const res = await client.post('/api/auth/password', { currentPassword: TEST_PASSWORD, newPassword: NEW_PASSWORD });

        if (signedOut) expectApiError(res, 401, 'not_signed_in');
        else {
          expect(res.status).to.equal(204);
          expect((await userState(user!.id))!['password_hash']).to.not.equal(before!['password_hash']);
        }
      });
    }
  });
});
