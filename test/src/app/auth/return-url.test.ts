import { expect } from 'chai';
import { safeReturnUrl } from '../../../../src/app/auth/return-url';

const APP = 'https://etchfile.test';
/** Where a browser would go from the app's sign-in page. */
const landing = (url: string) => new URL(url, `${APP}/sign-in`);

describe('client: return url after signing in', () => {
  it('follows a path inside the app, with its query and fragment', () => {
    expect(safeReturnUrl('/projects/p1/samples/s1')).to.equal('/projects/p1/samples/s1');
    expect(safeReturnUrl('/projects/p1/images?modality=sem_secondary#grid')).to.equal('/projects/p1/images?modality=sem_secondary#grid');
  });

  it('goes to the project list when there is no return url', () => {
    expect(safeReturnUrl(null)).to.equal('/projects');
    expect(safeReturnUrl(undefined)).to.equal('/projects');
    expect(safeReturnUrl('')).to.equal('/projects');
  });

  it('refuses a protocol-relative url, which a browser reads as another site', () => {
    // WHATWG URL Standard: "//host" is a scheme-relative URL.
    expect(landing('//evil.example').origin).to.equal('https://evil.example');
    expect(safeReturnUrl('//evil.example')).to.equal('/projects');
    expect(safeReturnUrl('//evil.example/projects')).to.equal('/projects');
  });

  it('refuses "/\\evil.example", which browsers treat like "//evil.example"', () => {
    // WHATWG URL Standard: in special schemes "\" is read as "/".
    expect(landing('/\\evil.example').origin).to.equal('https://evil.example');
    expect(safeReturnUrl('/\\evil.example')).to.equal('/projects');
  });

  it('refuses absolute urls and script urls', () => {
    for (const attempt of ['https://evil.example/', 'http://evil.example', 'javascript:alert(document.cookie)', 'JaVaScRiPt:alert(1)', 'data:text/html,<script>alert(1)</script>']) {
      expect(safeReturnUrl(attempt), attempt).to.equal('/projects');
    }
  });

  it('refuses relative paths and urls that only start with a slash after a space or backslash', () => {
    for (const attempt of ['projects', ' //evil.example', '\\\\evil.example', '\\/evil.example']) {
      expect(safeReturnUrl(attempt), attempt).to.equal('/projects');
    }
  });

  it('never sends a fresh session back to the sign-in page', () => {
    expect(safeReturnUrl('/sign-in')).to.equal('/projects');
    expect(safeReturnUrl('/sign-in?returnUrl=%2Fprojects')).to.equal('/projects');
  });

  it('keeps every url it returns on the app’s own origin', () => {
    const attempts = ['//evil.example', '/\\evil.example', 'https://evil.example', '/projects', '/%2F%2Fevil.example', '/./\\evil.example'];
    for (const attempt of attempts) expect(landing(safeReturnUrl(attempt)).origin, attempt).to.equal(APP);
  });

  it('keeps "/<tab>/evil.example" on the app (browsers strip tab and newline, leaving "//evil.example")', () => {
    // WHATWG URL Standard, basic URL parser: "Remove all ASCII tab or newline from input."
    for (const attempt of ['/\t/evil.example', '/\n/evil.example', '/\r\n\\evil.example']) {
      expect(landing(safeReturnUrl(attempt)).origin, JSON.stringify(attempt)).to.equal(APP);
    }
  });
});
