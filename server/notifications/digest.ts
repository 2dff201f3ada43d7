import type PgBoss from 'pg-boss';
import { DIGEST_QUEUE, inTransaction, MAIL_QUEUE, type MailJobData, type NotificationDeps } from './mail-queue';

/**
 * Starts today's digest once, at or after the configured hour (UTC): the process whose insert of
 * today's row wins queues the digest job, so several app or worker processes start it once, and a
 * server that was down at that hour starts it when it comes back. Returns whether this call did.
 */
export async function startDigestIfDue(deps: NotificationDeps, boss: PgBoss, now = new Date()): Promise<boolean> {
  if (now.getUTCHours() < deps.config.notifications.digestHourUtc) return false;
  return deps.dataSource.transaction(async (m) => {
    const won: unknown[] = await m.query(
      `INSERT INTO notification_digest_days (day) VALUES (($1::timestamptz AT TIME ZONE 'UTC')::date) ON CONFLICT DO NOTHING RETURNING day`,
      [now.toISOString()],
    );
    if (won.length === 0) return false;
    await boss.send(DIGEST_QUEUE, {}, inTransaction(m));
    return true;
  });
}

/**
 * The digest job: every notification waiting for a digest goes into one mail job per recipient
 * (claimed in this transaction, so a second run finds nothing left); those of people who have
 * switched to "off" since are dropped. Returns the number of mail jobs queued.
 */
export async function collectDigest(deps: NotificationDeps, boss: PgBoss): Promise<number> {
  return deps.dataSource.transaction(async (m) => {
    await m.query(
      `UPDATE notifications n SET status = 'dropped'
         FROM notification_settings s
        WHERE s.user_id = n.recipient_id AND s.delivery = 'off' AND n.status = 'awaiting_digest'`,
    );
    const rows: { id: string; recipient_id: string }[] = await m.query(
      `SELECT id, recipient_id FROM notifications WHERE status = 'awaiting_digest' ORDER BY created_at FOR UPDATE SKIP LOCKED`,
    );
    const byRecipient = new Map<string, string[]>();
    for (const r of rows) byRecipient.set(r.recipient_id, [...(byRecipient.get(r.recipient_id) ?? []), r.id]);
    for (const ids of byRecipient.values()) {
      const data: MailJobData = { notificationIds: ids, format: 'digest' };
      const jobId = await boss.send(MAIL_QUEUE, data, inTransaction(m));
      await m.query(`UPDATE notifications SET status = 'mailing', job_id = $2 WHERE id = ANY($1::uuid[])`, [ids, jobId]);
    }
    return byRecipient.size;
  });
}

/**
 * Puts back in line every notification whose mail job is gone without sending it (its retries ran
 * out while the mail server stayed down, or the job was purged): nothing is lost, it is tried again.
 * They go out one by one, even those that were part of a digest. Returns how many.
 */
export async function requeueStranded(deps: NotificationDeps): Promise<number> {
  const rows: unknown[] = await deps.dataSource.query(
    `WITH stranded AS (
       UPDATE notifications n SET status = 'queued', job_id = NULL
        WHERE n.status = 'mailing'
          AND NOT EXISTS (SELECT 1 FROM pgboss.job j WHERE j.id = n.job_id AND j.state IN ('created', 'retry', 'active'))
       RETURNING n.id)
     SELECT id FROM stranded`,
  );
  return rows.length;
}
