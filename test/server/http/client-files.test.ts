import { expect } from 'chai';
import { runningServer } from '../../support/test-server';

describe('serving the client', () => {
  const base = () => runningServer().ctx.config.publicUrl;

  it('when a client route is asked for, then the app page answers so the browser can route it', async () => {
    const res = await fetch(`${base()}/projects/some-project`);
    expect(res.status).to.equal(200);
    expect(res.headers.get('content-type')).to.contain('text/html');
    expect(res.headers.get('cache-control')).to.equal('no-cache');
  });

  it('when a file that does not exist is asked for, then 404 rather than the app page', async () => {
    const res = await fetch(`${base()}/chunk-DOESNOTEXIST.js`);
    expect(res.status).to.equal(404);
    expect(res.headers.get('content-type')).to.contain('text/plain');
  });

  it('sends a content security policy that allows only this origin', async () => {
    const csp = (await fetch(`${base()}/`)).headers.get('content-security-policy') ?? '';
    expect(csp).to.contain("default-src 'self'");
    expect(csp).to.contain("connect-src 'self'");
    expect(csp).not.to.match(/https?:\/\//);
  });
});
