import { createLogger } from '../logger';
import { loadConfig } from '../config';
import { prepareDatabase } from './prepare-database';

/** `npm run migrate`: applies pending migrations to the configured database (starting the local cluster if needed). */
const config = loadConfig();
const cluster = await prepareDatabase(config, createLogger(config), { fresh: false, demo: false });
if (cluster.startedHere) cluster.stop();
