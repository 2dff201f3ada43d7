import type { ImageRecord, UpdateImageBody } from '../../shared/images';
import type { AppContext } from '../app-context';
import { SpecimenLocation } from '../archive/specimen-location.entity';
import { Specimen } from '../archive/specimen.entity';
import { User } from '../auth/user.entity';
import { CalibrationChange } from '../calibration/calibration-change.entity';
import { recordActivity } from '../activity/record-activity';
import { AppError } from '../http/app-error';
import { returnFiguresShowingImage, returnToDraftIfCleared } from '../reviews/return-to-draft';
import { Image } from './image.entity';
import { imageKeys } from './image-keys';
import { toImageRecord } from './image.mapper';

const RELATIONS = { specimen: { sample: true }, location: true, uploader: true } as const;

/** One image: read, describe, delete, and retry its processing. */
export class ImagesService {
  constructor(private readonly ctx: AppContext) {}

  private get ds() {
    return this.ctx.dataSource;
  }

  async detail(projectId: string, imageId: string): Promise<ImageRecord> {
    return toImageRecord(await this.find(projectId, imageId));
  }

  /** The row, for serving files; 404 when it is not in this project. */
  async find(projectId: string, imageId: string): Promise<Image> {
    const image = await this.ds.getRepository(Image).findOne({ where: { id: imageId, projectId }, relations: RELATIONS });
    if (!image) throw AppError.notFound('The image');
    return image;
  }

  async update(projectId: string, imageId: string, body: UpdateImageBody, editorId: string): Promise<ImageRecord> {
    const image = await this.find(projectId, imageId);
    const { pixelSizeUm, pixelSizeYUm, confirmPixelSize, acquiredAt, ...plain } = body;
    const specimenId = body.specimenId ?? image.specimenId;
    if (body.specimenId !== undefined && !(await this.ds.manager.existsBy(Specimen, { id: body.specimenId, projectId }))) {
      throw new AppError(422, 'validation_failed', 'Choose a specimen of this project.', [{ field: 'body.specimenId', message: 'Not a specimen of this project.' }]);
    }
    // Moving to another specimen drops a location that belongs to the old one, unless a new one is sent.
    const locationId = body.locationId !== undefined ? body.locationId : specimenId === image.specimenId ? image.locationId : null;
    if (locationId && !(await this.ds.manager.existsBy(SpecimenLocation, { id: locationId, specimenId }))) {
      throw new AppError(422, 'validation_failed', 'Choose a location on this specimen.', [{ field: 'body.locationId', message: 'Not a location on the image’s specimen.' }]);
    }
    const modality = body.modality ?? image.modality;
    const element = body.element !== undefined ? body.element : modality === 'eds_element' ? image.element : null;
    if ((modality === 'eds_element') !== (element !== null)) {
      throw new AppError(422, 'validation_failed', 'An EDS element map needs its element, and only it carries one.', [{ field: 'body.element', message: modality === 'eds_element' ? 'Name the element.' : 'Only EDS element maps carry an element.' }]);
    }
    const changes: Partial<Image> = { ...plain, specimenId, locationId, modality, element, updatedAt: new Date() };
    if (acquiredAt !== undefined) changes.acquiredAt = acquiredAt === null ? null : new Date(acquiredAt);
    const editor = await this.ds.manager.findOneBy(User, { id: editorId });
    const byWhom = `${editor?.displayName ?? 'a member'} on ${new Date().toISOString().slice(0, 10)}`;
    if (pixelSizeUm !== undefined) {
      Object.assign(changes, { pixelSizeUm, pixelSizeYUm: pixelSizeYUm ?? pixelSizeUm, pixelSizeSource: 'user', pixelSizeConfirmed: true, pixelSizeNote: `Entered by ${byWhom}.` });
      // Every pixel-size change is on record (who, when, old, new), whichever path made it.
      await this.ds.getRepository(CalibrationChange).insert({
        imageId, userId: editorId, oldUmPerPx: image.pixelSizeUm, newUmPerPx: pixelSizeUm, source: 'user', note: `Entered by ${byWhom}.`,
      });
      await recordActivity(this.ds.manager, {
        projectId, imageId, actorId: editorId, action: 'image.pixel_size_changed',
        summary: `changed the pixel size from ${image.pixelSizeUm ?? 'none'} to ${pixelSizeUm} µm/px (typed)`,
      });
    }
    if (confirmPixelSize) {
      if (image.pixelSizeUm === null) {
        throw new AppError(422, 'validation_failed', 'There is no pixel size to confirm; enter one instead.', [{ field: 'body.confirmPixelSize', message: 'Enter pixelSizeUm instead.' }]);
      }
      Object.assign(changes, { pixelSizeConfirmed: true, pixelSizeNote: `${image.pixelSizeNote.replace(/ Confirmed by .*$/, '')} Confirmed by ${byWhom}.` });
    }
    await this.ds.getRepository(Image).update({ id: imageId }, changes);
    const described = [...Object.keys(plain), ...(acquiredAt !== undefined ? ['acquiredAt'] : [])];
    if (described.length > 0) {
      await recordActivity(this.ds.manager, { projectId, imageId, actorId: editorId, action: 'image.updated', summary: `edited ${image.originalName} (${described.join(', ')})` });
    }
    if (pixelSizeUm !== undefined) await returnToDraftIfCleared(this.ds.manager, imageId, editorId, 'the pixel size');
    return this.detail(projectId, imageId);
  }

  /** Removes the row first, then its files: a failure in between leaves unreferenced files, never a row without its files. */
  async remove(actor: Express.User, projectId: string, imageId: string): Promise<void> {
    const image = await this.find(projectId, imageId);
    await this.ds.transaction(async (m) => {
      await returnFiguresShowingImage(m, imageId, actor.id, 'deleted');
      await m.delete(Image, { id: imageId });
      await recordActivity(m, { projectId, imageId, actorId: actor.id, action: 'image.deleted', summary: `deleted ${image.originalName}`, details: { sha256: image.sha256 } });
    });
    await this.ctx.files.delete(image.originalKey);
    await this.ctx.files.deletePrefix(imageKeys.derivatives(projectId, imageId));
  }

  /** Queues a failed image again; the job starts over and overwrites anything the failed attempt left. */
  async retry(projectId: string, imageId: string): Promise<ImageRecord> {
    const image = await this.find(projectId, imageId);
    if (image.state !== 'failed') throw AppError.conflict(`Only a failed image can be retried; this one is ${image.state}.`);
    await this.ds.transaction(async (m) => {
      await m.update(Image, { id: imageId, state: 'failed' }, { state: 'queued', progress: 0, failureReason: null, updatedAt: new Date() });
      await this.ctx.jobs.enqueueDerivatives(imageId, m);
    });
    // Read before waking the worker, so the answer shows the state the request left (queued).
    const record = await this.detail(projectId, imageId);
    this.ctx.jobs.nudge();
    return record;
  }
}
