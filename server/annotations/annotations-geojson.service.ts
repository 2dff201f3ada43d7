import { fromFeatureCollection, toFeature, type FeatureCollection } from '../../shared/annotations/geojson';
import type { FieldProblem } from '../../shared/api-error';
import type { AppContext } from '../app-context';
import { recordActivity } from '../activity/record-activity';
import { AppError } from '../http/app-error';
import { returnToDraftIfCleared } from '../reviews/return-to-draft';
import { AnnotationClass } from './annotation-class.entity';
import { Annotation } from './annotation.entity';
import { toAnnotationDto } from './annotation.mapper';
import { AnnotationsService } from './annotations.service';

/** GeoJSON export and all-or-nothing import of an image's annotations. */
export class AnnotationsGeoJsonService {
  private readonly annotations: AnnotationsService;

  constructor(private readonly ctx: AppContext) {
    this.annotations = new AnnotationsService(ctx);
  }

  async export(projectId: string, imageId: string): Promise<FeatureCollection> {
    const m = this.ctx.dataSource.manager;
    const image = await this.annotations.image(m, projectId, imageId);
    const classes = new Map((await m.findBy(AnnotationClass, { projectId })).map((c) => [c.id, c.name]));
    const rows = await m.find(Annotation, { where: { imageId }, relations: { author: true }, order: { seq: 'ASC' } });
    return {
      type: 'FeatureCollection',
      'etchfile:coordinates': 'image-pixels',
      'etchfile:image': { id: image.id, width: image.width, height: image.height, pixelSizeUm: image.pixelSizeUm },
      features: rows.map((a) => toFeature(toAnnotationDto(a), classes.get(a.classId) ?? '')),
    };
  }

  /** Every feature is checked first; one bad feature stores none, and each problem names its feature. */
  async import(user: Express.User, projectId: string, imageId: string, body: unknown): Promise<{ imported: number }> {
    return this.ctx.dataSource.transaction(async (m) => {
      const image = await this.annotations.image(m, projectId, imageId);
      const { shapes, problems } = fromFeatureCollection(body);
      const details: FieldProblem[] = problems.map((message) => ({ field: 'body.features', message }));
      const classes = new Map((await m.findBy(AnnotationClass, { projectId })).map((c) => [c.name.toLowerCase(), c]));
      const rows: Partial<Annotation>[] = [];
      for (const [i, shape] of shapes.entries()) {
        const cls = classes.get(shape.className.toLowerCase());
        if (!cls) {
          details.push({ field: `body.features.${i}.properties.class`, message: `Feature ${i + 1}: no annotation class “${shape.className}” in this project.` });
          continue;
        }
        try {
          await this.annotations.check(m, projectId, image, { classId: cls.id, kind: shape.kind, points: shape.points, label: shape.label });
          rows.push({ projectId, imageId, classId: cls.id, kind: shape.kind, points: shape.points, label: shape.label, authorId: user.id, updatedBy: user.id });
        } catch (err) {
          // Collects this feature's shape problem so the answer lists all of them at once.
          if (!(err instanceof AppError)) throw err;
          details.push({ field: `body.features.${i}`, message: `Feature ${i + 1}: ${err.message}` });
        }
      }
      if (details.length > 0) throw new AppError(422, 'validation_failed', `Nothing was imported: ${details[0]!.message}${details.length > 1 ? ` (and ${details.length - 1} more)` : ''}`, details);
      if (rows.length > 0) await m.insert(Annotation, rows);
      await recordActivity(m, { projectId, imageId, actorId: user.id, action: 'annotations.imported', summary: `imported ${rows.length} shape${rows.length === 1 ? '' : 's'} from GeoJSON` });
      if (rows.length > 0) await returnToDraftIfCleared(m, imageId, user.id, 'the annotations');
      return { imported: rows.length };
    });
  }
}
