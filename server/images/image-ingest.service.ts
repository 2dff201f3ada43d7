import type { EntityManager } from 'typeorm';
import type { UploadFields, UploadResult } from '../../shared/images';
import type { AppContext } from '../app-context';
import { SpecimenLocation } from '../archive/specimen-location.entity';
import { Specimen } from '../archive/specimen.entity';
import { recordActivity } from '../activity/record-activity';
import { AppError } from '../http/app-error';
import { Image } from './image.entity';
import { imageKeys } from './image-keys';
import type { HashedFile } from './ingest/hashing-disk-storage';
import { findTruncation } from './ingest/check-complete';
import { readImageFacts, type ImageFacts } from './ingest/read-metadata';
import { sniffFormat } from './ingest/sniff-format';
import { ImagesService } from './images.service';

/** The file as the upload middleware left it, with the name the client gave. */
export interface ReceivedFile extends HashedFile {
  originalName: string;
}

const CONTENT_TYPES = { tiff: 'image/tiff', png: 'image/png', jpeg: 'image/jpeg', webp: 'image/webp' } as const;

/**
 * Turns one received file into an image: checks (name, content, size, completeness, specimen,
 * duplicates), keeps the original under its content address, and queues its derivatives in the
 * same transaction as the row. Any refusal leaves no row and no stored file.
 */
export class ImageIngestService {
  constructor(private readonly ctx: AppContext) {}

  async ingest(projectId: string, uploaderId: string, file: ReceivedFile, fields: UploadFields): Promise<UploadResult> {
    const name = checkedName(file.originalName);
    if (file.size === 0) throw new AppError(422, 'empty_file', `${name} is empty (0 bytes).`);
    const sniffed = sniffFormat(file.head);
    if ('refused' in sniffed) throw new AppError(415, 'unsupported_format', sniffed.refused);
    await this.checkPlace(projectId, fields);
    await this.refuseDuplicate(projectId, file.sha256);
    const facts = await readImageFacts(file.path, sniffed.format, this.ctx.config.images.maxPixels);
    const truncation = await findTruncation(file.path, sniffed.format, file.size);
    if (truncation) throw new AppError(422, 'image_corrupt', `${name}: ${truncation}`);

    const originalKey = imageKeys.original(projectId, file.sha256);
    await this.ctx.files.putFile(originalKey, file.path, CONTENT_TYPES[sniffed.format]);
    let imageId: string;
    try {
      imageId = await this.ctx.dataSource.transaction(async (m) => {
        const row = await m.save(m.create(Image, this.row(projectId, uploaderId, name, file, facts, fields, originalKey)));
        await this.ctx.jobs.enqueueDerivatives(row.id, m);
        await recordActivity(m, { projectId, imageId: row.id, actorId: uploaderId, action: 'image.uploaded', summary: `uploaded ${name}`, details: { sha256: file.sha256 } });
        return row.id;
      });
    } catch (err) {
      // The same bytes won a race with us: they own the (identical) stored original.
      if (isUniqueViolation(err)) throw await this.duplicateError(projectId, file.sha256);
      await this.ctx.files.delete(originalKey);
      throw err;
    }
    // Read before waking the worker, so the answer shows the state the request left (queued).
    const image = await new ImagesService(this.ctx).detail(projectId, imageId);
    this.ctx.jobs.nudge();
    return { image, notices: notices(facts) };
  }

  private row(projectId: string, uploaderId: string, name: string, file: ReceivedFile, facts: ImageFacts, f: UploadFields, originalKey: string): Partial<Image> {
    const typed = f.pixelSizeUm !== undefined;
    return {
      projectId,
      uploaderId,
      specimenId: f.specimenId,
      locationId: f.locationId ?? null,
      modality: f.modality,
      element: f.element ?? null,
      instrument: f.instrument || facts.instrument,
      magnification: f.magnification ?? null,
      acceleratingVoltageKv: f.acceleratingVoltageKv ?? null,
      workingDistanceMm: f.workingDistanceMm ?? null,
      detector: f.detector,
      acquiredAt: f.acquiredAt ? new Date(f.acquiredAt) : facts.acquiredAt,
      pixelSizeUm: typed ? f.pixelSizeUm! : facts.pixelSize.xUm,
      pixelSizeYUm: typed ? f.pixelSizeUm! : facts.pixelSize.yUm,
      pixelSizeSource: typed ? 'user' : facts.pixelSize.source,
      pixelSizeConfirmed: typed,
      pixelSizeNote: typed ? `Entered at upload (the file said: ${facts.pixelSize.note})` : facts.pixelSize.note,
      tags: f.tags,
      notes: f.notes,
      originalName: name,
      sha256: file.sha256,
      byteSize: String(file.size),
      format: facts.format,
      width: facts.width,
      height: facts.height,
      bitDepth: facts.bitDepth,
      channels: facts.channels,
      pageCount: facts.pageCount,
      originalKey,
      state: 'queued',
      progress: 0,
    };
  }

  private async checkPlace(projectId: string, f: UploadFields): Promise<void> {
    const m: EntityManager = this.ctx.dataSource.manager;
    if (!(await m.existsBy(Specimen, { id: f.specimenId, projectId }))) {
      throw new AppError(422, 'validation_failed', 'Choose a specimen of this project.', [{ field: 'body.specimenId', message: 'Not a specimen of this project.' }]);
    }
    if (f.locationId && !(await m.existsBy(SpecimenLocation, { id: f.locationId, specimenId: f.specimenId }))) {
      throw new AppError(422, 'validation_failed', 'Choose a location on this specimen.', [{ field: 'body.locationId', message: 'Not a location on the chosen specimen.' }]);
    }
  }

  private async refuseDuplicate(projectId: string, sha256: string): Promise<void> {
    if (await this.ctx.dataSource.manager.existsBy(Image, { projectId, sha256 })) throw await this.duplicateError(projectId, sha256);
  }

  private async duplicateError(projectId: string, sha256: string): Promise<AppError> {
    const existing = await this.ctx.dataSource.manager.findOneBy(Image, { projectId, sha256 });
    const what = existing ? `“${existing.originalName}” (image ${existing.id})` : 'another image';
    return new AppError(409, 'duplicate_image', `This file is already in the project as ${what}; it was not stored again.`, [
      { field: 'file', message: `Identical bytes (SHA-256 ${sha256.slice(0, 12)}…) to ${what}.` },
    ]);
  }
}

/** A display name only: it is never used as a path, but names that try to be paths are refused outright. */
function checkedName(raw: string): string {
  const name = raw.normalize('NFC').trim();
  if (!name || name.length > 255 || /[/\\\u0000-\u001f\u007f]/.test(name) || name === '.' || name === '..') {
    throw new AppError(422, 'invalid_file_name', 'The file name must be a plain name (no folders, “..” or control characters), at most 255 characters.', [
      { field: 'file', message: 'Rename the file and upload it again.' },
    ]);
  }
  return name;
}

function notices(facts: ImageFacts): string[] {
  const out: string[] = [];
  if (facts.pageCount > 1) out.push(`This TIFF has ${facts.pageCount} pages; the whole file is kept, and only the first page is shown.`);
  if (facts.pixelSize.source === 'none') out.push(`No pixel size was found (${facts.pixelSize.note}) Enter it before measuring.`);
  if (facts.bitDepth === 16) out.push('This 16-bit image is shown windowed to 8 bits; the original keeps every level.');
  return out;
}

function isUniqueViolation(err: unknown): boolean {
  const e = err as { code?: string; driverError?: { code?: string } };
  return e?.code === '23505' || e?.driverError?.code === '23505';
}
