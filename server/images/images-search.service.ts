import type { ImageSortField, ImageSummary, SearchImagesQuery } from '../../shared/images';
import type { Page } from '../../shared/paging';
import type { AppContext } from '../app-context';
import { Image } from './image.entity';
import { toImageSummary } from './image.mapper';

const SORT_COLUMNS: Record<ImageSortField, string> = {
  uploadedAt: 'image.uploadedAt',
  acquiredAt: 'image.acquiredAt',
  originalName: 'image.originalName',
  magnification: 'image.magnification',
  pixelSizeUm: 'image.pixelSizeUm',
  specimen: 'specimen.code',
};

/** The project-wide image search: every filter in SQL, sorted and paged by the database. */
export class ImagesSearchService {
  constructor(private readonly ctx: AppContext) {}

  async search(projectId: string, q: SearchImagesQuery): Promise<Page<ImageSummary>> {
    const qb = this.ctx.dataSource
      .getRepository(Image)
      .createQueryBuilder('image')
      .innerJoinAndSelect('image.specimen', 'specimen')
      .innerJoinAndSelect('specimen.sample', 'sample')
      .leftJoinAndSelect('image.location', 'location')
      .innerJoinAndSelect('image.uploader', 'uploader')
      .where('image.projectId = :projectId', { projectId });

    if (q.sampleId) qb.andWhere('specimen.sampleId = :sampleId', { sampleId: q.sampleId });
    if (q.materialId) {
      qb.andWhere('EXISTS (SELECT 1 FROM sample_layers sl WHERE sl.sample_id = specimen.sample_id AND sl.material_id = :materialId)', { materialId: q.materialId });
    }
    if (q.stepId) qb.andWhere('specimen.afterStepId = :stepId', { stepId: q.stepId });
    if (q.specimenId) qb.andWhere('image.specimenId = :specimenId', { specimenId: q.specimenId });
    if (q.locationId) qb.andWhere('image.locationId = :locationId', { locationId: q.locationId });
    if (q.modality?.length) qb.andWhere('image.modality IN (:...modalities)', { modalities: q.modality });
    if (q.magnificationMin !== undefined) qb.andWhere('image.magnification >= :magMin', { magMin: q.magnificationMin });
    if (q.magnificationMax !== undefined) qb.andWhere('image.magnification <= :magMax', { magMax: q.magnificationMax });
    if (q.pixelSizeMinUm !== undefined) qb.andWhere('image.pixelSizeUm >= :pxMin', { pxMin: q.pixelSizeMinUm });
    if (q.pixelSizeMaxUm !== undefined) qb.andWhere('image.pixelSizeUm <= :pxMax', { pxMax: q.pixelSizeMaxUm });
    if (q.tags?.length) qb.andWhere('image.tags @> :tags::text[]', { tags: q.tags });
    // Dates are calendar days in UTC, both ends included.
    if (q.acquiredFrom) qb.andWhere(`image.acquiredAt >= (:from::date)::timestamp AT TIME ZONE 'UTC'`, { from: q.acquiredFrom });
    if (q.acquiredTo) qb.andWhere(`image.acquiredAt < (:to::date + 1)::timestamp AT TIME ZONE 'UTC'`, { to: q.acquiredTo });
    if (q.uploaderId) qb.andWhere('image.uploaderId = :uploaderId', { uploaderId: q.uploaderId });
    if (q.state?.length) qb.andWhere('image.state IN (:...states)', { states: q.state });
    if (q.q) {
      // The same expression as the trigram index; LIKE wildcards in the words match literally.
      qb.andWhere(`(image.notes || ' ' || image.originalName) ILIKE :text ESCAPE '\\'`, { text: `%${q.q.replace(/[\\%_]/g, (c) => `\\${c}`)}%` });
    }

    const direction = q.dir === 'asc' ? 'ASC' : 'DESC';
    qb.orderBy(SORT_COLUMNS[q.sort], direction, 'NULLS LAST').addOrderBy('image.id', 'ASC');
    const [rows, total] = await qb.skip(q.page * q.pageSize).take(q.pageSize).getManyAndCount();
    return { items: rows.map(toImageSummary), total, page: q.page, pageSize: q.pageSize };
  }
}
