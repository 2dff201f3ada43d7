import { randomUUID } from 'node:crypto';
import { mkdir, rm, writeFile } from 'node:fs/promises';
import path from 'node:path';
import { In, type EntityManager } from 'typeorm';
import { DEFAULT_PRINT, type ExportFigureBody, type Figure as FigureDto, type FigureBody, type UpdateFigureBody } from '../../shared/figures';
import type { ReviewState } from '../../shared/reviews';
import { recordActivity } from '../activity/record-activity';
import { AnnotationClass } from '../annotations/annotation-class.entity';
import type { AppContext } from '../app-context';
import { AppError } from '../http/app-error';
import { measurementsWithContext } from '../exports/measurements-of';
import { Image } from '../images/image.entity';
import { fieldsCsv } from '../measurements/measurements-csv';
import { SummaryService } from '../measurements/summary.service';
import { specOf } from '../reviews/freeze-figure';
import { returnFigureToDraftIfCleared } from '../reviews/return-to-draft';
import { FigureExport } from './figure-export.entity';
import { Figure } from './figure.entity';
import { renderFigure } from './figure-renderer';
import { followPanelThreads } from './panel-moves';

const toDto = (f: Figure, reviewState: ReviewState): FigureDto => ({
  id: f.id,
  projectId: f.projectId,
  title: f.title,
  ...DEFAULT_PRINT,
  ...f.spec,
  version: f.version,
  createdByName: f.creator.displayName,
  updatedAt: f.updatedAt.toISOString(),
  reviewState,
});

/**
 * Figures keep their definition; every export renders the current annotations and is kept as a file.
 * Editing a cleared figure returns it to draft (its cleared export stays, see server/reviews).
 */
export class FiguresService {
  constructor(private readonly ctx: AppContext) {}

  private get ds() {
    return this.ctx.dataSource;
  }

  async list(projectId: string): Promise<FigureDto[]> {
    const figures = await this.ds.getRepository(Figure).find({ where: { projectId }, relations: { creator: true }, order: { updatedAt: 'DESC' } });
    const states = await this.reviewStates(this.ds.manager, projectId, figures.map((f) => f.id));
    return figures.map((f) => toDto(f, states.get(f.id) ?? 'draft'));
  }

  async get(projectId: string, figureId: string): Promise<FigureDto> {
    const figure = await this.find(this.ds.manager, projectId, figureId);
    const states = await this.reviewStates(this.ds.manager, projectId, [figureId]);
    return toDto(figure, states.get(figureId) ?? 'draft');
  }

  async create(user: Express.User, projectId: string, body: FigureBody): Promise<FigureDto> {
    const id = await this.ds.transaction(async (m) => {
      await this.checkPanels(m, projectId, body);
      const { title, ...spec } = body;
      const saved = await m.save(m.create(Figure, { projectId, title, spec, createdBy: user.id }));
      await recordActivity(m, { projectId, actorId: user.id, action: 'catalogue.created', summary: `composed the figure “${title}”` });
      return saved.id;
    });
    return this.get(projectId, id);
  }

  async update(user: Express.User, projectId: string, figureId: string, body: UpdateFigureBody): Promise<FigureDto> {
    await this.ds.transaction(async (m) => {
      const figure = await this.find(m, projectId, figureId);
      const { version, title, ...changes } = body;
      const next = { title: title ?? figure.title, ...figure.spec, ...changes };
      await this.checkPanels(m, projectId, next);
      const result = await m
        .createQueryBuilder()
        .update(Figure)
        .set({
          title: next.title,
          spec: { columns: next.columns, gapMm: next.gapMm, commonScaleBar: next.commonScaleBar, widthMm: next.widthMm ?? DEFAULT_PRINT.widthMm, dpi: next.dpi ?? DEFAULT_PRINT.dpi, panels: next.panels },
          version: () => 'version + 1',
        })
        .where('id = :figureId AND version = :version', { figureId, version })
        .execute();
      if (result.affected !== 1) throw AppError.conflict(`Someone changed this figure after you loaded it (you had version ${version}, it is now ${figure.version}). Reload, then edit again.`);
      // Threads pinned to a panel follow it when panels are reordered, edited or removed.
      await followPanelThreads(m, figureId, figure.spec.panels, next.panels);
      await recordActivity(m, { projectId, actorId: user.id, action: 'catalogue.updated', summary: `edited the figure “${next.title}”` });
      await returnFigureToDraftIfCleared(m, figureId, user.id);
    });
    return this.get(projectId, figureId);
  }

