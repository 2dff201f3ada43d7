import { spawnSync } from 'node:child_process';
import path from 'node:path';
import { PROJECT_ROOT } from '../config';
import { buildClientIfStale } from './client-build';

/**
 * `npm test`: type-check, build the client the browser tests open, then mocha
 * (its root hooks start the database and the app). Mocha's own exit code is ours.
 */
const bin = (name: string) => path.join(PROJECT_ROOT, 'node_modules', '.bin', name);

console.log('etchfile: type-checking server, shared and tests…');
const tsc = spawnSync(bin('tsc'), ['--noEmit', '-p', 'tsconfig.json'], { cwd: PROJECT_ROOT, stdio: 'inherit' });
if (tsc.status !== 0) {
  console.log('\nType errors above; no tests were run.\n0 passed, 1 failed');
  process.exit(1);
}
try {
  buildClientIfStale();
} catch (err) {
  console.log(`\n${(err as Error).message}\n0 passed, 1 failed`);
  process.exit(1);
}
const mocha = spawnSync(bin('mocha'), process.argv.slice(2), { cwd: PROJECT_ROOT, stdio: 'inherit' });
process.exit(mocha.status ?? 1);
