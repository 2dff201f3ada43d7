import type { EntityManager } from 'typeorm';
import { Measurement } from '../measurements/measurement.entity';

/** Measurements on the given images (or the whole project), with image, specimen and author, oldest first. */
export function measurementsWithContext(m: EntityManager, projectId: string, imageIds?: readonly string[]): Promise<Measurement[]> {
  const qb = m
    .getRepository(Measurement)
    .createQueryBuilder('m')
    .innerJoinAndSelect('m.image', 'i')
    .innerJoinAndSelect('i.specimen', 's')
    .innerJoinAndSelect('m.author', 'a')
    .where('m.project_id = :projectId', { projectId });
  if (imageIds) qb.andWhere('m.image_id IN (:...imageIds)', { imageIds: imageIds.length ? imageIds : ['00000000-0000-0000-0000-000000000000'] });
  return qb.orderBy('i.uploaded_at', 'ASC').addOrderBy('m.created_at', 'ASC').getMany();
}
