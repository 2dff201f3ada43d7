import type { EntityManager } from 'typeorm';
import type { AlignmentBody, ImageAlignment as ImageAlignmentDto } from '../../shared/alignments';
import { fitAlignment, type AlignmentFit } from '../../shared/viewer/alignment';
import { recordActivity } from '../activity/record-activity';
import type { AppContext } from '../app-context';
import { AppError } from '../http/app-error';
import { Image } from '../images/image.entity';
import { ImageAlignment } from './image-alignment.entity';
import { toAlignmentDto } from './image-alignment.mapper';

/** Alignments between images of one location: read from either image, saved once per pair. */
export class AlignmentsService {
  constructor(private readonly ctx: AppContext) {}

  /** Every alignment that involves the image, seen from it. */
  async list(projectId: string, imageId: string): Promise<ImageAlignmentDto[]> {
    const m = this.ctx.dataSource.manager;
    await this.image(m, projectId, imageId, 'The image');
    const rows = await m.find(ImageAlignment, {
      where: [{ projectId, imageId }, { projectId, otherImageId: imageId }],
      relations: { savedByUser: true },
      order: { savedAt: 'DESC' },
    });
    return rows.map((r) => toAlignmentDto(r, imageId));
  }

  async one(projectId: string, imageId: string, otherImageId: string): Promise<ImageAlignmentDto> {
    const m = this.ctx.dataSource.manager;
    await this.image(m, projectId, imageId, 'The image');
    const row = await this.pairRow(m, imageId, otherImageId);
    if (!row) throw AppError.notFound('An alignment of these two images');
    return toAlignmentDto(row, imageId);
  }

  /**
   * Fits the transform from the pairs and keeps it, replacing an earlier alignment of the two
   * images made from either side. Refused (422, nothing changed) unless both images are of this
   * project and one location, every point lies on its image, and the pairs give a sensible fit.
   */
  async save(user: Express.User, projectId: string, imageId: string, otherImageId: string, body: AlignmentBody): Promise<ImageAlignmentDto> {
    const saved = await this.ctx.dataSource.transaction(async (m) => {
      const image = await this.image(m, projectId, imageId, 'The image');
      const other = await this.image(m, projectId, otherImageId, 'The other image');
      if (image.id === other.id) throw fieldError('params.otherImageId', 'An image cannot be aligned with itself; choose another image of the location.');
      if (!image.locationId || image.locationId !== other.locationId) {
        throw fieldError('params.otherImageId', 'Only images filed at the same location can be aligned; file both at one location first.');
      }
      body.pairs.forEach((p, i) => {
        if (outside(p.image, image)) throw fieldError(`body.pairs.${i}.image`, `Point ${i + 1} must lie on ${image.originalName} (${image.width} × ${image.height} px).`);
        if (outside(p.other, other)) throw fieldError(`body.pairs.${i}.other`, `Point ${i + 1} must lie on ${other.originalName} (${other.width} × ${other.height} px).`);
      });
      const fit = fitOrRefuse(body);
      await m.delete(ImageAlignment, [{ imageId, otherImageId }, { imageId: otherImageId, otherImageId: imageId }]);
      const row = await m.save(
        m.create(ImageAlignment, { projectId, imageId, otherImageId, kind: fit.kind, pairs: body.pairs, transform: fit.transform, savedBy: user.id, savedAt: new Date() }),
      );
      const worst = Math.max(...fit.similarityResidualsPx);
      await recordActivity(m, {
        projectId,
        imageId,
        actorId: user.id,
        action: 'alignment.saved',
        summary: `aligned ${other.originalName} onto ${image.originalName} with ${body.pairs.length} point pairs (${fit.kind === 'similarity' ? 'scale, rotation, shift' : 'affine'})`,
        details: { otherImageId, kind: fit.kind, transform: fit.transform, worstSimilarityResidualPx: worst },
      });
      return row.id;
    });
    const row = await this.ctx.dataSource.manager.findOneOrFail(ImageAlignment, { where: { id: saved }, relations: { savedByUser: true } });
    return toAlignmentDto(row, imageId);
  }

  /** Forgets the alignment of the two images, whichever side it was made from. */
  async remove(user: Express.User, projectId: string, imageId: string, otherImageId: string): Promise<void> {
    await this.ctx.dataSource.transaction(async (m) => {
      const image = await this.image(m, projectId, imageId, 'The image');
      const row = await this.pairRow(m, imageId, otherImageId);
      if (!row) throw AppError.notFound('An alignment of these two images');
      const other = await m.findOneBy(Image, { id: otherImageId });
      await m.delete(ImageAlignment, { id: row.id });
      await recordActivity(m, {
        projectId,
        imageId,
        actorId: user.id,
        action: 'alignment.removed',
        summary: `removed the alignment of ${other?.originalName ?? 'an image'} with ${image.originalName}`,
        details: { otherImageId },
      });
    });
  }

  private async image(m: EntityManager, projectId: string, imageId: string, what: string): Promise<Image> {
    const image = await m.findOneBy(Image, { id: imageId, projectId });
    if (!image) throw AppError.notFound(what);
    return image;
  }

  private pairRow(m: EntityManager, imageId: string, otherImageId: string): Promise<ImageAlignment | null> {
    return m.findOne(ImageAlignment, {
      where: [{ imageId, otherImageId }, { imageId: otherImageId, otherImageId: imageId }],
      relations: { savedByUser: true },
    });
  }
}

function fitOrRefuse(body: AlignmentBody): AlignmentFit {
  try {
    return fitAlignment(body.pairs);
  } catch (err) {
    // fitAlignment throws RangeError with a message for the person when the pairs are degenerate.
    if (err instanceof RangeError) throw fieldError('body.pairs', err.message);
    throw err;
  }
}

function outside([x, y]: readonly [number, number], image: { width: number; height: number }): boolean {
  return x < 0 || y < 0 || x > image.width || y > image.height;
}

function fieldError(field: string, message: string): AppError {
  return new AppError(422, 'validation_failed', message, [{ field, message }]);
}
