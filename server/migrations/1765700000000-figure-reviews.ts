import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Figures under review: their review state (the table already took the subject type), threads on a
 * figure or one of its panels, notifications about a figure, and what a clearing froze.
 *
 * A figure's state row and its threads go with the figure (cascade), like an image's. The clearance
 * records carry no foreign key to the figure and are append-only, so what was cleared, and the files
 * rendered then, stay on record after later edits; the files themselves are kept content-addressed.
 */
export class FigureReviews1765700000000 implements MigrationInterface {
  name = 'FigureReviews1765700000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE review_states ADD COLUMN figure_id uuid REFERENCES figures(id) ON DELETE CASCADE`);
    await q.query(`ALTER TABLE review_states ADD CONSTRAINT review_states_figure_check CHECK (subject_type <> 'figure' OR figure_id = subject_id)`);

    await q.query(`ALTER TABLE comment_threads ALTER COLUMN image_id DROP NOT NULL`);
    await q.query(`ALTER TABLE comment_threads ADD COLUMN figure_id uuid REFERENCES figures(id) ON DELETE CASCADE`);
    await q.query(`ALTER TABLE comment_threads ADD CONSTRAINT comment_threads_one_subject CHECK (num_nonnulls(image_id, figure_id) = 1)`);
    await q.query(`ALTER TABLE comment_threads DROP CONSTRAINT comment_threads_anchor_kind_check`);
    await q.query(`ALTER TABLE comment_threads ADD CONSTRAINT comment_threads_anchor_kind_check CHECK (anchor_kind IN ('point', 'region', 'measurement', 'figure', 'panel'))`);
    await q.query(`CREATE INDEX comment_threads_figure_idx ON comment_threads (figure_id, created_at) WHERE figure_id IS NOT NULL`);

    // Like image_id, figure_id is kept without a foreign key: the message about a deleted figure still goes out.
    await q.query(`ALTER TABLE notifications ALTER COLUMN image_id DROP NOT NULL`);
    await q.query(`ALTER TABLE notifications ADD COLUMN figure_id uuid`);
    await q.query(`ALTER TABLE notifications ADD CONSTRAINT notifications_one_subject CHECK (num_nonnulls(image_id, figure_id) = 1)`);

    await q.query(`
      CREATE TABLE figure_clearances (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        seq bigint GENERATED ALWAYS AS IDENTITY,
        figure_id uuid NOT NULL,
        project_id uuid NOT NULL REFERENCES projects(id),
        event_id uuid NOT NULL REFERENCES review_events(id),
        figure_version int NOT NULL,
        title text NOT NULL,
        definition jsonb NOT NULL,
        images jsonb NOT NULL,
        files jsonb NOT NULL,
        cleared_by uuid NOT NULL REFERENCES users(id),
        cleared_at timestamptz NOT NULL DEFAULT clock_timestamp()
      )`);
    await q.query(`CREATE INDEX figure_clearances_figure_idx ON figure_clearances (figure_id, seq)`);
    await q.query(`
      CREATE TRIGGER figure_clearances_no_change BEFORE UPDATE OR DELETE ON figure_clearances
      FOR EACH ROW EXECUTE FUNCTION review_records_append_only()`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE figure_clearances`);
    await q.query(`DELETE FROM notifications WHERE figure_id IS NOT NULL`);
    await q.query(`ALTER TABLE notifications DROP CONSTRAINT notifications_one_subject, DROP COLUMN figure_id`);
    await q.query(`ALTER TABLE notifications ALTER COLUMN image_id SET NOT NULL`);
    await q.query(`DELETE FROM comment_threads WHERE figure_id IS NOT NULL`);
    await q.query(`DROP INDEX comment_threads_figure_idx`);
    await q.query(`ALTER TABLE comment_threads DROP CONSTRAINT comment_threads_anchor_kind_check`);
    await q.query(`ALTER TABLE comment_threads ADD CONSTRAINT comment_threads_anchor_kind_check CHECK (anchor_kind IN ('point', 'region', 'measurement'))`);
    await q.query(`ALTER TABLE comment_threads DROP CONSTRAINT comment_threads_one_subject, DROP COLUMN figure_id`);
    await q.query(`ALTER TABLE comment_threads ALTER COLUMN image_id SET NOT NULL`);
    await q.query(`DELETE FROM review_states WHERE subject_type = 'figure'`);
    await q.query(`ALTER TABLE review_states DROP CONSTRAINT review_states_figure_check, DROP COLUMN figure_id`);
  }
}
