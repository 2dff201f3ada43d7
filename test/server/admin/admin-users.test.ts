import { expect } from 'chai';
import { randomUUID } from 'node:crypto';
import type { User } from '../../../server/auth/user.entity';
import { ApiClient, type ApiClient as Client, mountApp } from '../../support/api-client';
import { makeUser, signedIn, TEST_PASSWORD, unique } from '../../support/fixtures';
import { sessionCount, userState } from '../db-state';
import { expectApiError, fieldsOf } from '../error-shape';

describe('admin: changing, deactivating and listing accounts', () => {
  let app: Awaited<ReturnType<typeof mountApp>>;
  let adminUser: User;
  let admin: Client;
  before(async () => {
    app = await mountApp();
    adminUser = await makeUser('admin');
    admin = await signedIn(app.url, adminUser);
  });
  after(() => app.close());

  it('when an admin deactivates a signed-in user, then their live session stops working at once and they cannot sign in', async () => {
    const user = await makeUser();
    const session = await signedIn(app.url, user);
    expect((await session.get('/api/projects')).status).to.equal(200);

    const res = await admin.patch(`/api/admin/users/${user.id}`, { active: false });

    expect(res.status).to.equal(200);
    expect(res.body).to.include({ id: user.id, active: false });
    expectApiError(await session.get('/api/projects'), 401, 'not_signed_in');
    expectApiError(await new ApiClient(app.url).signIn(user.email, TEST_PASSWORD), 403, 'account_inactive');
    expect(await sessionCount(user.id)).to.equal(0);
  });

  it('when an admin reactivates an account, then its owner can sign in again', async () => {
    const user = await makeUser('member', { active: false });

    const res = await admin.patch(`/api/admin/users/${user.id}`, { active: true });

    expect(res.body).to.include({ active: true });
    expect((await new ApiClient(app.url).signIn(user.email, TEST_PASSWORD)).status).to.equal(200);
  });

  it('when an admin tries to deactivate themself, then 409 and their account and session stay', async () => {
    const before = await userState(adminUser.id);

    const res = await admin.patch(`/api/admin/users/${adminUser.id}`, { active: false });

    expectApiError(res, 409, 'conflict');
    expect(await userState(adminUser.id)).to.deep.equal(before);
    expect((await admin.get('/api/admin/users?pageSize=1')).status).to.equal(200);
  });

  it('when an admin tries to remove their own admin role, then 409 and they stay admin', async () => {
    const before = await userState(adminUser.id);
    const res = await admin.patch(`/api/admin/users/${adminUser.id}`, { siteRole: 'member', displayName: 'Sneaky rename' });
    expectApiError(res, 409, 'conflict');
    expect(await userState(adminUser.id)).to.deep.equal(before);
  });

  it('when an admin promotes a member, then that member\'s live session reaches admin routes at once; demoting takes it away', async () => {
    const user = await makeUser();
    const session = await signedIn(app.url, user);
    expectApiError(await session.get('/api/admin/users'), 403, 'forbidden');

    expect((await admin.patch(`/api/admin/users/${user.id}`, { siteRole: 'admin' })).body.siteRole).to.equal('admin');
    expect((await session.get('/api/admin/users')).status).to.equal(200);
    expect((await admin.patch(`/api/admin/users/${user.id}`, { siteRole: 'member' })).body.siteRole).to.equal('member');
    expectApiError(await session.get('/api/admin/users'), 403, 'forbidden');
  });

  it('when an admin renames someone, then 200 and the new name is stored trimmed', async () => {
    const user = await makeUser();
    const res = await admin.patch(`/api/admin/users/${user.id}`, { displayName: '  Ingrid Solvay  ' });
    expect(res.body.displayName).to.equal('Ingrid Solvay');
    expect((await userState(user.id))!['display_name']).to.equal('Ingrid Solvay');
  });

  for (const [what, body, field] of [
    ['an unknown site role', { siteRole: 'owner' }, 'body.siteRole'],
    ['active as a string', { active: 'no' }, 'body.active'],
    ['the e-mail, which cannot be changed here', { email: 'new@example.test' }, 'body'],
    ['nothing at all', {}, 'body'],
  ] as const) {
    it(`when the change has ${what}, then 422 naming ${field} and the account is unchanged`, async () => {
      const user = await makeUser();
      const before = await userState(user.id);

      const res = await admin.patch(`/api/admin/users/${user.id}`, body);

      expectApiError(res, 422, 'validation_failed');
      expect(fieldsOf(res)).to.include(field);
      expect(await userState(user.id)).to.deep.equal(before);
    });
  }

  it('when the user id is unknown or not a uuid, then 404 or 422', async () => {
    expectApiError(await admin.patch(`/api/admin/users/${randomUUID()}`, { active: false }), 404, 'not_found');
    const bad = await admin.patch('/api/admin/users/42', { active: false });
    expectApiError(bad, 422, 'validation_failed');
    expect(fieldsOf(bad)).to.deep.equal(['params.userId']);
  });

  it('when an admin lists users with q, paging and sorting, then the server filters, pages and counts', async () => {
    const tag = unique();
    const people = [];
    for (const name of ['Carla', 'Anton', 'Bruno']) people.push(await makeUser('member', { email: `${name.toLowerCase()}-${tag}@example.test`, displayName: `${name} ${tag}` }));

    const first = await admin.get(`/api/admin/users?q=${tag}&pageSize=2&sort=displayName`);
    const second = await admin.get(`/api/admin/users?q=${tag}&pageSize=2&page=1&sort=displayName`);
    const desc = await admin.get(`/api/admin/users?q=${tag}&sort=email&dir=desc`);

    const names = (res: { body: { items: { displayName: string }[] } }) => res.body.items.map((u) => u.displayName.split(' ')[0]);
    expect(names(first)).to.deep.equal(['Anton', 'Bruno']);
    expect(names(second)).to.deep.equal(['Carla']);
    expect([first.body.total, second.body.total]).to.deep.equal([3, 3]);
    expect(names(desc)).to.deep.equal(['Carla', 'Bruno', 'Anton']);
    expect(first.body.items[0]).to.not.have.any.keys('passwordHash', 'password_hash');
  });
});
