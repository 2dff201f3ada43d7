import { pino } from 'pino';
import { loadConfig } from '../config';
import { createDataSource } from '../database/data-source';
import { Mailer } from '../mail/mailer';
import { startNotificationWorker } from '../notifications/notification-worker';
import { createFileStore } from '../storage/create-file-store';
import { JobQueue } from './queue';
import { startDerivativesWorker } from './worker';

/**
 * `npm run worker`: a derivatives worker on its own, for a machine that only processes images.
 * It shares the database (and so the queue) and the file store with the web process; the
 * schema must already be migrated (`npm run migrate` or a running `npm run serve`).
 */
const config = loadConfig();
const logger = pino({ level: config.logLevel });
const dataSource = createDataSource(config.db);
await dataSource.initialize();
const queue = await JobQueue.start(config, logger);
await startDerivativesWorker({ dataSource, files: createFileStore(config), config, logger }, queue);
// Notification e-mail runs here too, so a deployment whose web processes run no worker still sends it.
const notifications = await startNotificationWorker({ dataSource, mailer: new Mailer(config.smtp, logger), config, logger }, queue);

for (const signal of ['SIGINT', 'SIGTERM'] as const) {
  process.once(signal, () => {
    logger.info('worker stopping after the current job');
    void notifications
      .stop()
      .then(() => queue.stop())
      .then(() => dataSource.destroy())
      .finally(() => process.exit(0));
  });
}
