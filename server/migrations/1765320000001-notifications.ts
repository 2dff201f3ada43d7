import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * E-mail notifications. A notification row is written in the same transaction as the change it
 * tells about, so a change never goes unannounced and a rolled-back change never announces itself;
 * the worker moves rows into the durable mail queue (pg-boss) and marks them sent. Rows keep the
 * facts of the moment (names, note, excerpt), so a later rename does not rewrite an old message.
 */
export class Notifications1765320000001 implements MigrationInterface {
  name = 'Notifications1765320000001';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE notification_settings (
        user_id uuid PRIMARY KEY REFERENCES users(id) ON DELETE CASCADE,
        delivery text NOT NULL CHECK (delivery IN ('immediate', 'daily', 'off')),
        updated_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`
      CREATE TABLE notifications (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        recipient_id uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
        kind text NOT NULL CHECK (kind IN ('review_requested', 'mention', 'changes_requested', 'cleared', 'reply', 'returned_to_draft')),
        project_id uuid NOT NULL REFERENCES projects(id) ON DELETE CASCADE,
        image_id uuid NOT NULL,
        thread_id uuid,
        actor_id uuid NOT NULL REFERENCES users(id),
        facts jsonb NOT NULL,
        status text NOT NULL CHECK (status IN ('queued', 'awaiting_digest', 'mailing', 'sent', 'dropped')),
        job_id uuid,
        created_at timestamptz NOT NULL DEFAULT clock_timestamp(),
        sent_at timestamptz,
        CHECK (status <> 'mailing' OR job_id IS NOT NULL)
      )`);
    // The worker's relay and the digest read only rows still on their way.
    await q.query(`CREATE INDEX notifications_pending_idx ON notifications (status, created_at) WHERE status IN ('queued', 'awaiting_digest', 'mailing')`);
    await q.query(`CREATE INDEX notifications_recipient_idx ON notifications (recipient_id, created_at)`);
    // One row per day the digest was started: the insert that wins is the one process that starts it.
    await q.query(`
      CREATE TABLE notification_digest_days (
        day date PRIMARY KEY,
        queued_at timestamptz NOT NULL DEFAULT now()
      )`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE notification_digest_days, notifications, notification_settings`);
  }
}
