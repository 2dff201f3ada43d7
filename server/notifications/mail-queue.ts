import type PgBoss from 'pg-boss';
import type { Logger } from 'pino';
import type { DataSource, EntityManager } from 'typeorm';
import type { Config } from '../config';
import type { Mailer } from '../mail/mailer';
import { composeDigest, composeSingle, type MailableNotification } from './notification-mail';
import type { NotificationFacts } from './notification.entity';

/** Sends one message: a single notification, or a recipient's digest. */
export const MAIL_QUEUE = 'notification-mail';
/** Gathers the digest users' waiting notifications into one message each. */
export const DIGEST_QUEUE = 'notification-digest';

/** What a mail job carries: the notifications it sends, all to one recipient, and how to word them. */
export interface MailJobData {
  notificationIds: string[];
  format: 'single' | 'digest';
}

/** What the notification worker runs on. */
export interface NotificationDeps {
  dataSource: DataSource;
  mailer: Mailer;
  config: Config;
  logger: Logger;
}

/**
 * Creates the queues, or brings their retry settings up to date. A mail server that is down fails the
 * job; pg-boss retries it with back-off (about retryDelay, 2×, 4×… seconds), so the message waits.
 */
export async function ensureNotificationQueues(boss: PgBoss, config: Config): Promise<void> {
  const { retryDelaySeconds, retryLimit } = config.notifications;
  const mail = { retryLimit, retryDelay: retryDelaySeconds, retryBackoff: true, expireInSeconds: 120 };
  const digest = { retryLimit: 5, retryDelay: 60, retryBackoff: true, expireInSeconds: 600 };
  for (const [name, options] of [[MAIL_QUEUE, mail], [DIGEST_QUEUE, digest]] as const) {
    if (await boss.getQueue(name)) await boss.updateQueue(name, { name, ...options });
    else await boss.createQueue(name, { name, ...options });
  }
}

/** Lets pg-boss insert a job inside a TypeORM transaction, so the job and the rows that name it commit together. */
export function inTransaction(m: EntityManager): { db: PgBoss.Db } {
  return { db: { executeSql: async (text: string, values: unknown[]) => ({ rows: await m.query(text, values) }) } };
}

/**
 * Hands waiting immediate notifications to the mail queue: claims them (rows another process holds are
 * skipped), queues one job each in the same transaction and marks them "mailing". Returns how many.
 */
export async function relayQueued(deps: NotificationDeps, boss: PgBoss, limit = 50): Promise<number> {
  return deps.dataSource.transaction(async (m) => {
    const rows: { id: string }[] = await m.query(
      `SELECT id FROM notifications WHERE status = 'queued' ORDER BY created_at LIMIT $1 FOR UPDATE SKIP LOCKED`,
      [limit],
    );
    for (const { id } of rows) {
      const data: MailJobData = { notificationIds: [id], format: 'single' };
      const jobId = await boss.send(MAIL_QUEUE, data, inTransaction(m));
      await m.query(`UPDATE notifications SET status = 'mailing', job_id = $2 WHERE id = $1`, [id, jobId]);
    }
    return rows.length;
  });
}

interface MailRow {
  id: string;
  kind: MailableNotification['kind'];
  project_id: string;
  image_id: string | null;
  figure_id: string | null;
  thread_id: string | null;
  facts: NotificationFacts;
  email: string;
  display_name: string;
  active: boolean;
}

/**
 * Sends one mail job's message. A failed send throws, so pg-boss retries the job later; rows are
 * marked sent only after the mail server took the message. Rows already sent (an earlier attempt
 * that got through) are skipped, so a retry does not send twice.
 */
export async function deliverMail(deps: NotificationDeps, data: MailJobData): Promise<void> {
  const rows: MailRow[] = await deps.dataSource.query(
    `SELECT n.id, n.kind, n.project_id, n.image_id, n.figure_id, n.thread_id, n.facts, u.email, u.display_name, u.active
       FROM notifications n JOIN users u ON u.id = n.recipient_id
      WHERE n.id = ANY($1::uuid[]) AND n.status = 'mailing'
      ORDER BY n.created_at`,
    [data.notificationIds],
  );
  if (rows.length === 0) return;
  const ids = rows.map((r) => r.id);
  const recipient = rows[0]!;
  if (!recipient.active) {
    await deps.dataSource.query(`UPDATE notifications SET status = 'dropped' WHERE id = ANY($1::uuid[])`, [ids]);
    return;
  }
  const items: MailableNotification[] = rows.map((r) => ({ kind: r.kind, projectId: r.project_id, imageId: r.image_id, figureId: r.figure_id, threadId: r.thread_id, facts: r.facts }));
  const publicUrl = deps.config.publicUrl;
  const mail = data.format === 'digest' ? composeDigest(items, recipient.display_name, publicUrl) : composeSingle(items[0]!, recipient.display_name, publicUrl);
  await deps.mailer.send({ to: recipient.email, ...mail });
  await deps.dataSource.query(`UPDATE notifications SET status = 'sent', sent_at = clock_timestamp() WHERE id = ANY($1::uuid[]) AND status = 'mailing'`, [ids]);
}
