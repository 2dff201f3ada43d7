import type { EntityManager } from 'typeorm';
import { KINDS_FOR_SHAPE, type AnnotationClass as AnnotationClassDto, type AnnotationClassBody } from '../../shared/annotations/annotations';
import type { AppContext } from '../app-context';
import { AppError } from '../http/app-error';
import { returnFiguresDrawingClass, returnToDraftIfCleared } from '../reviews/return-to-draft';
import { AnnotationClass } from './annotation-class.entity';
import { Annotation } from './annotation.entity';
import { toAnnotationClassDto } from './annotation.mapper';

/**
 * A project's annotation classes. A class in use is deleted only by moving its shapes to another class.
 * Figures draw classes by their name and colour, so a rename, a new colour or a deletion returns the cleared
 * figures drawing the class to draft, in the same transaction.
 */
export class AnnotationClassesService {
  constructor(private readonly ctx: AppContext) {}

  async list(projectId: string): Promise<AnnotationClassDto[]> {
    const { entities, raw } = await this.ctx.dataSource
      .getRepository(AnnotationClass)
      .createQueryBuilder('c')
      .addSelect('(SELECT count(*) FROM annotations a WHERE a.class_id = c.id)::int', 'usage')
      .where('c.project_id = :projectId', { projectId })
      .orderBy('c.position', 'ASC')
      .addOrderBy('c.name', 'ASC')
      .getRawAndEntities();
    return entities.map((c, i) => toAnnotationClassDto(c, Number(raw[i].usage)));
  }

  async create(projectId: string, body: AnnotationClassBody): Promise<AnnotationClassDto> {
    return this.ctx.dataSource.transaction(async (m) => {
      await this.refuseTakenName(m, projectId, body.name);
      const position = (await m.countBy(AnnotationClass, { projectId })) + 1;
      return toAnnotationClassDto(await m.save(m.create(AnnotationClass, { ...body, projectId, position })), 0);
    });
  }

  async update(user: Express.User, projectId: string, classId: string, body: AnnotationClassBody): Promise<AnnotationClassDto> {
    return this.ctx.dataSource.transaction(async (m) => {
      const cls = await this.find(m, projectId, classId);
      const change = classChange(cls, body);
      if (body.name !== cls.name) await this.refuseTakenName(m, projectId, body.name);
      if (body.shapeKind !== cls.shapeKind) {
        const misfits = await m
          .createQueryBuilder(Annotation, 'a')
          .where('a.class_id = :classId AND NOT (a.kind = ANY(:kinds))', { classId, kinds: [...KINDS_FOR_SHAPE[body.shapeKind]] })
          .getCount();
        if (misfits > 0) throw AppError.conflict(`${misfits} shape${misfits > 1 ? 's' : ''} of this class would not fit the new kind; change or move them first.`);
      }
      const saved = await m.save(Object.assign(cls, body));
      if (change) await returnFiguresDrawingClass(m, classId, user.id, change);
      return toAnnotationClassDto(saved, await m.countBy(Annotation, { classId }));
    });
  }

  /** Refuses while shapes use the class, unless `moveTo` names the class that takes them over. */
  async remove(user: Express.User, projectId: string, classId: string, moveTo: string | undefined): Promise<void> {
    await this.ctx.dataSource.transaction(async (m) => {
      const cls = await this.find(m, projectId, classId);
      const usage = await m.countBy(Annotation, { classId });
      if (usage > 0 && !moveTo) {
        throw AppError.conflict(`${usage} shape${usage > 1 ? 's use' : ' uses'} “${cls.name}”. Choose a class to move ${usage > 1 ? 'them' : 'it'} to, or delete the shapes first.`);
      }
      if (usage > 0 && moveTo) {
        if (moveTo === classId) throw AppError.conflict('Choose a different class to move the shapes to.');
        const target = await this.find(m, projectId, moveTo);
        const misfits = await m
          .createQueryBuilder(Annotation, 'a')
          .where('a.class_id = :classId AND NOT (a.kind = ANY(:kinds))', { classId, kinds: [...KINDS_FOR_SHAPE[target.shapeKind]] })
          .getCount();
        if (misfits > 0) throw AppError.conflict(`${misfits} shape${misfits > 1 ? 's' : ''} would not fit “${target.name}” (${target.shapeKind}); choose another class.`);
        const change = `deleted the annotation class “${cls.name}” and moved its shapes to “${target.name}”`;
        // Panels drawing the target class now draw the moved shapes too, but only on the images that had some.
        const images = (await m.query(`SELECT DISTINCT image_id FROM annotations WHERE class_id = $1`, [classId]) as { image_id: string }[]).map((r) => r.image_id);
        await returnFiguresDrawingClass(m, classId, user.id, change);
        await returnFiguresDrawingClass(m, target.id, user.id, change, images);
        await m.update(Annotation, { classId }, { classId: target.id, version: () => 'version + 1' });
        // The moved shapes changed class on their images: a cleared image holding some is a draft again (locked in id order).
        for (const imageId of [...images].sort()) await returnToDraftIfCleared(m, imageId, user.id, 'the annotations', { figures: false });
      } else {
        // Unused, but a panel may still list it: its legend loses the entry.
        await returnFiguresDrawingClass(m, classId, user.id, `deleted the annotation class “${cls.name}”`);
      }
      await m.delete(AnnotationClass, { id: classId });
    });
  }

  private async find(m: EntityManager, projectId: string, classId: string): Promise<AnnotationClass> {
    const cls = await m.findOneBy(AnnotationClass, { id: classId, projectId });
    if (!cls) throw AppError.notFound('The annotation class');
    return cls;
  }

  private async refuseTakenName(m: EntityManager, projectId: string, name: string): Promise<void> {
    if (await m.existsBy(AnnotationClass, { projectId, name })) {
      throw new AppError(409, 'conflict', `This project already has a class “${name}”.`, [{ field: 'body.name', message: 'This name is taken.' }]);
    }
  }
}

/** What a class edit changes in a figure, in words for its history; null when neither name nor colour changes. */
function classChange(before: Pick<AnnotationClass, 'name' | 'colour'>, after: AnnotationClassBody): string | null {
  const renamed = after.name !== before.name;
  const recoloured = after.colour !== before.colour;
  if (renamed && recoloured) return `renamed the annotation class “${before.name}” to “${after.name}” and changed its colour from ${before.colour} to ${after.colour}`;
  if (renamed) return `renamed the annotation class “${before.name}” to “${after.name}”`;
  if (recoloured) return `changed the colour of the annotation class “${before.name}” from ${before.colour} to ${after.colour}`;
  return null;
}
