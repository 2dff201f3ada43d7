import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Measurements on images (definition, the layout it was counted on, and the server's result) and
 * their history. The history is append-only by a trigger, and carries no foreign keys to what it
 * describes, so a deleted measurement or image still leaves the record of how its numbers came about.
 */
export class Measurements1765200000000 implements MigrationInterface {
  name = 'Measurements1765200000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE measurements (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        project_id uuid NOT NULL REFERENCES projects(id) ON DELETE CASCADE,
        image_id uuid NOT NULL REFERENCES images(id) ON DELETE CASCADE,
        kind text NOT NULL CHECK (kind IN ('intercept', 'point_count', 'thickness')),
        definition jsonb NOT NULL,
        layout jsonb NOT NULL,
        result jsonb NOT NULL,
        where_label text NOT NULL,
        um_per_px double precision NOT NULL CHECK (um_per_px > 0),
        pixel_size_source text NOT NULL,
        author_id uuid NOT NULL REFERENCES users(id),
        updated_by uuid NOT NULL REFERENCES users(id),
        version int NOT NULL DEFAULT 1,
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now(),
        computed_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`CREATE INDEX measurements_image_idx ON measurements (image_id, created_at)`);
    await q.query(`
      CREATE TABLE measurement_history (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        seq bigint GENERATED ALWAYS AS IDENTITY,
        measurement_id uuid NOT NULL,
        project_id uuid NOT NULL,
        image_id uuid NOT NULL,
        version int NOT NULL,
        reason text NOT NULL CHECK (reason IN ('edited', 'recomputed', 'deleted')),
        definition jsonb NOT NULL,
        result jsonb NOT NULL,
        um_per_px double precision NOT NULL,
        pixel_size_source text NOT NULL,
        replaced_by uuid NOT NULL REFERENCES users(id),
        replaced_at timestamptz NOT NULL DEFAULT clock_timestamp()
      )`);
    await q.query(`CREATE INDEX measurement_history_measurement_idx ON measurement_history (measurement_id, seq)`);
    await q.query(`
      CREATE FUNCTION measurement_history_append_only() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        RAISE EXCEPTION 'measurement_history is append-only';
      END $$`);
    await q.query(`
      CREATE TRIGGER measurement_history_no_change BEFORE UPDATE OR DELETE ON measurement_history
      FOR EACH ROW EXECUTE FUNCTION measurement_history_append_only()`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE measurement_history, measurements`);
    await q.query(`DROP FUNCTION measurement_history_append_only()`);
  }
}
