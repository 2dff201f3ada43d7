import { rm } from 'node:fs/promises';
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
  running = await startServer(testConfig, logger);
  setRunningServer(running);
});

after(async () => {
  await running?.stop();
  if (cluster?.startedHere) cluster.stop();
});
