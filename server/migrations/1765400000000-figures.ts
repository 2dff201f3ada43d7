import type { MigrationInterface, QueryRunner } from 'typeorm';

/** Figures for publication (a saved composition of panels) and the files exported from them. */
export class Figures1765400000000 implements MigrationInterface {
  name = 'Figures1765400000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE figures (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        project_id uuid NOT NULL REFERENCES projects(id) ON DELETE CASCADE,
        title text NOT NULL,
        spec jsonb NOT NULL,
        created_by uuid NOT NULL REFERENCES users(id),
        version int NOT NULL DEFAULT 1,
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`CREATE INDEX figures_project_idx ON figures (project_id)`);
    // Exports keep the figure version they were made from, so a cleared figure's file stays findable.
    await q.query(`
      CREATE TABLE figure_exports (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        figure_id uuid NOT NULL REFERENCES figures(id) ON DELETE CASCADE,
        figure_version int NOT NULL,
        format text NOT NULL CHECK (format IN ('png', 'tiff')),
        width_mm double precision NOT NULL,
        dpi int NOT NULL,
        storage_key text NOT NULL,
        byte_size bigint NOT NULL,
        created_by uuid NOT NULL REFERENCES users(id),
        created_at timestamptz NOT NULL DEFAULT now()
      )`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE figure_exports, figures`);
  }
}
