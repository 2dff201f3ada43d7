import PgBoss from 'pg-boss';
import type { Logger } from 'pino';
import type { EntityManager } from 'typeorm';
import type { Config } from '../config';

export const DERIVATIVES_QUEUE = 'image-derivatives';

/** What a derivatives job carries: only the id; everything else is read from the row when it runs. */
export interface DerivativesJobData {
  imageId: string;
}

/** pg-boss's tables live in their own schema of the application database. */
const SCHEMA = 'pgboss';

/**
 * The durable job queue (pg-boss in PostgreSQL). Jobs survive restarts; a job whose worker
 * died is failed by pg-boss after `jobTimeoutSeconds` and retried with back-off.
 */
export class JobQueue {
  private localWorker: string | null = null;

  private constructor(
    readonly boss: PgBoss,
    private readonly logger: Logger,
  ) {}

  static async start(config: Config, logger: Logger): Promise<JobQueue> {
    const boss = new PgBoss({
      host: config.db.host,
      port: config.db.port,
      database: config.db.name,
      user: config.db.user,
      password: config.db.password,
      schema: SCHEMA,
      max: 4,
      application_name: 'etchfile-jobs',
      schedule: false,
    });
    boss.on('error', (err) => logger.error({ err }, 'job queue error'));
    await boss.start();
    // Idempotent: pg-boss 10 creates a queue only once (later calls find it).
    if (!(await boss.getQueue(DERIVATIVES_QUEUE))) {
      await boss.createQueue(DERIVATIVES_QUEUE, {
        name: DERIVATIVES_QUEUE,
        retryLimit: 3,
        retryDelay: 15,
        retryBackoff: true,
        expireInSeconds: config.jobTimeoutSeconds,
      });
    }
    return new JobQueue(boss, logger);
  }

  /**
   * Queues the derivatives of one image. Given a transaction's manager, the job is inserted in
   * that transaction, so a row never exists without its job (and no job without its row).
   */
  async enqueueDerivatives(imageId: string, manager?: EntityManager): Promise<void> {
    const data: DerivativesJobData = { imageId };
    const db = manager ? { executeSql: async (text: string, values: unknown[]) => ({ rows: await manager.query(text, values) }) } : undefined;
    await this.boss.send(DERIVATIVES_QUEUE, data, db ? { db } : {});
  }

  /** Wakes a worker in this process at once instead of at its next poll (call after the commit). */
  nudge(): void {
    if (this.localWorker) this.boss.notifyWorker(this.localWorker);
  }

  /** Runs `handler` for each job in this process, one at a time. */
  async work(handler: (job: PgBoss.JobWithMetadata<DerivativesJobData>) => Promise<void>): Promise<void> {
    this.localWorker = await this.boss.work<DerivativesJobData>(
      DERIVATIVES_QUEUE,
      { includeMetadata: true, batchSize: 1, pollingIntervalSeconds: 2 },
      async ([job]) => {
        if (job) await handler(job);
      },
    );
    this.logger.info('derivatives worker started');
  }

  async stop(): Promise<void> {
    await this.boss.stop({ graceful: true, wait: true, timeout: 30_000 });
  }
}
