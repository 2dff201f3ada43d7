import type { MigrationInterface, QueryRunner } from 'typeorm';

/** The catalogue: materials, samples with their layer stack and process route, specimens and their locations. */
export class Catalogue1764700000000 implements MigrationInterface {
  name = 'Catalogue1764700000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE materials (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        project_id uuid NOT NULL REFERENCES projects(id) ON DELETE CASCADE,
        designation text NOT NULL,
        material_class text NOT NULL DEFAULT '',
        composition jsonb NOT NULL DEFAULT '{"wtPct": {}, "balance": null}',
        notes text NOT NULL DEFAULT '',
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now(),
        UNIQUE (project_id, designation)
      )`);
    await q.query(`
      CREATE TABLE samples (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        project_id uuid NOT NULL REFERENCES projects(id) ON DELETE CASCADE,
        code text NOT NULL,
        name text NOT NULL,
        description text NOT NULL DEFAULT '',
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now(),
        UNIQUE (project_id, code)
      )`);
    // A material in a stack cannot be deleted (RESTRICT): samples keep what they were made of.
    await q.query(`
      CREATE TABLE sample_layers (
        sample_id uuid NOT NULL REFERENCES samples(id) ON DELETE CASCADE,
        position int NOT NULL CHECK (position >= 0),
        material_id uuid NOT NULL REFERENCES materials(id) ON DELETE RESTRICT,
        thickness_mm double precision NOT NULL CHECK (thickness_mm > 0),
        PRIMARY KEY (sample_id, position)
      )`);
    await q.query(`CREATE INDEX sample_layers_material_idx ON sample_layers (material_id)`);
    await q.query(`
      CREATE TABLE route_steps (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        sample_id uuid NOT NULL REFERENCES samples(id) ON DELETE CASCADE,
        position int NOT NULL CHECK (position >= 0),
        type text NOT NULL,
        date date,
        params jsonb NOT NULL DEFAULT '{}',
        notes text NOT NULL DEFAULT ''
      )`);
    await q.query(`CREATE INDEX route_steps_sample_idx ON route_steps (sample_id, position)`);
    await q.query(`
      CREATE TABLE specimens (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        project_id uuid NOT NULL REFERENCES projects(id) ON DELETE CASCADE,
        sample_id uuid NOT NULL REFERENCES samples(id) ON DELETE RESTRICT,
        code text NOT NULL,
        after_step_id uuid REFERENCES route_steps(id) ON DELETE RESTRICT,
        section_plane text NOT NULL CHECK (section_plane IN ('longitudinal', 'transverse', 'plan_view', 'fracture_surface', 'other')),
        preparation jsonb NOT NULL DEFAULT '{"steps": [], "etchant": "", "etchingTimeS": null}',
        notes text NOT NULL DEFAULT '',
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now(),
        UNIQUE (sample_id, code)
      )`);
    await q.query(`CREATE INDEX specimens_project_idx ON specimens (project_id)`);
    await q.query(`
      CREATE TABLE specimen_locations (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        specimen_id uuid NOT NULL REFERENCES specimens(id) ON DELETE CASCADE,
        name text NOT NULL,
        x_mm double precision,
        y_mm double precision,
        created_at timestamptz NOT NULL DEFAULT now(),
        UNIQUE (specimen_id, name)
      )`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE specimen_locations, specimens, route_steps, sample_layers, samples, materials`);
  }
}
