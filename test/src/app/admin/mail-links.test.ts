import { expect } from 'chai';
import { splitLinks } from '../../../../src/app/admin/mail-links';

describe('client: mail links', () => {
  it('splits text around an http(s) link, in order', () => {
    const parts = splitLinks('Set your password: https://etchfile.test/reset?token=abc123 within 24 hours.');

    expect(parts).to.deep.equal([
      { text: 'Set your password: ' },
      { text: 'https://etchfile.test/reset?token=abc123', href: 'https://etchfile.test/reset?token=abc123' },
      { text: ' within 24 hours.' },
    ]);
  });

  it('leaves sentence punctuation after a link outside it', () => {
    const parts = splitLinks('Open http://localhost:4200/invite/x1. Or (see https://etchfile.test/help), thanks!');

    expect(parts.filter((p) => p.href).map((p) => p.href)).to.deep.equal(['http://localhost:4200/invite/x1', 'https://etchfile.test/help']);
    expect(parts.map((p) => p.text).join('')).to.equal('Open http://localhost:4200/invite/x1. Or (see https://etchfile.test/help), thanks!');
  });

  it('keeps two links on separate lines apart', () => {
    const parts = splitLinks('https://a.test/1\nhttps://b.test/2');

    expect(parts).to.deep.equal([
      { text: 'https://a.test/1', href: 'https://a.test/1' },
      { text: '\n' },
      { text: 'https://b.test/2', href: 'https://b.test/2' },
    ]);
  });

  it('makes no link of other schemes', () => {
    for (const text of ['javascript:alert(1)', 'mailto:lab@example.test', 'ftp://files.test/x', 'data:text/html,hi']) {
      expect(splitLinks(text), text).to.deep.equal([{ text }]);
    }
  });

  it('ends a link at a quote or angle bracket, so markup cannot ride along', () => {
    const parts = splitLinks('<https://etchfile.test/a"onmouseover=alert(1)>');

    expect(parts.find((p) => p.href)).to.deep.equal({ text: 'https://etchfile.test/a', href: 'https://etchfile.test/a' });
  });

  it('gives plain text back whole, and nothing for empty text', () => {
    expect(splitLinks('No links here.')).to.deep.equal([{ text: 'No links here.' }]);
    expect(splitLinks('')).to.deep.equal([]);
  });
});
