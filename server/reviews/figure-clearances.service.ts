import type { Readable } from 'node:stream';
import type { FigureClearance as FigureClearanceDto } from '../../shared/reviews';
import type { AppContext } from '../app-context';
import { AppError } from '../http/app-error';
import { FigureClearance } from './figure-clearance.entity';
import { requireSubject } from './review-subject';
import { toPerson } from './review.mapper';

/** A kept file, ready to send. */
export interface ClearedFileDownload {
  name: string;
  contentType: string;
  size: number;
  body: Readable;
}

/** What each clearing of a figure froze, and the files rendered then, byte for byte as they were made. */
export class FigureClearancesService {
  constructor(private readonly ctx: AppContext) {}

  /** Newest first. */
  async list(projectId: string, figureId: string): Promise<FigureClearanceDto[]> {
    const m = this.ctx.dataSource.manager;
    await requireSubject(m, projectId, { type: 'figure', id: figureId });
    const rows = await m.find(FigureClearance, { where: { figureId, projectId }, relations: { clearer: true }, order: { seq: 'DESC' } });
    return rows.map((c) => ({
      id: c.id,
      figureId: c.figureId,
      figureVersion: c.figureVersion,
      title: c.title,
      definition: c.definition,
      images: c.images,
      files: c.files.map(({ storageKey: _key, ...file }) => file),
      clearedBy: toPerson(c.clearer),
      clearedAt: c.clearedAt.toISOString(),
    }));
  }

  /** One kept file of one clearing; 404 when the figure, the clearing or that format is not there. */
  async file(projectId: string, figureId: string, clearanceId: string, format: 'png' | 'tiff'): Promise<ClearedFileDownload> {
    const m = this.ctx.dataSource.manager;
    await requireSubject(m, projectId, { type: 'figure', id: figureId });
    const clearance = await m.findOneBy(FigureClearance, { id: clearanceId, figureId, projectId });
    const file = clearance?.files.find((f) => f.format === format);
    if (!clearance || !file) throw AppError.notFound('The cleared file');
    const body = await this.ctx.files.get(file.storageKey);
    if (!body) throw new AppError(500, 'internal_error', 'The cleared file is missing from storage; tell an administrator (its SHA-256 is on record).');
    const ext = format === 'png' ? 'png' : 'tif';
    const name = `${clearance.title.replace(/[^\p{L}\p{N}._-]+/gu, '_').slice(0, 80)}_cleared_v${clearance.figureVersion}_${file.widthMm}mm_${file.dpi}dpi.${ext}`;
    return { name, contentType: format === 'png' ? 'image/png' : 'image/tiff', size: file.byteSize, body };
  }
}
