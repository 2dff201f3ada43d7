import { expect } from 'chai';
import { ApiClient } from '../../support/api-client';
import { runningServer } from '../../support/test-server';

describe('health', () => {
  it('when the database is up, then GET /api/health says so without a session', async () => {
    const client = new ApiClient(runningServer().ctx.config.publicUrl);
    const res = await client.get('/api/health');
    expect(res.status).to.equal(200);
    expect(res.body).to.include({ status: 'ok', database: 'up', mode: 'local' });
    expect(res.headers.get('set-cookie')).to.equal(null);
  });
});
