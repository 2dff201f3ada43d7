import type { EntityManager } from 'typeorm';
import { In } from 'typeorm';
import { pixelSizeFromLine } from '../../shared/annotations/calibration';
import type {
  ApplyPresetBody,
  CalibrationChange as CalibrationChangeDto,
  CalibrationPreset as CalibrationPresetDto,
  CalibrationPresetBody,
  DrawnCalibrationBody,
} from '../../shared/calibration';
import type { ImageRecord } from '../../shared/images';
import type { AppContext } from '../app-context';
import { AppError } from '../http/app-error';
import { Image } from '../images/image.entity';
import { ImagesService } from '../images/images.service';
import { CalibrationChange } from './calibration-change.entity';
import { CalibrationPreset } from './calibration-preset.entity';
import { changePixelSize } from './pixel-size-change';

const day = () => new Date().toISOString().slice(0, 10);

/** Pixel sizes from lines drawn on images and from presets, with their history. */
export class CalibrationService {
  private readonly images: ImagesService;

  constructor(private readonly ctx: AppContext) {
    this.images = new ImagesService(ctx);
  }

  async drawn(user: Express.User, projectId: string, imageId: string, body: DrawnCalibrationBody): Promise<ImageRecord> {
    await this.ctx.dataSource.transaction(async (m) => {
      const image = await this.image(m, projectId, imageId);
      const outside = [body.start, body.end].find(([x, y]) => x < 0 || y < 0 || x > image.width || y > image.height);
      if (outside) throw fieldError('body.start', `The line must lie on the image (${image.width} × ${image.height} px).`);
      let result;
      try {
        result = pixelSizeFromLine(body.start, body.end, body.trueLengthUm);
      } catch (err) {
        // pixelSizeFromLine throws RangeError for a line under one pixel or a non-positive length.
        if (err instanceof RangeError) throw fieldError('body.end', err.message);
        throw err;
      }
      if (result.warning && !body.acceptImplausible) throw fieldError('body.trueLengthUm', result.warning);
      const px = Math.hypot(body.end[0] - body.start[0], body.end[1] - body.start[1]);
      const note = `Drawn by ${user.displayName} on ${day()}: ${body.trueLengthUm} µm over ${px.toFixed(1)} px.`;
      await changePixelSize(m, image, user.id, { umPerPx: result.umPerPx, source: 'drawn', note });
    });
    return this.images.detail(projectId, imageId);
  }

  async history(projectId: string, imageId: string): Promise<CalibrationChangeDto[]> {
    await this.image(this.ctx.dataSource.manager, projectId, imageId);
    const rows = await this.ctx.dataSource.getRepository(CalibrationChange).find({ where: { imageId }, relations: { user: true }, order: { at: 'DESC' } });
    return rows.map((c) => ({
      id: c.id,
      imageId: c.imageId,
      at: c.at.toISOString(),
      byName: c.user.displayName,
      oldUmPerPx: c.oldUmPerPx,
      newUmPerPx: c.newUmPerPx,
      source: c.source,
      note: c.note,
    }));
  }

  async presets(projectId: string): Promise<CalibrationPresetDto[]> {
    const rows = await this.ctx.dataSource.getRepository(CalibrationPreset).find({ where: { projectId }, order: { name: 'ASC' } });
    return rows.map(toPresetDto);
  }

  async createPreset(projectId: string, body: CalibrationPresetBody): Promise<CalibrationPresetDto> {
    return this.ctx.dataSource.transaction(async (m) => {
      await this.refuseTakenName(m, projectId, body.name);
      return toPresetDto(await m.save(m.create(CalibrationPreset, { ...body, projectId })));
    });
  }

  async updatePreset(projectId: string, presetId: string, body: CalibrationPresetBody): Promise<CalibrationPresetDto> {
    return this.ctx.dataSource.transaction(async (m) => {
      const preset = await this.preset(m, projectId, presetId);
      if (body.name !== preset.name) await this.refuseTakenName(m, projectId, body.name);
      return toPresetDto(await m.save(Object.assign(preset, body)));
    });
  }

  /** Deleting a preset leaves the pixel sizes it set; their notes still name it. */
  async removePreset(projectId: string, presetId: string): Promise<void> {
    await this.preset(this.ctx.dataSource.manager, projectId, presetId);
    await this.ctx.dataSource.getRepository(CalibrationPreset).delete({ id: presetId });
  }

  /** All or nothing: every image must be this project's. */
  async applyPreset(user: Express.User, projectId: string, presetId: string, body: ApplyPresetBody): Promise<{ updated: number }> {
    return this.ctx.dataSource.transaction(async (m) => {
      const preset = await this.preset(m, projectId, presetId);
      const ids = [...new Set(body.imageIds)];
      const images = await m.findBy(Image, { id: In(ids), projectId });
      if (images.length !== ids.length) {
        const found = new Set(images.map((i) => i.id));
        const missing = body.imageIds.findIndex((id) => !found.has(id));
        throw fieldError(`body.imageIds.${missing}`, 'Not an image of this project; no pixel size was changed.');
      }
      const note = `Preset “${preset.name}” (${preset.umPerPx} µm/px) applied by ${user.displayName} on ${day()}.`;
      for (const image of images) await changePixelSize(m, image, user.id, { umPerPx: preset.umPerPx, source: 'preset', note });
      return { updated: images.length };
    });
  }

  private async image(m: EntityManager, projectId: string, imageId: string): Promise<Image> {
    const image = await m.findOneBy(Image, { id: imageId, projectId });
    if (!image) throw AppError.notFound('The image');
    return image;
  }

  private async preset(m: EntityManager, projectId: string, presetId: string): Promise<CalibrationPreset> {
    const preset = await m.findOneBy(CalibrationPreset, { id: presetId, projectId });
    if (!preset) throw AppError.notFound('The preset');
    return preset;
  }

  private async refuseTakenName(m: EntityManager, projectId: string, name: string): Promise<void> {
    if (await m.existsBy(CalibrationPreset, { projectId, name })) {
      throw new AppError(409, 'conflict', `This project already has a preset “${name}”.`, [{ field: 'body.name', message: 'This name is taken.' }]);
    }
  }
}

function fieldError(field: string, message: string): AppError {
  return new AppError(422, 'validation_failed', message, [{ field, message }]);
}

function toPresetDto(p: CalibrationPreset): CalibrationPresetDto {
  return { id: p.id, projectId: p.projectId, name: p.name, instrument: p.instrument, objective: p.objective, camera: p.camera, umPerPx: p.umPerPx, createdAt: p.createdAt.toISOString() };
}
