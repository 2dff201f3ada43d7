import { In, type EntityManager } from 'typeorm';
import type { CreateSampleBody, SampleDetail, SampleSummary, UpdateSampleBody } from '../../shared/archive/samples';
import type { AppContext } from '../app-context';
import { recordActivity } from '../activity/record-activity';
import { AppError } from '../http/app-error';
import { Material } from './material.entity';
import { RouteStep } from './route-step.entity';
import { SampleLayer } from './sample-layer.entity';
import { Sample } from './sample.entity';
import { Specimen } from './specimen.entity';
import { stepLabel, toSampleDetail, toSampleSummary } from './sample.mapper';

/** Samples with their stack and route. Specimens keep the steps they were cut after. */
export class SamplesService {
  constructor(private readonly ctx: AppContext) {}

  async list(projectId: string): Promise<SampleSummary[]> {
    const rows: { id: string; stack: string[] | null; steps: number; specimens: number }[] = await this.ctx.dataSource.query(
      `SELECT s.id,
              (SELECT array_agg(m.designation ORDER BY l.position) FROM sample_layers l JOIN materials m ON m.id = l.material_id WHERE l.sample_id = s.id) AS stack,
              (SELECT count(*) FROM route_steps r WHERE r.sample_id = s.id)::int AS steps,
              (SELECT count(*) FROM specimens p WHERE p.sample_id = s.id)::int AS specimens
         FROM samples s WHERE s.project_id = $1`,
      [projectId],
    );
    const byId = new Map(rows.map((r) => [r.id, r]));
    const samples = await this.ctx.dataSource.getRepository(Sample).find({ where: { projectId }, order: { code: 'ASC' } });
    return samples.map((s) => {
      const r = byId.get(s.id)!;
      return toSampleSummary(s, r.stack ?? [], r.steps, r.specimens);
    });
  }

  async detail(projectId: string, sampleId: string): Promise<SampleDetail> {
    return this.detailWith(this.ctx.dataSource.manager, projectId, sampleId);
  }

  async create(actor: Express.User, projectId: string, body: CreateSampleBody): Promise<SampleDetail> {
    return this.ctx.dataSource.transaction(async (m) => {
      await this.refuseTakenCode(m, projectId, body.code);
      await this.checkMaterials(m, projectId, body.layers);
      const sample = await m.save(m.create(Sample, { projectId, code: body.code, name: body.name, description: body.description }));
      await this.writeLayers(m, sample.id, body.layers);
      await this.writeRoute(m, sample.id, body.route);
      await recordActivity(m, { projectId, actorId: actor.id, action: 'catalogue.created', summary: `added the sample ${body.code}` });
      return this.detailWith(m, projectId, sample.id);
    });
  }

  async update(actor: Express.User, projectId: string, sampleId: string, body: UpdateSampleBody): Promise<SampleDetail> {
    return this.ctx.dataSource.transaction(async (m) => {
      const sample = await this.find(m, projectId, sampleId);
      if (body.code && body.code !== sample.code) await this.refuseTakenCode(m, projectId, body.code);
      if (body.layers) {
        await this.checkMaterials(m, projectId, body.layers);
        await this.writeLayers(m, sampleId, body.layers);
      }
      if (body.route) await this.writeRoute(m, sampleId, body.route);
      const { layers: _l, route: _r, ...fields } = body;
      // Touch updated_at even when only the stack or route changed.
      await m.update(Sample, { id: sampleId }, { ...fields, updatedAt: new Date() });
      await recordActivity(m, { projectId, actorId: actor.id, action: 'catalogue.updated', summary: `edited the sample ${body.code ?? sample.code} (${Object.keys(body).join(', ')})` });
      return this.detailWith(m, projectId, sampleId);
    });
  }

