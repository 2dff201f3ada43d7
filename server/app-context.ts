import type { Logger } from 'pino';
import type { DataSource } from 'typeorm';
import type { Config } from './config';
import type { Mailer } from './mail/mailer';

/** What every feature router is built from; one per running app (tests make their own). */
export interface AppContext {
  config: Config;
  dataSource: DataSource;
  mailer: Mailer;
  logger: Logger;
}
