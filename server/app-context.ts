import type { Logger } from 'pino';
import type { DataSource } from 'typeorm';
import type { Config } from './config';
import type { JobQueue } from './jobs/queue';
import type { Mailer } from './mail/mailer';
import type { FileStore } from './storage/file-store';

/** What every feature router is built from; one per running app (tests make their own). */
export interface AppContext {
  config: Config;
  dataSource: DataSource;
  mailer: Mailer;
  logger: Logger;
  /** Originals and derivatives (local folder or S3). */
  files: FileStore;
  /** The durable job queue (pg-boss) that makes derivatives outside requests. */
  jobs: JobQueue;
}
