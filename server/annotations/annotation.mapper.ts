import type { Annotation as AnnotationDto, AnnotationClass as AnnotationClassDto } from '../../shared/annotations/annotations';
import type { AnnotationClass } from './annotation-class.entity';
import type { Annotation } from './annotation.entity';

export function toAnnotationClassDto(c: AnnotationClass, usage: number): AnnotationClassDto {
  return { id: c.id, projectId: c.projectId, name: c.name, colour: c.colour, shapeKind: c.shapeKind, usage };
}

/** Expects `author` loaded. */
export function toAnnotationDto(a: Annotation): AnnotationDto {
  return {
    id: a.id,
    imageId: a.imageId,
    classId: a.classId,
    kind: a.kind,
    points: a.points,
    label: a.label,
    authorId: a.authorId,
    authorName: a.author.displayName,
    createdAt: a.createdAt.toISOString(),
    updatedAt: a.updatedAt.toISOString(),
    version: a.version,
  };
}
