import type { Logger } from 'pino';
import type { Config } from '../config';
import { createDataSource } from '../database/data-source';
import { loadDemoScenarioOnce } from '../demo/demo-scenario';
import { ensureCluster, ensureDatabase, type Cluster } from './postgres-cluster';

/** Cluster up, role and database present, migrations applied; the demo scenario too when asked. */
export async function prepareDatabase(
  config: Config,
  logger: Logger,
  options: { fresh: boolean; demo: boolean },
): Promise<Cluster> {
  const cluster = ensureCluster(config.db.port);
  await ensureDatabase(cluster, config.db, { fresh: options.fresh });
  const ds = createDataSource(config.db);
  await ds.initialize();
  try {
    const applied = await ds.runMigrations({ transaction: 'each' });
    if (applied.length > 0) logger.info({ migrations: applied.map((m) => m.name) }, 'migrations applied');
    if (options.demo) await loadDemoScenarioOnce(ds, logger);
  } finally {
    await ds.destroy();
  }
  return cluster;
}
