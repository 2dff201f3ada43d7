import { readFile } from 'node:fs/promises';
import path from 'node:path';
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

  it('when a viewer link is opened, then the app page preloads the viewer page, konva and all they import, each a file that exists; other pages get no such list', async () => {
    const clientDir = runningServer().ctx.config.clientDir;
    const links = (html: string) => [...html.matchAll(/<link rel="modulepreload" href="(chunk-[A-Za-z0-9]+\.js)">/g)].map((m) => m[1]!);
    const viewerLinks = links(await (await fetch(`${base()}/projects/p1/images/i1/view`)).text());
    const plainLinks = links(await (await fetch(`${base()}/projects/p1`)).text());
    const added = viewerLinks.filter((c) => !plainLinks.includes(c));
    const code = await Promise.all(added.map((chunk) => readFile(path.join(clientDir, chunk), 'utf8')));

    expect(new Set(viewerLinks).size, 'no chunk twice').to.equal(viewerLinks.length);
    expect(code.some((text) => text.includes('"ef-viewer-page"')), 'the viewer page itself').to.equal(true);
    // konva's own source prefixes its console warnings with "Konva warning: ".
    expect(code.some((text) => text.includes('Konva warning: ')), 'konva').to.equal(true);
    // Every chunk a preloaded chunk imports statically is preloaded too.
    for (const text of code) {
      for (const [, dep] of text.matchAll(/(?:from|import)\s*"\.\/(chunk-[A-Za-z0-9]+\.js)"/g)) {
        expect(viewerLinks.includes(dep!), `${dep} imported but not preloaded`).to.equal(true);
      }
    }
  });
});
