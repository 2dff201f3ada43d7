import type { MigrationInterface, QueryRunner } from 'typeorm';

/** Images hung on specimens and locations: the kept original, what was read from it, and the state of its derivatives. */
export class Images1764800000000 implements MigrationInterface {
  name = 'Images1764800000000';

  async up(q: QueryRunner): Promise<void> {
    // Trigram indexes make "text in notes" (ILIKE '%…%') an index search; pg_trgm is a trusted extension, so the database owner may add it.
    await q.query(`CREATE EXTENSION IF NOT EXISTS pg_trgm`);
    await q.query(`
      CREATE TABLE images (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        project_id uuid NOT NULL REFERENCES projects(id) ON DELETE CASCADE,
        -- RESTRICT: a specimen or location with images cannot vanish under them (the API answers 409 first).
        specimen_id uuid NOT NULL REFERENCES specimens(id) ON DELETE RESTRICT,
        location_id uuid REFERENCES specimen_locations(id) ON DELETE RESTRICT,
        uploader_id uuid NOT NULL REFERENCES users(id) ON DELETE RESTRICT,
        modality text NOT NULL CHECK (modality IN (
          'lom_bright_field', 'lom_dark_field', 'lom_polarised', 'lom_dic', 'sem_secondary', 'sem_backscattered',
          'ebsd_orientation', 'ebsd_phase', 'ebsd_band_contrast', 'ebsd_other', 'eds_element', 'fracture_surface', 'other')),
        element text CHECK ((modality = 'eds_element') = (element IS NOT NULL)),
        instrument text NOT NULL DEFAULT '',
        magnification double precision CHECK (magnification > 0),
        accelerating_voltage_kv double precision CHECK (accelerating_voltage_kv > 0),
        working_distance_mm double precision CHECK (working_distance_mm > 0),
        detector text NOT NULL DEFAULT '',
        acquired_at timestamptz,
        pixel_size_um double precision CHECK (pixel_size_um > 0),
        pixel_size_y_um double precision CHECK (pixel_size_y_um > 0),
        pixel_size_source text NOT NULL DEFAULT 'none' CHECK (pixel_size_source IN ('ome_xml', 'tiff_resolution', 'user', 'none')),
        pixel_size_confirmed boolean NOT NULL DEFAULT false,
        pixel_size_note text NOT NULL DEFAULT '',
        tags text[] NOT NULL DEFAULT '{}',
        notes text NOT NULL DEFAULT '',
        original_name text NOT NULL,
        sha256 char(64) NOT NULL CHECK (sha256 ~ '^[0-9a-f]{64}$'),
        byte_size bigint NOT NULL CHECK (byte_size > 0),
        format text NOT NULL CHECK (format IN ('tiff', 'png', 'jpeg', 'webp')),
        width int NOT NULL CHECK (width > 0),
        height int NOT NULL CHECK (height > 0),
        bit_depth int NOT NULL CHECK (bit_depth IN (8, 16)),
        channels int NOT NULL CHECK (channels BETWEEN 1 AND 4),
        page_count int NOT NULL DEFAULT 1 CHECK (page_count >= 1),
        original_key text NOT NULL,
        state text NOT NULL DEFAULT 'queued' CHECK (state IN ('queued', 'processing', 'ready', 'failed')),
        progress int NOT NULL DEFAULT 0 CHECK (progress BETWEEN 0 AND 100),
        failure_reason text,
        attempts int NOT NULL DEFAULT 0,
        pyramid_levels int,
        uploaded_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now(),
        -- The same bytes are stored once per project: a second upload is reported, not kept.
        UNIQUE (project_id, sha256),
        -- A ready image always has its pyramid; no image is left half-made without a state saying so.
        CHECK (state <> 'ready' OR pyramid_levels IS NOT NULL),
        CHECK (state <> 'failed' OR failure_reason IS NOT NULL)
      )`);
    // One index per search filter; the list is always one project's, newest first by default.
    await q.query(`CREATE INDEX images_project_uploaded_idx ON images (project_id, uploaded_at DESC)`);
    await q.query(`CREATE INDEX images_project_acquired_idx ON images (project_id, acquired_at)`);
    await q.query(`CREATE INDEX images_specimen_idx ON images (specimen_id)`);
    await q.query(`CREATE INDEX images_location_idx ON images (location_id) WHERE location_id IS NOT NULL`);
    await q.query(`CREATE INDEX images_project_modality_idx ON images (project_id, modality)`);
    await q.query(`CREATE INDEX images_project_magnification_idx ON images (project_id, magnification)`);
    await q.query(`CREATE INDEX images_project_pixel_size_idx ON images (project_id, pixel_size_um)`);
    await q.query(`CREATE INDEX images_uploader_idx ON images (uploader_id)`);
    await q.query(`CREATE INDEX images_state_idx ON images (state) WHERE state <> 'ready'`);
    await q.query(`CREATE INDEX images_tags_idx ON images USING gin (tags)`);
    await q.query(`CREATE INDEX images_text_idx ON images USING gin ((notes || ' ' || original_name) gin_trgm_ops)`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE images`);
  }
}
