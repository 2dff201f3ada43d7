import { expect } from 'chai';
import type { DataSource } from 'typeorm';
import type { User } from '../../../server/auth/user.entity';
import { createDataSource } from '../../../server/database/data-source';
import { ApiClient, mountApp } from '../../support/api-client';
import { makeUser, signedIn, TEST_PASSWORD } from '../../support/fixtures';
import { testConfig } from '../../support/test-config';
import { expectApiError } from '../error-shape';
import { TcpProxy } from './tcp-proxy';

describe('http: when the database cannot be reached', () => {
  // An app of its own whose DataSource reaches PostgreSQL only through a proxy the tests can cut.
  let proxy: TcpProxy;
  let dataSource: DataSource;
  let app: Awaited<ReturnType<typeof mountApp>>;
  let user: User;
  let client: ApiClient;

  before(async () => {
    proxy = new TcpProxy(testConfig.db.host, testConfig.db.port);
    const port = await proxy.open();
    dataSource = createDataSource({ ...testConfig.db, host: '127.0.0.1', port });
    await dataSource.initialize();
    app = await mountApp({ dataSource });
    user = await makeUser();
    client = await signedIn(app.url, user);
    expect((await client.get('/api/projects')).status).to.equal(200);
    await proxy.close();
  });

  after(async () => {
    await app.close();
    await dataSource.destroy();
    await proxy.close();
  });

  it('when the health check runs, then 503 with database "down"', async () => {
    const res = await new ApiClient(app.url).get('/api/health');
    expect(res.status).to.equal(503);
    expect(res.body).to.include({ status: 'degraded', database: 'down' });
  });

  it('when a signed-in browser loads its session, then 503 database_unavailable with Retry-After', async () => {
    const res = await client.get('/api/auth/session');
    expectApiError(res, 503, 'database_unavailable');
    expect(res.headers.get('retry-after')).to.match(/^\d+$/);
  });

  it('when a new browser loads its session, then 503 too, not a CSRF token that was never stored', async () => {
    const res = await new ApiClient(app.url).get('/api/auth/session');
    expectApiError(res, 503, 'database_unavailable');
    expect(res.headers.get('retry-after')).to.match(/^\d+$/);
  });

  it('when data or a sign-in is asked for, then 503 rather than "not found" or "wrong password"', async () => {
    expectApiError(await client.get('/api/projects'), 503, 'database_unavailable');
    expectApiError(await client.post('/api/auth/sign-in', { email: user.email, password: TEST_PASSWORD }), 503, 'database_unavailable');
  });

  describe('and then it is back', () => {
    before(() => proxy.open());

    it('when the same app is asked again, then it answers 200 by itself within a few seconds, and sessions survived', async () => {
      const deadline = Date.now() + 5000;
      let health = await new ApiClient(app.url).get('/api/health');
      while (health.status !== 200 && Date.now() < deadline) {
        await new Promise((r) => setTimeout(r, 100));
        health = await new ApiClient(app.url).get('/api/health');
      }

      expect(health.status).to.equal(200);
      expect(health.body.database).to.equal('up');
      const session = await client.get('/api/auth/session');
      expect(session.status).to.equal(200);
      expect(session.body.user.id).to.equal(user.id);
      expect((await client.get('/api/projects')).status).to.equal(200);
    });
  });
});
