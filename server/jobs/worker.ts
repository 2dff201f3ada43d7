import os from 'node:os';
import sharp from 'sharp';
import { makeDerivatives, type DerivativesDeps } from './derivatives.job';
import { DERIVATIVES_QUEUE, type JobQueue } from './queue';

/**
 * Starts taking derivatives jobs in this process. First it queues again any image that says
 * queued/processing but has no live job (e.g. its job was purged while the queue was down),
 * so no image waits forever; jobs whose worker died are retried by pg-boss after their expiry.
 */
export async function startDerivativesWorker(deps: DerivativesDeps, queue: JobQueue): Promise<void> {
  // sharp runs libvips on one thread by default on glibc; tiling is CPU-bound, so use the cores.
  sharp.concurrency(os.availableParallelism());
  const orphans: { id: string }[] = await deps.dataSource.query(
    `SELECT i.id FROM images i
      WHERE i.state IN ('queued', 'processing')
        AND NOT EXISTS (SELECT 1 FROM pgboss.job j
                         WHERE j.name = $1 AND j.data->>'imageId' = i.id::text AND j.state IN ('created', 'retry', 'active'))`,
    [DERIVATIVES_QUEUE],
  );
  for (const { id } of orphans) await queue.enqueueDerivatives(id);
  if (orphans.length > 0) deps.logger.info({ count: orphans.length }, 'queued derivatives again for images without a live job');
  await queue.work((job) => makeDerivatives(deps, job.data.imageId, { retryCount: job.retryCount, retryLimit: job.retryLimit }));
}
