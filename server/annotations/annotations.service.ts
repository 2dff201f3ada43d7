import type { EntityManager } from 'typeorm';
import { KINDS_FOR_SHAPE, type Annotation as AnnotationDto, type AnnotationBody, type UpdateAnnotationBody } from '../../shared/annotations/annotations';
import { shapeProblem } from '../../shared/annotations/shape-rules';
import type { AppContext } from '../app-context';
import { recordActivity } from '../activity/record-activity';
import { AppError } from '../http/app-error';
import { Image } from '../images/image.entity';
import { returnToDraftIfCleared } from '../reviews/return-to-draft';
import { AnnotationClass } from './annotation-class.entity';
import { Annotation } from './annotation.entity';
import { toAnnotationDto } from './annotation.mapper';

/** Shapes on an image. Every change bumps `version`; a writer holding an older one gets 409, never a silent overwrite. */
export class AnnotationsService {
  constructor(private readonly ctx: AppContext) {}

  async list(projectId: string, imageId: string): Promise<AnnotationDto[]> {
    await this.image(this.ctx.dataSource.manager, projectId, imageId);
    const rows = await this.ctx.dataSource.getRepository(Annotation).find({ where: { imageId }, relations: { author: true }, order: { seq: 'ASC' } });
    return rows.map(toAnnotationDto);
  }

  async create(user: Express.User, projectId: string, imageId: string, body: AnnotationBody): Promise<AnnotationDto> {
    return this.ctx.dataSource.transaction(async (m) => {
      const image = await this.image(m, projectId, imageId);
      await this.check(m, projectId, image, body);
      const saved = await m.save(m.create(Annotation, { ...body, projectId, imageId, authorId: user.id, updatedBy: user.id }));
      await recordActivity(m, { projectId, imageId, actorId: user.id, action: 'annotation.created', summary: `drew a ${body.kind}`, details: { annotationId: saved.id } });
      await returnToDraftIfCleared(m, imageId, user.id, 'the annotations');
      return this.reload(m, saved.id);
    });
  }

  async update(user: Express.User, projectId: string, imageId: string, annotationId: string, body: UpdateAnnotationBody): Promise<AnnotationDto> {
    return this.ctx.dataSource.transaction(async (m) => {
      const image = await this.image(m, projectId, imageId);
      const current = await this.find(m, imageId, annotationId);
      const { version, ...changes } = body;
      await this.check(m, projectId, image, { classId: current.classId, kind: current.kind, points: current.points, label: current.label, ...changes });
      const result = await m
        .createQueryBuilder()
        .update(Annotation)
        .set({ ...changes, updatedBy: user.id, version: () => 'version + 1' })
        .where('id = :id AND version = :version', { id: annotationId, version })
        .execute();
      if (result.affected !== 1) await this.conflict(m, current, version);
      await recordActivity(m, { projectId, imageId, actorId: user.id, action: 'annotation.updated', summary: `changed a ${current.kind}`, details: { annotationId, version: version + 1 } });
      await returnToDraftIfCleared(m, imageId, user.id, 'the annotations');
      return this.reload(m, annotationId);
    });
  }

  async remove(user: Express.User, projectId: string, imageId: string, annotationId: string, version: number): Promise<void> {
    await this.ctx.dataSource.transaction(async (m) => {
      await this.image(m, projectId, imageId);
      const current = await this.find(m, imageId, annotationId);
      const result = await m.delete(Annotation, { id: annotationId, version });
      if (result.affected !== 1) await this.conflict(m, current, version);
      await recordActivity(m, { projectId, imageId, actorId: user.id, action: 'annotation.deleted', summary: `deleted a ${current.kind}`, details: { annotationId, points: current.points } });
      await returnToDraftIfCleared(m, imageId, user.id, 'the annotations');
    });
  }

  /** The image, its size for bounds checks and its pixel size for exports; 404 when not in this project. */
  async image(m: EntityManager, projectId: string, imageId: string): Promise<Image> {
    const image = await m.findOneBy(Image, { id: imageId, projectId });
    if (!image) throw AppError.notFound('The image');
    return image;
  }

  /** The class must be the project's and fit the shape; the shape must be sound and inside the image. */
  async check(m: EntityManager, projectId: string, image: Image, body: AnnotationBody): Promise<void> {
    const cls = await m.findOneBy(AnnotationClass, { id: body.classId, projectId });
    if (!cls) throw new AppError(422, 'validation_failed', 'Choose one of this project’s annotation classes.', [{ field: 'body.classId', message: 'Not a class of this project.' }]);
    if (!KINDS_FOR_SHAPE[cls.shapeKind].includes(body.kind)) {
      throw new AppError(422, 'validation_failed', `A ${body.kind} cannot be a “${cls.name}” (${cls.shapeKind.replace(/_/g, ' ')}).`, [
        { field: 'body.kind', message: `“${cls.name}” takes ${KINDS_FOR_SHAPE[cls.shapeKind].join(', ')}.` },
      ]);
    }
    const problem = shapeProblem(body.kind, body.points, image, body.label);
    if (problem) throw new AppError(422, 'validation_failed', problem, [{ field: 'body.points', message: problem }]);
  }

  private async find(m: EntityManager, imageId: string, annotationId: string): Promise<Annotation> {
    const a = await m.findOne(Annotation, { where: { id: annotationId, imageId }, relations: { author: true } });
    if (!a) throw AppError.notFound('The annotation');
    return a;
  }

  private async reload(m: EntityManager, id: string): Promise<AnnotationDto> {
    return toAnnotationDto(await m.findOneOrFail(Annotation, { where: { id }, relations: { author: true } }));
  }

  private async conflict(m: EntityManager, before: Annotation, sentVersion: number): Promise<never> {
    const now = await m.findOneBy(Annotation, { id: before.id });
    const who = now ? (await m.query('SELECT display_name FROM users WHERE id = $1', [now.updatedBy]))[0]?.display_name : null;
    throw AppError.conflict(
      now
        ? `${who ?? 'Someone'} changed this shape after you loaded it (you had version ${sentVersion}, it is now ${now.version}). Reload to see their change, then edit again.`
        : 'Someone deleted this shape after you loaded it.',
    );
  }
}
