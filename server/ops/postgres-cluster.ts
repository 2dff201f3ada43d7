import { execFileSync, spawnSync } from 'node:child_process';
import { chmodSync, existsSync, mkdirSync, readdirSync, statSync, chownSync } from 'node:fs';
import path from 'node:path';
import pg from 'pg';
import type { Config } from '../config';
import { PROJECT_ROOT } from '../config';

/**
 * A private PostgreSQL cluster inside the project (`.local/postgres`, git-ignored),
 * listening on 127.0.0.1 only, with its socket in a folder of its own.
 * PostgreSQL refuses to run as root, so as root the cluster belongs to Debian's `postgres` user.
 */
export interface Cluster {
  port: number;
  socketDir: string;
  /** True when this process started the server, so it should stop it again. */
  startedHere: boolean;
  stop(): void;
}

const ROOT = path.join(PROJECT_ROOT, '.local', 'postgres');
const DATA = path.join(ROOT, 'data');
const SOCKETS = path.join(ROOT, 'run');
const LOG = path.join(ROOT, 'server.log');
const SUPERUSER = 'postgres';

function binDir(): string {
  const base = '/usr/lib/postgresql';
  const versions = existsSync(base) ? readdirSync(base).filter((v) => /^\d+$/.test(v)).sort((a, b) => Number(b) - Number(a)) : [];
  if (versions.length === 0) throw new Error("PostgreSQL is not installed. Install Debian's package: apt-get install -y postgresql");
  return path.join(base, versions[0]!, 'bin');
}

const asRoot = process.getuid?.() === 0;

/** Runs a PostgreSQL program as the cluster's owner, from a folder that user can read. */
function pgRun(program: string, args: string[], allowFail = false): number {
  const exe = path.join(binDir(), program);
  const [cmd, full] = asRoot ? ['runuser', ['-u', 'postgres', '--', exe, ...args]] : [exe, args];
  const result = spawnSync(cmd, full, { cwd: '/', stdio: ['ignore', 'pipe', 'pipe'], encoding: 'utf8' });
  if (result.status !== 0 && !allowFail) {
    throw new Error(`${program} failed (exit ${result.status}):\n${result.stdout}${result.stderr}\nSee ${LOG} for the server's own log.`);
  }
  return result.status ?? 1;
}

/** The postgres user must be able to walk down to the cluster folder. */
function makeReachable(): void {
  for (let dir = ROOT; dir !== path.dirname(dir); dir = path.dirname(dir)) {
    if (!existsSync(dir)) continue;
    const mode = statSync(dir).mode;
    if ((mode & 0o001) === 0) {
      chmodSync(dir, mode | 0o001);
      console.log(`etchfile: made ${dir} traversable (o+x) so the postgres user can reach its cluster`);
    }
  }
}

function prepareFolders(): void {
  mkdirSync(SOCKETS, { recursive: true });
  if (asRoot) {
    const uid = Number(execFileSync('id', ['-u', 'postgres'], { encoding: 'utf8' }).trim());
    const gid = Number(execFileSync('id', ['-g', 'postgres'], { encoding: 'utf8' }).trim());
    for (const dir of [ROOT, SOCKETS, ...(existsSync(DATA) ? [DATA] : [])]) chownSync(dir, uid, gid);
    makeReachable();
  }
  chmodSync(SOCKETS, 0o700);
}

/** Makes sure the cluster exists and runs on `port`; safe to call again and again. */
export function ensureCluster(port: number): Cluster {
  prepareFolders();
  if (!existsSync(path.join(DATA, 'PG_VERSION'))) {
    console.log('etchfile: creating a private PostgreSQL cluster in .local/postgres …');
    // Trust only over the private socket folder (0700, owner only); TCP clients need a password.
    pgRun('initdb', ['-D', DATA, '-U', SUPERUSER, '--auth-local=trust', '--auth-host=scram-sha-256', '-E', 'UTF8', '--locale=C.UTF-8']);
  }
  let startedHere = false;
  if (pgRun('pg_ctl', ['status', '-D', DATA], true) !== 0) {
    const options = `-c listen_addresses=127.0.0.1 -p ${port} -k ${SOCKETS}`;
    pgRun('pg_ctl', ['start', '-D', DATA, '-l', LOG, '-w', '-t', '60', '-o', options]);
    startedHere = true;
  }
  return {
    port,
    socketDir: SOCKETS,
    startedHere,
    stop: () => void pgRun('pg_ctl', ['stop', '-D', DATA, '-m', 'fast', '-w'], true),
  };
}

/** Creates the login role and the database if missing; `fresh` drops the database first (tests). */
export async function ensureDatabase(cluster: Cluster, db: Config['db'], options: { fresh: boolean }): Promise<void> {
  const admin = new pg.Client({ host: cluster.socketDir, port: cluster.port, user: SUPERUSER, database: 'postgres' });
  await admin.connect();
  try {
    const role = await admin.query('SELECT 1 FROM pg_roles WHERE rolname = $1', [db.user]);
    const password = `'${db.password.replace(/'/g, "''")}'`;
    const verb = role.rowCount ? 'ALTER' : 'CREATE';
    await admin.query(`${verb} ROLE ${pg.escapeIdentifier(db.user)} WITH LOGIN PASSWORD ${password}`);
    if (options.fresh) await admin.query(`DROP DATABASE IF EXISTS ${pg.escapeIdentifier(db.name)} WITH (FORCE)`);
    const exists = await admin.query('SELECT 1 FROM pg_database WHERE datname = $1', [db.name]);
    if (!exists.rowCount) await admin.query(`CREATE DATABASE ${pg.escapeIdentifier(db.name)} OWNER ${pg.escapeIdentifier(db.user)}`);
  } finally {
    await admin.end();
  }
}
