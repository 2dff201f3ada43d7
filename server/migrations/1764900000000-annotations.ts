import type { MigrationInterface, QueryRunner } from 'typeorm';
import { DEFAULT_ANNOTATION_CLASSES } from '../../shared/annotations/annotations';

/** Annotation classes per project (with the default set for projects that exist) and annotations on images. */
export class Annotations1764900000000 implements MigrationInterface {
  name = 'Annotations1764900000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE annotation_classes (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        project_id uuid NOT NULL REFERENCES projects(id) ON DELETE CASCADE,
        name text NOT NULL,
        colour text NOT NULL,
        shape_kind text NOT NULL CHECK (shape_kind IN ('line', 'point', 'outline', 'point_or_outline', 'text')),
        position int NOT NULL DEFAULT 0,
        created_at timestamptz NOT NULL DEFAULT now(),
        UNIQUE (project_id, name)
      )`);
    // Shapes keep their class (RESTRICT): deleting a class in use means moving its shapes first.
    await q.query(`
      CREATE TABLE annotations (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        -- Drawing order, stable even for shapes imported in one transaction (same now()).
        seq bigint GENERATED ALWAYS AS IDENTITY,
        project_id uuid NOT NULL REFERENCES projects(id) ON DELETE CASCADE,
        image_id uuid NOT NULL REFERENCES images(id) ON DELETE CASCADE,
        class_id uuid NOT NULL REFERENCES annotation_classes(id) ON DELETE RESTRICT,
        kind text NOT NULL CHECK (kind IN ('polyline', 'polygon', 'rectangle', 'point', 'ruler', 'angle', 'text')),
        points jsonb NOT NULL,
        label text NOT NULL DEFAULT '',
        author_id uuid NOT NULL REFERENCES users(id),
        updated_by uuid NOT NULL REFERENCES users(id),
        version int NOT NULL DEFAULT 1,
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`CREATE INDEX annotations_image_idx ON annotations (image_id)`);
    await q.query(`CREATE INDEX annotations_class_idx ON annotations (class_id)`);
    for (const [position, c] of DEFAULT_ANNOTATION_CLASSES.entries()) {
      await q.query(
        `INSERT INTO annotation_classes (project_id, name, colour, shape_kind, position) SELECT id, $1, $2, $3, $4 FROM projects`,
        [c.name, c.colour, c.shapeKind, position],
      );
    }
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE annotations, annotation_classes`);
  }
}
