import type { EntityManager } from 'typeorm';
import type { CreateMaterialBody, Material as MaterialDto, UpdateMaterialBody } from '../../shared/archive/materials';
import type { AppContext } from '../app-context';
import { recordActivity } from '../activity/record-activity';
import { AppError } from '../http/app-error';
import { Material } from './material.entity';
import { toMaterialDto } from './material.mapper';

/** A project's alloys. A material used in a sample's stack stays until the sample no longer uses it. */
export class MaterialsService {
  constructor(private readonly ctx: AppContext) {}

  async list(projectId: string): Promise<MaterialDto[]> {
    const { entities, raw } = await this.ctx.dataSource
      .getRepository(Material)
      .createQueryBuilder('m')
      .addSelect('(SELECT count(DISTINCT sl.sample_id) FROM sample_layers sl WHERE sl.material_id = m.id)::int', 'used')
      .where('m.project_id = :projectId', { projectId })
      .orderBy('m.designation', 'ASC')
      .getRawAndEntities();
    return entities.map((m, i) => toMaterialDto(m, Number(raw[i].used)));
  }

  async create(actor: Express.User, projectId: string, body: CreateMaterialBody): Promise<MaterialDto> {
    return this.ctx.dataSource.transaction(async (m) => {
      await this.refuseTakenDesignation(m, projectId, body.designation);
      const saved = await m.save(m.create(Material, { ...body, projectId }));
      await recordActivity(m, { projectId, actorId: actor.id, action: 'catalogue.created', summary: `added the material ${saved.designation}` });
      return toMaterialDto(saved, 0);
    });
  }

  async update(actor: Express.User, projectId: string, materialId: string, body: UpdateMaterialBody): Promise<MaterialDto> {
    return this.ctx.dataSource.transaction(async (m) => {
      const material = await this.find(m, projectId, materialId);
      if (body.designation && body.designation !== material.designation) await this.refuseTakenDesignation(m, projectId, body.designation);
      Object.assign(material, body);
      const saved = await m.save(material);
      await recordActivity(m, { projectId, actorId: actor.id, action: 'catalogue.updated', summary: `edited the material ${saved.designation}` });
      return toMaterialDto(saved, await this.usage(m, materialId));
    });
  }

  async remove(actor: Express.User, projectId: string, materialId: string): Promise<void> {
    await this.ctx.dataSource.transaction(async (m) => {
      const material = await this.find(m, projectId, materialId);
      const used = await this.usage(m, materialId);
      if (used > 0) {
        throw AppError.conflict(`${material.designation} is part of the stack of ${used} sample${used > 1 ? 's' : ''}; change those stacks first.`);
      }
      await m.delete(Material, { id: materialId });
      await recordActivity(m, { projectId, actorId: actor.id, action: 'catalogue.deleted', summary: `deleted the material ${material.designation}` });
    });
  }

  private async find(m: EntityManager, projectId: string, materialId: string): Promise<Material> {
    const material = await m.findOneBy(Material, { id: materialId, projectId });
    if (!material) throw AppError.notFound('The material');
    return material;
  }

  private async usage(m: EntityManager, materialId: string): Promise<number> {
    const rows: { n: number }[] = await m.query('SELECT count(DISTINCT sample_id)::int AS n FROM sample_layers WHERE material_id = $1', [materialId]);
    return rows[0]!.n;
  }

  private async refuseTakenDesignation(m: EntityManager, projectId: string, designation: string): Promise<void> {
    if (await m.existsBy(Material, { projectId, designation })) {
      throw new AppError(409, 'conflict', `This project already has a material ${designation}.`, [
        { field: 'body.designation', message: 'This designation is taken in this project.' },
      ]);
    }
  }
}
