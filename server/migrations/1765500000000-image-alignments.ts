import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * How one image of a location lies on another, from point pairs a person clicked: saved once per
 * pair of images, whichever of the two it was made from.
 */
export class ImageAlignments1765500000000 implements MigrationInterface {
  name = 'ImageAlignments1765500000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE image_alignments (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        project_id uuid NOT NULL REFERENCES projects(id) ON DELETE CASCADE,
        image_id uuid NOT NULL REFERENCES images(id) ON DELETE CASCADE,
        other_image_id uuid NOT NULL REFERENCES images(id) ON DELETE CASCADE,
        kind text NOT NULL CHECK (kind IN ('similarity', 'affine')),
        pairs jsonb NOT NULL,
        transform jsonb NOT NULL,
        saved_by uuid NOT NULL REFERENCES users(id),
        saved_at timestamptz NOT NULL DEFAULT now(),
        CHECK (image_id <> other_image_id)
      )`);
    // One alignment per pair of images, in either direction: from the other side it is read inverted.
    await q.query(`CREATE UNIQUE INDEX image_alignments_pair_idx ON image_alignments (LEAST(image_id, other_image_id), GREATEST(image_id, other_image_id))`);
    await q.query(`CREATE INDEX image_alignments_other_idx ON image_alignments (other_image_id)`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE image_alignments`);
  }
}
