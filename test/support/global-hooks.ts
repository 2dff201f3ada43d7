import { rm } from 'node:fs/promises';
import pg from 'pg';
import { pino } from 'pino';
import { startServer, type RunningServer } from '../../server/main';
import { prepareDatabase } from '../../server/ops/prepare-database';
import type { Cluster } from '../../server/ops/postgres-cluster';
import { setRunningServer } from './test-server';
import { testConfig } from './test-config';

/**
 * Root hooks (this file is the first spec mocha loads). Once per run: the private PostgreSQL cluster runs, a fresh test database is migrated,
 * and one app (with the fake SMTP server) serves on the test port for API and browser tests.
 */
let cluster: Cluster | undefined;
let running: RunningServer | undefined;

before(async function () {
  this.timeout(120_000);
  const logger = pino({ level: testConfig.logLevel });
  await rm(testConfig.storageDir, { recursive: true, force: true });
  cluster = await prepareDatabase(testConfig, logger, { fresh: true, demo: true });
  await holdDailyDigest();
  running = await startServer(testConfig, logger);
  setRunningServer(running);
});

after(async () => {
  await running?.stop();
  if (cluster?.startedHere) cluster.stop();
});

/**
 * The worker's own daily digest would sweep up items a notification test is still looking at (it starts
 * at the first check after the digest hour): today and tomorrow (UTC) count as done. Tests that want a
 * digest send the job themselves.
 */
async function holdDailyDigest(): Promise<void> {
  const { host, port, name, user, password } = testConfig.db;
  const client = new pg.Client({ host, port, database: name, user, password });
  await client.connect();
  try {
    await client.query(
      `INSERT INTO notification_digest_days (day)
       VALUES ((now() AT TIME ZONE 'UTC')::date), ((now() AT TIME ZONE 'UTC')::date + 1) ON CONFLICT DO NOTHING`,
    );
  } finally {
    await client.end();
  }
}