  async remove(user: Express.User, projectId: string, figureId: string): Promise<void> {
    await this.ds.transaction(async (m) => {
      const figure = await this.find(m, projectId, figureId);
      await m.delete(Figure, { id: figureId });
      await recordActivity(m, { projectId, actorId: user.id, action: 'catalogue.deleted', summary: `deleted the figure “${figure.title}”` });
    });
  }

  /** Renders, keeps the file under the figure, and returns it with its record. */
  async export(user: Express.User, projectId: string, figureId: string, body: ExportFigureBody): Promise<{ record: FigureExport; file: Buffer; name: string }> {
    const figure = await this.find(this.ds.manager, projectId, figureId);
    const file = await renderFigure(this.ctx, this.ds.manager, projectId, specOf(figure), body);
    const exportId = randomUUID();
    const ext = body.format === 'png' ? 'png' : 'tif';
    const key = `projects/${projectId}/figures/${figureId}/exports/${exportId}.${ext}`;
    const tmp = path.join(this.ctx.config.storageDir, 'tmp', 'figures', `${exportId}.${ext}`);
    await mkdir(path.dirname(tmp), { recursive: true });
    await writeFile(tmp, file);
    try {
      await this.ctx.files.putFile(key, tmp, body.format === 'png' ? 'image/png' : 'image/tiff');
    } finally {
      await rm(tmp, { force: true });
    }
    const record = await this.ds.getRepository(FigureExport).save({
      id: exportId, figureId, figureVersion: figure.version, format: body.format, widthMm: body.widthMm, dpi: body.dpi, storageKey: key, byteSize: String(file.length), createdBy: user.id,
    });
    const name = `${figure.title.replace(/[^\p{L}\p{N}._-]+/gu, '_').slice(0, 80)}_v${figure.version}_${body.widthMm}mm_${body.dpi}dpi.${ext}`;
    return { record, file, name };
  }

  /** The measurements behind a figure: every field measured on its panels' images, as CSV. */
  async measurementsCsv(projectId: string, figureId: string): Promise<{ name: string; body: string }> {
    const figure = await this.find(this.ds.manager, projectId, figureId);
    const rows = await measurementsWithContext(this.ds.manager, projectId, [...new Set(figure.spec.panels.map((p) => p.imageId))]);
    const name = `${figure.title.replace(/[^\p{L}\p{N}._-]+/gu, '_').slice(0, 80)}_measurements.csv`;
    return { name, body: fieldsCsv((m) => m.image.specimen.code, rows, await new SummaryService(this.ctx).staleTest(rows)) };
  }

  /** Review state of each figure that has one (the rest are drafts nobody submitted). */
  private async reviewStates(m: EntityManager, projectId: string, figureIds: string[]): Promise<Map<string, ReviewState>> {
    if (figureIds.length === 0) return new Map();
    const rows: { subject_id: string; state: ReviewState }[] = await m.query(
      `SELECT subject_id, state FROM review_states WHERE subject_type = 'figure' AND project_id = $1 AND subject_id = ANY($2::uuid[])`,
      [projectId, figureIds],
    );
    return new Map(rows.map((r) => [r.subject_id, r.state]));
  }

  private async find(m: EntityManager, projectId: string, figureId: string): Promise<Figure> {
    const figure = await m.findOne(Figure, { where: { id: figureId, projectId }, relations: { creator: true } });
    if (!figure) throw AppError.notFound('The figure');
    return figure;
  }

  /** Panels must show this project's images, inside their bounds, with this project's classes. */
  private async checkPanels(m: EntityManager, projectId: string, spec: Pick<FigureBody, 'panels'>): Promise<void> {
    const images = new Map((await m.findBy(Image, { id: In(spec.panels.map((p) => p.imageId)), projectId })).map((i) => [i.id, i]));
    const classes = new Set((await m.findBy(AnnotationClass, { projectId })).map((c) => c.id));
    const problems = spec.panels.flatMap((p, i) => {
      const image = images.get(p.imageId);
      if (!image) return [{ field: `body.panels.${i}.imageId`, message: 'Not an image of this project.' }];
      const out: { field: string; message: string }[] = [];
      if (p.region.x + p.region.width > image.width || p.region.y + p.region.height > image.height) {
        out.push({ field: `body.panels.${i}.region`, message: `The region reaches outside the image (${image.width} × ${image.height} px).` });
      }
      if (p.classIds.some((c) => !classes.has(c))) out.push({ field: `body.panels.${i}.classIds`, message: 'Not a class of this project.' });
      return out;
    });
    if (problems.length > 0) throw new AppError(422, 'validation_failed', `Check ${problems[0]!.field}: ${problems[0]!.message}`, problems);
  }
}
