import type { JobQueue } from '../jobs/queue';
import { collectDigest, requeueStranded, startDigestIfDue } from './digest';
import { DIGEST_QUEUE, deliverMail, ensureNotificationQueues, MAIL_QUEUE, relayQueued, type MailJobData, type NotificationDeps } from './mail-queue';

/** How often the relay looks for new immediate notifications: e-mail a second or two late is fine. */
const RELAY_INTERVAL_MS = 1000;
/** How often the worker checks whether today's digest is due. */
const DIGEST_CHECK_MS = 60_000;

/** A running notification worker; `stop()` ends its timers and waits for a relay pass in flight. */
export interface NotificationWorker {
  stop(): Promise<void>;
}

/**
 * Runs notification e-mail in this process: relays new immediate notifications into the durable mail
 * queue, sends mail jobs (pg-boss retries them with back-off while the mail server is down), starts
 * the daily digest once a day, and on start puts back in line anything stranded while it was away.
 */
export async function startNotificationWorker(deps: NotificationDeps, jobs: JobQueue): Promise<NotificationWorker> {
  const boss = jobs.boss;
  await ensureNotificationQueues(boss, deps.config);
  const stranded = await requeueStranded(deps);
  if (stranded > 0) deps.logger.info({ count: stranded }, 'notifications queued again after their mail job was lost');

  const mailWorker: string = await boss.work<MailJobData>(MAIL_QUEUE, { batchSize: 1, pollingIntervalSeconds: 1 }, async ([job]) => {
    if (!job) return;
    try {
      await deliverMail(deps, job.data);
    } catch (err) {
      // Logs the failed attempt (mail server down, address refused) and rethrows so pg-boss retries the job.
      deps.logger.warn({ err, jobId: job.id }, 'notification mail not sent; it will be retried');
      throw err;
    } finally {
      // pg-boss waits a polling interval after every batch; ask for the next job at once, so a backlog
      // of mail drains at the speed of the mail server rather than one message a second.
      boss.notifyWorker(mailWorker);
    }
  });
  await boss.work(DIGEST_QUEUE, { batchSize: 1, pollingIntervalSeconds: 5 }, async () => {
    const queued = await collectDigest(deps, boss);
    await requeueStranded(deps);
    if (queued > 0) boss.notifyWorker(mailWorker);
  });

  let stopped = false;
  const inFlight = new Set<Promise<unknown>>();
  /** Runs `pass` now and every `ms`, skipping a turn while the previous pass still runs (a slow database must not pile passes up). */
  const every = (ms: number, what: string, pass: () => Promise<unknown>) => {
    let busy = false;
    const turn = () => {
      if (stopped || busy) return;
      busy = true;
      const p = pass()
        .catch((err: unknown) => deps.logger.error({ err }, `${what} failed`))
        .finally(() => {
          busy = false;
          inFlight.delete(p);
        });
      inFlight.add(p);
    };
    turn();
    return setInterval(turn, ms);
  };
  const relay = every(RELAY_INTERVAL_MS, 'notification relay', async () => {
    if ((await relayQueued(deps, boss)) > 0) boss.notifyWorker(mailWorker);
  });
  const digest = every(DIGEST_CHECK_MS, 'digest check', () => startDigestIfDue(deps, boss));
  deps.logger.info('notification worker started');

  return {
    async stop() {
      stopped = true;
      clearInterval(relay);
      clearInterval(digest);
      await Promise.all(inFlight);
    },
  };
}
