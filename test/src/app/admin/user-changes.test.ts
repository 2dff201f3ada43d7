import { expect } from 'chai';
import type { UserSummary } from '../../../../shared/admin';
import { userChanges } from '../../../../src/app/admin/user-changes';

const user = (change: Partial<UserSummary>): UserSummary => ({
  id: 'u2',
  email: 'ana@lab.test',
  displayName: 'Ana Ruiz',
  siteRole: 'member',
  active: true,
  hasPassword: true,
  createdAt: '2026-01-05T08:00:00Z',
  lastSignInAt: null,
  ...change,
});

describe('client: user changes an administrator may make', () => {
  it('offers nothing on the administrator’s own row, so they cannot lock themself out', () => {
    expect(userChanges(user({ id: 'me', siteRole: 'admin' }), 'me')).to.deep.equal([]);
  });

  it('offers an active member promotion and deactivation, both asked first', () => {
    const changes = userChanges(user({}), 'me');

    expect(changes.map((c) => c.body)).to.deep.equal([{ siteRole: 'admin' }, { active: false }]);
    expect(changes.every((c) => c.confirmation !== null)).to.equal(true);
    expect(changes[0]!.confirmation!.title).to.contain('Ana Ruiz');
  });

  it('offers an administrator a demotion to member, asked first', () => {
    const [role] = userChanges(user({ siteRole: 'admin' }), 'me');

    expect(role!.body).to.deep.equal({ siteRole: 'member' });
    expect(role!.confirmation).not.to.equal(null);
    expect(role!.done).to.equal('Ana Ruiz is now a member.');
  });

  it('reactivates an inactive account without asking, since it takes no right away', () => {
    const [, activity] = userChanges(user({ active: false }), 'me');

    expect(activity!.body).to.deep.equal({ active: true });
    expect(activity!.confirmation).to.equal(null);
    expect(activity!.done).to.equal('Ana Ruiz can sign in again.');
  });

  it('offers the changes when nobody is known to be signed in', () => {
    expect(userChanges(user({}), null)).to.have.length(2);
  });
});
