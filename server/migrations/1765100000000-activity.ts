import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * The activity history. Append-only by construction: a trigger refuses every UPDATE and DELETE,
 * so not even a bug in the app can rewrite what happened. Image ids carry no foreign key, so
 * the history of a deleted image stays.
 */
export class Activity1765100000000 implements MigrationInterface {
  name = 'Activity1765100000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE activity_events (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        seq bigint GENERATED ALWAYS AS IDENTITY,
        project_id uuid NOT NULL REFERENCES projects(id),
        image_id uuid,
        actor_id uuid NOT NULL REFERENCES users(id),
        action text NOT NULL,
        summary text NOT NULL,
        details jsonb NOT NULL DEFAULT '{}',
        at timestamptz NOT NULL DEFAULT clock_timestamp()
      )`);
    await q.query(`CREATE INDEX activity_events_project_idx ON activity_events (project_id, seq DESC)`);
    await q.query(`CREATE INDEX activity_events_image_idx ON activity_events (image_id, seq DESC) WHERE image_id IS NOT NULL`);
    await q.query(`
      CREATE FUNCTION activity_events_append_only() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        RAISE EXCEPTION 'activity_events is append-only';
      END $$`);
    await q.query(`
      CREATE TRIGGER activity_events_no_change BEFORE UPDATE OR DELETE ON activity_events
      FOR EACH ROW EXECUTE FUNCTION activity_events_append_only()`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE activity_events`);
    await q.query(`DROP FUNCTION activity_events_append_only()`);
  }
}