  async remove(actor: Express.User, projectId: string, sampleId: string): Promise<void> {
    await this.ctx.dataSource.transaction(async (m) => {
      const sample = await this.find(m, projectId, sampleId);
      const specimens = await m.countBy(Specimen, { sampleId });
      if (specimens > 0) throw AppError.conflict(`${sample.code} has ${specimens} specimen${specimens > 1 ? 's' : ''}; delete or move them first.`);
      await m.delete(Sample, { id: sampleId });
      await recordActivity(m, { projectId, actorId: actor.id, action: 'catalogue.deleted', summary: `deleted the sample ${sample.code}` });
    });
  }

  private async detailWith(m: EntityManager, projectId: string, sampleId: string): Promise<SampleDetail> {
    const sample = await this.find(m, projectId, sampleId);
    const layers = await m.find(SampleLayer, { where: { sampleId }, relations: { material: true }, order: { position: 'ASC' } });
    const steps = await m.find(RouteStep, { where: { sampleId }, order: { position: 'ASC' } });
    return toSampleDetail(sample, layers, steps, await m.countBy(Specimen, { sampleId }));
  }

  private async find(m: EntityManager, projectId: string, sampleId: string): Promise<Sample> {
    const sample = await m.findOneBy(Sample, { id: sampleId, projectId });
    if (!sample) throw AppError.notFound('The sample');
    return sample;
  }

  private async refuseTakenCode(m: EntityManager, projectId: string, code: string): Promise<void> {
    if (await m.existsBy(Sample, { projectId, code })) {
      throw new AppError(409, 'conflict', `This project already has a sample ${code}.`, [{ field: 'body.code', message: 'This code is taken in this project.' }]);
    }
  }

  private async checkMaterials(m: EntityManager, projectId: string, layers: CreateSampleBody['layers']): Promise<void> {
    const ids = [...new Set(layers.map((l) => l.materialId))];
    const found = new Set((await m.findBy(Material, { id: In(ids), projectId })).map((x) => x.id));
    const problems = layers.flatMap((l, i) =>
      found.has(l.materialId) ? [] : [{ field: `body.layers.${i}.materialId`, message: 'This material is not one of this project’s materials.' }],
    );
    if (problems.length > 0) throw new AppError(422, 'validation_failed', `Check body.layers: ${problems[0]!.message}`, problems);
  }

  private async writeLayers(m: EntityManager, sampleId: string, layers: CreateSampleBody['layers']): Promise<void> {
    await m.delete(SampleLayer, { sampleId });
    await m.insert(SampleLayer, layers.map((l, position) => ({ sampleId, position, materialId: l.materialId, thicknessMm: l.thicknessMm })));
  }

  /** Replaces the route, keeping the ids of steps sent back; a step a specimen was cut after cannot go. */
  private async writeRoute(m: EntityManager, sampleId: string, route: CreateSampleBody['route']): Promise<void> {
    const existing = await m.find(RouteStep, { where: { sampleId }, order: { position: 'ASC' } });
    const known = new Map(existing.map((s) => [s.id, s]));
    const strangers = route.flatMap((s, i) => (s.id && !known.has(s.id) ? [{ field: `body.route.${i}.id`, message: 'This step is not part of this sample’s route.' }] : []));
    if (strangers.length > 0) throw new AppError(422, 'validation_failed', `Check body.route: ${strangers[0]!.message}`, strangers);

    const kept = new Set(route.flatMap((s) => (s.id ? [s.id] : [])));
    const dropped = existing.filter((s) => !kept.has(s.id));
    if (dropped.length > 0) {
      const used = await m.find(Specimen, { where: { afterStepId: In(dropped.map((s) => s.id)) } });
      if (used.length > 0) {
        const step = known.get(used[0]!.afterStepId!)!;
        throw AppError.conflict(`Specimen ${used[0]!.code} was cut ${stepLabel(step)}; that step cannot be removed while specimens refer to it.`);
      }
      await m.delete(RouteStep, { id: In(dropped.map((s) => s.id)) });
    }
    for (const [position, step] of route.entries()) {
      const fields = { sampleId, position, type: step.type, date: step.date, params: step.params, notes: step.notes };
      if (step.id) await m.update(RouteStep, { id: step.id }, fields);
      else await m.insert(RouteStep, fields);
    }
  }
}
