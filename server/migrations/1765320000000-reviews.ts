import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Review states (generic over images and, later, figures), their history, the snapshots taken when
 * something is cleared, and comment threads pinned to images.
 *
 * History and snapshots are append-only by trigger and carry no foreign key to the image, so what was
 * reviewed and decided stays on record even after the image is edited or deleted. Threads carry the
 * measurement they are pinned to as a plain id for the same reason: the measurement's own history
 * keeps that id after a delete.
 */
export class Reviews1765320000000 implements MigrationInterface {
  name = 'Reviews1765320000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE review_states (
        subject_type text NOT NULL CHECK (subject_type IN ('image', 'figure')),
        subject_id uuid NOT NULL,
        project_id uuid NOT NULL REFERENCES projects(id) ON DELETE CASCADE,
        image_id uuid REFERENCES images(id) ON DELETE CASCADE,
        state text NOT NULL CHECK (state IN ('draft', 'with_reviewers', 'needs_changes', 'cleared')),
        submitted_by uuid REFERENCES users(id),
        submitted_at timestamptz,
        updated_by uuid NOT NULL REFERENCES users(id),
        updated_at timestamptz NOT NULL DEFAULT clock_timestamp(),
        PRIMARY KEY (subject_type, subject_id),
        CHECK (subject_type <> 'image' OR image_id = subject_id),
        CHECK (state = 'draft' OR submitted_at IS NOT NULL)
      )`);
    // The reviewers' queue reads only items waiting for them, oldest submission first.
    await q.query(`CREATE INDEX review_states_waiting_idx ON review_states (submitted_at) WHERE state = 'with_reviewers'`);

    await q.query(`
      CREATE TABLE review_events (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        seq bigint GENERATED ALWAYS AS IDENTITY,
        subject_type text NOT NULL,
        subject_id uuid NOT NULL,
        project_id uuid NOT NULL REFERENCES projects(id),
        from_state text NOT NULL,
        to_state text NOT NULL,
        reason text NOT NULL CHECK (reason IN ('submit', 'requestChanges', 'clear', 'reopen', 'edited')),
        actor_id uuid NOT NULL REFERENCES users(id),
        note text NOT NULL DEFAULT '',
        at timestamptz NOT NULL DEFAULT clock_timestamp()
      )`);
    await q.query(`CREATE INDEX review_events_subject_idx ON review_events (subject_type, subject_id, seq)`);

    await q.query(`
      CREATE TABLE review_snapshots (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        seq bigint GENERATED ALWAYS AS IDENTITY,
        subject_type text NOT NULL,
        subject_id uuid NOT NULL,
        project_id uuid NOT NULL REFERENCES projects(id),
        event_id uuid NOT NULL REFERENCES review_events(id),
        cleared_by uuid NOT NULL REFERENCES users(id),
        cleared_at timestamptz NOT NULL DEFAULT clock_timestamp(),
        pixel_size jsonb NOT NULL,
        annotations jsonb NOT NULL,
        measurements jsonb NOT NULL
      )`);
    await q.query(`CREATE INDEX review_snapshots_subject_idx ON review_snapshots (subject_type, subject_id, seq)`);

    await q.query(`
      CREATE FUNCTION review_records_append_only() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        RAISE EXCEPTION '% is append-only', TG_TABLE_NAME;
      END $$`);
    for (const table of ['review_events', 'review_snapshots']) {
      await q.query(`
        CREATE TRIGGER ${table}_no_change BEFORE UPDATE OR DELETE ON ${table}
        FOR EACH ROW EXECUTE FUNCTION review_records_append_only()`);
    }

    await q.query(`
      CREATE TABLE comment_threads (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        project_id uuid NOT NULL REFERENCES projects(id) ON DELETE CASCADE,
        image_id uuid NOT NULL REFERENCES images(id) ON DELETE CASCADE,
        anchor_kind text NOT NULL CHECK (anchor_kind IN ('point', 'region', 'measurement')),
        anchor jsonb NOT NULL,
        measurement_id uuid,
        status text NOT NULL DEFAULT 'open' CHECK (status IN ('open', 'resolved')),
        created_by uuid NOT NULL REFERENCES users(id),
        created_at timestamptz NOT NULL DEFAULT clock_timestamp(),
        resolved_by uuid REFERENCES users(id),
        resolved_at timestamptz,
        CHECK ((status = 'resolved') = (resolved_at IS NOT NULL)),
        CHECK ((anchor_kind = 'measurement') = (measurement_id IS NOT NULL))
      )`);
    await q.query(`CREATE INDEX comment_threads_image_idx ON comment_threads (image_id, created_at)`);
    // Counts of open threads per image and per project read only these.
    await q.query(`CREATE INDEX comment_threads_open_idx ON comment_threads (project_id, image_id) WHERE status = 'open'`);

    await q.query(`
      CREATE TABLE comments (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        thread_id uuid NOT NULL REFERENCES comment_threads(id) ON DELETE CASCADE,
        author_id uuid NOT NULL REFERENCES users(id),
        body text NOT NULL CHECK (length(btrim(body)) > 0),
        mentions uuid[] NOT NULL DEFAULT '{}',
        created_at timestamptz NOT NULL DEFAULT clock_timestamp()
      )`);
    await q.query(`CREATE INDEX comments_thread_idx ON comments (thread_id, created_at)`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE comments, comment_threads, review_snapshots, review_events, review_states`);
    await q.query(`DROP FUNCTION review_records_append_only()`);
  }
}
