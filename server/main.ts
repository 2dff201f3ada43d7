import type { Server } from 'node:http';
import type { Logger } from 'pino';
import { createLogger } from './logger';
import type { AppContext } from './app-context';
import { createApp } from './app';
import { loadConfig, type Config } from './config';
import { createDataSource } from './database/data-source';
import { JobQueue } from './jobs/queue';
import { startDerivativesWorker } from './jobs/worker';
import { startFakeSmtp } from './mail/fake-smtp';
import { Mailer } from './mail/mailer';
import { startNotificationWorker } from './notifications/notification-worker';
import { createFileStore } from './storage/create-file-store';

export interface RunningServer {
  ctx: AppContext;
  server: Server;
  /** The local fake mail server (local mode); replaceable, so a test can stop it and start it again. */
  smtp: { close(): Promise<void> } | null;
  stop(): Promise<void>;
}

/** Connects, migrates, starts the fake SMTP server in local mode, and listens. */
export async function startServer(config: Config = loadConfig(), logger: Logger = createLogger(config)): Promise<RunningServer> {
  const dataSource = createDataSource(config.db);
  await dataSource.initialize();
  const applied = await dataSource.runMigrations({ transaction: 'each' });
  if (applied.length > 0) logger.info({ migrations: applied.map((m) => m.name) }, 'migrations applied');

  const smtp = config.smtp.fake ? await startFakeSmtp(config.smtp.host, config.smtp.port, config.storageDir) : null;
  const mailer = new Mailer(config.smtp, logger);
  const files = createFileStore(config);
  const jobs = await JobQueue.start(config, logger);
  const ctx: AppContext = { config, dataSource, mailer, logger, files, jobs };
  // EF_WORKER=false leaves the derivatives to `npm run worker` processes elsewhere.
  if (config.worker) await startDerivativesWorker({ dataSource, files, config, logger }, jobs);
  const notifications = config.worker ? await startNotificationWorker({ dataSource, mailer, config, logger }, jobs) : null;
  const server = createApp(ctx).listen(config.port, config.host);
  await new Promise<void>((resolve, reject) => server.once('listening', resolve).once('error', reject));
  logger.info(`Etchfile is serving on http://${config.host}:${config.port}`);

  const running: RunningServer = {
    ctx,
    server,
    smtp,
    async stop() {
      const closed = new Promise<void>((resolve) => server.close(() => resolve()));
      // Keep-alive connections would hold close() open until they time out.
      server.closeAllConnections();
      await closed;
      await notifications?.stop();
      mailer.close();
      await jobs.stop();
      await running.smtp?.close();
      await dataSource.destroy();
    },
  };
  return running;
}

// Run directly (`npm run serve`, production): the database must already be running.
if (import.meta.url === `file://${process.argv[1]}`) {
  void startServer().then((running) => {
    for (const signal of ['SIGINT', 'SIGTERM'] as const) {
      process.once(signal, () => void running.stop().then(() => process.exit(0)));
    }
  });
}
