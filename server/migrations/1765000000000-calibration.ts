import type { MigrationInterface, QueryRunner } from 'typeorm';

/** Pixel sizes drawn on the image or taken from a preset, every change on record, and presets per project. */
export class Calibration1765000000000 implements MigrationInterface {
  name = 'Calibration1765000000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE images DROP CONSTRAINT IF EXISTS images_pixel_size_source_check`);
    await q.query(`ALTER TABLE images ADD CONSTRAINT images_pixel_size_source_check
      CHECK (pixel_size_source IN ('ome_xml', 'tiff_resolution', 'user', 'drawn', 'preset', 'none'))`);
    await q.query(`
      CREATE TABLE calibration_presets (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        project_id uuid NOT NULL REFERENCES projects(id) ON DELETE CASCADE,
        name text NOT NULL,
        instrument text NOT NULL DEFAULT '',
        objective text NOT NULL DEFAULT '',
        camera text NOT NULL DEFAULT '',
        um_per_px double precision NOT NULL CHECK (um_per_px > 0),
        created_at timestamptz NOT NULL DEFAULT now(),
        UNIQUE (project_id, name)
      )`);
    // Append-only: rows are inserted with each change and never updated or deleted by the app.
    await q.query(`
      CREATE TABLE calibration_changes (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        image_id uuid NOT NULL REFERENCES images(id) ON DELETE CASCADE,
        user_id uuid NOT NULL REFERENCES users(id),
        at timestamptz NOT NULL DEFAULT clock_timestamp(),
        old_um_per_px double precision,
        new_um_per_px double precision,
        source text NOT NULL,
        note text NOT NULL DEFAULT ''
      )`);
    await q.query(`CREATE INDEX calibration_changes_image_idx ON calibration_changes (image_id, at)`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE calibration_changes, calibration_presets`);
    await q.query(`ALTER TABLE images DROP CONSTRAINT images_pixel_size_source_check`);
    await q.query(`ALTER TABLE images ADD CONSTRAINT images_pixel_size_source_check CHECK (pixel_size_source IN ('ome_xml', 'tiff_resolution', 'user', 'none'))`);
  }
}
