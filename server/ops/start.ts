import { createLogger } from '../logger';
import { loadConfig } from '../config';
import { DEMO_ACCOUNTS } from '../demo/demo-accounts';
import { loadDemoImagesOnce } from '../demo/demo-images';
import { startServer } from '../main';
import { buildClientIfStale } from './client-build';
import { prepareDatabase } from './prepare-database';

/** `npm start`: database, demo scenario, client build, then one process serving app and API. */
const config = loadConfig();
const logger = createLogger(config);
const cluster = await prepareDatabase(config, logger, { fresh: false, demo: config.local });
buildClientIfStale();
const running = await startServer(config, logger);
if (config.local) await loadDemoImagesOnce(config, running.ctx.dataSource, logger);

console.log(`\n  Etchfile is ready: ${config.publicUrl}\n`);
if (config.local) {
  console.log('  Demo accounts (local mode only):');
  for (const a of DEMO_ACCOUNTS) console.log(`    ${a.role.padEnd(12)} ${a.email.padEnd(32)} ${a.password}`);
  console.log(`\n  Mail sent by the app is kept, not delivered: Admin → Mail outbox.\n  Ctrl-C stops the server${cluster.startedHere ? ' and the database it started' : ''}.\n`);
}

let stopping = false;
for (const signal of ['SIGINT', 'SIGTERM'] as const) {
  process.once(signal, () => {
    if (stopping) return;
    stopping = true;
    void running.stop().finally(() => {
      if (cluster.startedHere) cluster.stop();
      process.exit(0);
    });
  });
}
