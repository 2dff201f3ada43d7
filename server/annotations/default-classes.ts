import type { EntityManager } from 'typeorm';
import { DEFAULT_ANNOTATION_CLASSES } from '../../shared/annotations/annotations';
import { AnnotationClass } from './annotation-class.entity';

/** Gives a new project the trade's usual annotation classes; its lead may change them later. */
export async function addDefaultAnnotationClasses(m: EntityManager, projectId: string): Promise<void> {
  await m.insert(
    AnnotationClass,
    DEFAULT_ANNOTATION_CLASSES.map((c, position) => ({ ...c, projectId, position })),
  );
}
