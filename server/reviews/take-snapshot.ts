import type { EntityManager } from 'typeorm';
import type { SnapshotMeasurement } from '../../shared/reviews';
import { Annotation } from '../annotations/annotation.entity';
import { toAnnotationDto } from '../annotations/annotation.mapper';
import { Image } from '../images/image.entity';
import { ReviewSnapshot } from './review-snapshot.entity';

interface MeasurementRow {
  id: string;
  kind: string;
  where_label: string;
  um_per_px: number;
  pixel_size_source: string;
  version: number;
  definition: Record<string, unknown>;
  result: Record<string, unknown>;
  computed_at: Date;
}

/**
 * Freezes what a reviewer cleared: the image's pixel size and its source, its annotations and its
 * measurements as they are in this transaction. Call it holding the review row's lock: the image is
 * read afresh here, so an edit that committed while we waited for the lock is in the snapshot.
 * Measurements are read as stored rows, so the record does not depend on how the measurement
 * feature maps them today.
 */
export async function takeSnapshot(m: EntityManager, imageId: string, eventId: string, clearedBy: string): Promise<void> {
  const image = await m.findOneByOrFail(Image, { id: imageId });
  const annotations = await m.find(Annotation, { where: { imageId: image.id }, relations: { author: true }, order: { seq: 'ASC' } });
  const measured: MeasurementRow[] = await m.query(
    `SELECT id, kind, where_label, um_per_px, pixel_size_source, version, definition, result, computed_at
       FROM measurements WHERE image_id = $1 ORDER BY created_at, id`,
    [image.id],
  );
  const measurements: SnapshotMeasurement[] = measured.map((r) => ({
    id: r.id,
    kind: r.kind,
    whereLabel: r.where_label,
    umPerPx: r.um_per_px,
    pixelSizeSource: r.pixel_size_source,
    version: r.version,
    definition: r.definition,
    result: r.result,
    computedAt: new Date(r.computed_at).toISOString(),
  }));
  await m.save(
    m.create(ReviewSnapshot, {
      subjectType: 'image',
      subjectId: image.id,
      projectId: image.projectId,
      eventId,
      clearedBy,
      pixelSize: { xUm: image.pixelSizeUm, yUm: image.pixelSizeYUm, source: image.pixelSizeSource, confirmed: image.pixelSizeConfirmed, note: image.pixelSizeNote },
      annotations: annotations.map(toAnnotationDto),
      measurements,
    }),
  );
}
