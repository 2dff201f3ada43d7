import { spawnSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { existsSync, readdirSync, readFileSync, statSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { PROJECT_ROOT } from '../config';

const INPUTS = ['src', 'shared', 'angular.json', 'tsconfig.json', 'tsconfig.app.json', 'package-lock.json'];
const STAMP = path.join(PROJECT_ROOT, 'dist', 'client', '.source-hash');

function hashInputs(): string {
  const hash = createHash('sha256');
  const visit = (p: string) => {
    if (!existsSync(p)) return;
    if (statSync(p).isDirectory()) {
      for (const name of readdirSync(p).sort()) visit(path.join(p, name));
    } else {
      hash.update(path.relative(PROJECT_ROOT, p)).update(readFileSync(p));
    }
  };
  for (const input of INPUTS) visit(path.join(PROJECT_ROOT, input));
  return hash.digest('hex');
}

/** Runs the production client build only when its sources changed, so a second `npm start` is quick. */
export function buildClientIfStale(): void {
  const current = hashInputs();
  if (existsSync(STAMP) && readFileSync(STAMP, 'utf8') === current) return;
  console.log('etchfile: building the client (ng build)…');
  const ng = path.join(PROJECT_ROOT, 'node_modules', '.bin', 'ng');
  const result = spawnSync(ng, ['build'], { cwd: PROJECT_ROOT, stdio: 'inherit', env: { ...process.env, NG_CLI_ANALYTICS: 'false' } });
  if (result.status !== 0) throw new Error('The client build failed; see the messages above.');
  writeFileSync(STAMP, current);
}
