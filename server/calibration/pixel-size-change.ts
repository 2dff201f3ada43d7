import type { EntityManager } from 'typeorm';
import type { PixelSizeSource } from '../../shared/pixel-size';
import { Image } from '../images/image.entity';
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
}
