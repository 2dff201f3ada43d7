import type { EntityManager } from 'typeorm';
import type { PixelSizeSource } from '../../shared/pixel-size';
import { recordActivity } from '../activity/record-activity';
import { Image } from '../images/image.entity';
import { returnToDraftIfCleared } from '../reviews/return-to-draft';
import { CalibrationChange } from './calibration-change.entity';

export interface PixelSizeChange {
  umPerPx: number | null;
  source: PixelSizeSource;
  note: string;
}

/**
 * Sets an image's pixel size and records who changed it, when, from what to what.
 * Every path that changes a pixel size goes through here, so the history is complete.
 */
export async function changePixelSize(m: EntityManager, image: Image, userId: string, change: PixelSizeChange): Promise<void> {
  await m.insert(CalibrationChange, {
    imageId: image.id,
    userId,
    oldUmPerPx: image.pixelSizeUm,
    newUmPerPx: change.umPerPx,
    source: change.source,
    note: change.note,
  });
  await m.update(Image, { id: image.id }, {
    pixelSizeUm: change.umPerPx,
    pixelSizeYUm: change.umPerPx,
    pixelSizeSource: change.source,
    pixelSizeConfirmed: change.source !== 'none',
    pixelSizeNote: change.note,
    updatedAt: new Date(),
  });
  const from = image.pixelSizeUm === null ? 'none' : `${image.pixelSizeUm} µm/px`;
  const to = change.umPerPx === null ? 'none' : `${Number(change.umPerPx.toPrecision(6))} µm/px`;
  await recordActivity(m, {
    projectId: image.projectId,
    imageId: image.id,
    actorId: userId,
    action: 'image.pixel_size_changed',
    summary: `changed the pixel size from ${from} to ${to} (${change.source})`,
  });
  await returnToDraftIfCleared(m, image.id, userId, 'the pixel size');
}
