import { expect } from 'chai';
import { readFile } from 'node:fs/promises';
import path from 'node:path';
import { PROJECT_ROOT } from '../../server/config';
import { ACTION_LABELS, PERMISSIONS, PROJECT_ACTIONS, PROJECT_ROLES } from '../../shared/roles';

/** The rows of the Markdown table between the README's permission-matrix markers, as trimmed cells. */
async function readmeMatrix(): Promise<string[][]> {
  const readme = await readFile(path.join(PROJECT_ROOT, 'README.md'), 'utf8');
  const match = /<!-- permission-matrix:start[^>]*-->([\s\S]*?)<!-- permission-matrix:end -->/.exec(readme);
  if (!match) throw new Error('README.md has no <!-- permission-matrix:start --> ... <!-- permission-matrix:end --> block');
  return match[1]!
    .split('\n')
    .map((line) => line.trim())
    .filter((line) => line.startsWith('|'))
    .map((line) => line.replace(/^\||\|$/g, '').split('|').map((cell) => cell.trim()));
}

describe('README permission matrix', () => {
  it('when the README table is read, then its columns are the project roles in order', async () => {
    const [header] = await readmeMatrix();
    expect(header).to.deep.equal(['Action', ...PROJECT_ROLES]);
  });

  it('when the README table is read, then it has one row per action, labelled and marked exactly as PERMISSIONS says', async () => {
    const [, separator, ...rows] = await readmeMatrix();
    expect(separator!.every((cell) => /^:?-+:?$/.test(cell)), 'second line is the Markdown separator').to.equal(true);

    const expected = PROJECT_ACTIONS.map((action) => [ACTION_LABELS[action], ...PROJECT_ROLES.map((role) => (PERMISSIONS[action].includes(role) ? 'yes' : '—'))]);
    expect(rows).to.deep.equal(expected);
  });
});
