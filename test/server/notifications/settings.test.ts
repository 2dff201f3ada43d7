import { expect } from 'chai';
import type { NotificationSettings } from '../../../shared/notifications';
import { ApiClient, mountApp } from '../../support/api-client';
import { makeUser, signedIn } from '../../support/fixtures';
import { runningServer } from '../../support/test-server';
import { sql } from '../db-state';
import { expectApiError } from '../error-shape';
import { ACTORS, sceneFor, who } from '../role-actors';

const PATH = '/api/me/notification-settings';

describe('notifications: each person’s delivery settings', () => {
  let app: Awaited<ReturnType<typeof mountApp>>;
  before(async () => (app = await mountApp()));
  after(() => app.close());

  const put = (c: ApiClient, body: unknown) => c.request<NotificationSettings>('PUT', PATH, body);
  const stored = (userId: string) => sql('SELECT delivery, updated_at FROM notification_settings WHERE user_id = $1', [userId]);

  it('when someone has never chosen, then they get each notification as it happens', async () => {
    const res = await (await signedIn(app.url, await makeUser())).get(PATH);
    expect(res.status).to.equal(200);
    expect(res.body).to.deep.equal({ delivery: 'immediate', digestHourUtc: runningServer().ctx.config.notifications.digestHourUtc, updatedAt: null });
  });

  it('when someone chooses the daily digest and then off, then each choice is kept for them alone', async () => {
    const [me, other] = [await makeUser(), await makeUser()];
    const client = await signedIn(app.url, me);

    const daily = await put(client, { delivery: 'daily' });
    expect(daily.status).to.equal(200);
    expect(daily.body.delivery).to.equal('daily');
    expect(Date.parse(daily.body.updatedAt ?? '')).to.be.closeTo(Date.now(), 60_000);
    expect((await put(client, { delivery: 'off' })).body.delivery).to.equal('off');

    expect((await client.get(PATH)).body.delivery).to.equal('off');
    expect((await (await signedIn(app.url, other)).get(PATH)).body.delivery).to.equal('immediate');
  });

  for (const [title, body, field] of [
    ['an unknown mode', { delivery: 'weekly' }, 'body.delivery'],
    ['no mode', {}, 'body.delivery'],
    ['someone else’s id', { delivery: 'off', userId: '8b0c8a0e-4d7f-4e53-9d0f-1a2b3c4d5e6f' }, 'body'],
  ] as const) {
    it(`when someone sends ${title}, then 422 naming ${field} and their choice stays`, async () => {
      const me = await makeUser();
      const client = await signedIn(app.url, me);
      await put(client, { delivery: 'daily' });
      const before = await stored(me.id);
      const res = await put(client, body);
      const error = expectApiError(res, 422, 'validation_failed');
      expect(error.details?.map((d) => d.field)).to.deep.equal([field]);
      if (title === 'an unknown mode') expect(error.message).to.contain('Choose immediate, daily or off.');
      expect(await stored(me.id)).to.deep.equal(before);
    });
  }

  // Settings belong to the person, not to a project: every signed-in caller has their own, whatever their roles.
  for (const actor of ACTORS) {
    const expected = actor === 'signed-out' ? 401 : 200;
    it(`when a ${who(actor)} reads and sets their settings, then ${expected}`, async () => {
      const { client, user } = await sceneFor(app.url, actor);
      expect((await client.get(PATH)).status).to.equal(expected);
      expect((await put(client, { delivery: 'daily' })).status).to.equal(expected);
      if (user) expect((await stored(user.id)).map((r) => (r as { delivery: string }).delivery)).to.deep.equal(['daily']);
    });
  }
});
