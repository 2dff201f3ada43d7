import type { EntityManager } from 'typeorm';
import type { CreateSpecimenBody, Location, LocationBody, Specimen as SpecimenDto, UpdateSpecimenBody } from '../../shared/archive/specimens';
import type { AppContext } from '../app-context';
import { recordActivity } from '../activity/record-activity';
import { AppError } from '../http/app-error';
import { RouteStep } from './route-step.entity';
import { Sample } from './sample.entity';
import { SpecimenLocation } from './specimen-location.entity';
import { Specimen } from './specimen.entity';
import { toLocation, toSpecimenDto } from './specimen.mapper';

const RELATIONS = { sample: true, afterStep: true, locations: true } as const;

/** Specimens cut from samples, and the named locations imaged on them. */
export class SpecimensService {
  constructor(private readonly ctx: AppContext) {}

  private get ds() {
    return this.ctx.dataSource;
  }

  async list(projectId: string, sampleId?: string): Promise<SpecimenDto[]> {
    const specimens = await this.ds.getRepository(Specimen).find({
      where: { projectId, ...(sampleId ? { sampleId } : {}) },
      relations: RELATIONS,
      order: { code: 'ASC' },
    });
    const counts = await this.imageCounts(specimens.map((s) => s.id));
    return specimens.map((s) => toSpecimenDto(s, counts));
  }

  async detail(projectId: string, specimenId: string): Promise<SpecimenDto> {
    const specimen = await this.find(this.ds.manager, projectId, specimenId);
    return toSpecimenDto(specimen, await this.imageCounts([specimenId]));
  }

  async create(actor: Express.User, projectId: string, body: CreateSpecimenBody): Promise<SpecimenDto> {
    const id = await this.ds.transaction(async (m) => {
      const sample = await m.findOneBy(Sample, { id: body.sampleId, projectId });
      if (!sample) throw new AppError(422, 'validation_failed', 'Choose a sample of this project.', [{ field: 'body.sampleId', message: 'Not a sample of this project.' }]);
      await this.checkStep(m, body.sampleId, body.afterStepId);
      await this.refuseTakenCode(m, body.sampleId, body.code);
      const saved = await m.save(m.create(Specimen, { ...body, projectId }));
      await recordActivity(m, { projectId, actorId: actor.id, action: 'catalogue.created', summary: `added the specimen ${body.code} of ${sample.code}` });
      return saved.id;
    });
    return this.detail(projectId, id);
  }

  async update(actor: Express.User, projectId: string, specimenId: string, body: UpdateSpecimenBody): Promise<SpecimenDto> {
    await this.ds.transaction(async (m) => {
      const specimen = await this.find(m, projectId, specimenId);
      if (body.afterStepId !== undefined) await this.checkStep(m, specimen.sampleId, body.afterStepId);
      if (body.code && body.code !== specimen.code) await this.refuseTakenCode(m, specimen.sampleId, body.code);
      await m.update(Specimen, { id: specimenId }, { ...body, updatedAt: new Date() });
      await recordActivity(m, { projectId, actorId: actor.id, action: 'catalogue.updated', summary: `edited the specimen ${body.code ?? specimen.code}` });
    });
    return this.detail(projectId, specimenId);
  }

  async remove(actor: Express.User, projectId: string, specimenId: string): Promise<void> {
    await this.ds.transaction(async (m) => {
      const specimen = await this.find(m, projectId, specimenId);
      const images = (await this.imageCounts([specimenId])).get(`specimen:${specimenId}`) ?? 0;
      if (images > 0) throw AppError.conflict(`This specimen has ${images} image${images > 1 ? 's' : ''}; they must be deleted or moved first.`);
      await m.delete(Specimen, { id: specimenId });
      await recordActivity(m, { projectId, actorId: actor.id, action: 'catalogue.deleted', summary: `deleted the specimen ${specimen.code}` });
    });
  }

  async addLocation(actor: Express.User, projectId: string, specimenId: string, body: LocationBody): Promise<Location> {
    return this.ds.transaction(async (m) => {
      const specimen = await this.find(m, projectId, specimenId);
      await this.refuseTakenLocation(m, specimenId, body.name);
      await recordActivity(m, { projectId, actorId: actor.id, action: 'catalogue.created', summary: `added the location “${body.name}” on ${specimen.code}` });
      return toLocation(await m.save(m.create(SpecimenLocation, { ...body, specimenId })), 0);
    });
  }

  async updateLocation(actor: Express.User, projectId: string, specimenId: string, locationId: string, body: LocationBody): Promise<Location> {
    return this.ds.transaction(async (m) => {
      await this.find(m, projectId, specimenId);
      const location = await this.findLocation(m, specimenId, locationId);
      if (body.name !== location.name) await this.refuseTakenLocation(m, specimenId, body.name);
      const before = location.name;
      const saved = await m.save(Object.assign(location, body));
      await recordActivity(m, { projectId, actorId: actor.id, action: 'catalogue.updated', summary: `edited the location “${before}”` });
      return toLocation(saved, (await this.imageCounts([specimenId])).get(locationId) ?? 0);
    });
  }

  async removeLocation(actor: Express.User, projectId: string, specimenId: string, locationId: string): Promise<void> {
    await this.ds.transaction(async (m) => {
      await this.find(m, projectId, specimenId);
      const location = await this.findLocation(m, specimenId, locationId);
      const images = (await this.imageCounts([specimenId])).get(locationId) ?? 0;
      if (images > 0) throw AppError.conflict(`${images} image${images > 1 ? 's are' : ' is'} filed at ${location.name}; move them first.`);
      await m.delete(SpecimenLocation, { id: locationId });
      await recordActivity(m, { projectId, actorId: actor.id, action: 'catalogue.deleted', summary: `deleted the location “${location.name}”` });
    });
  }

  /** Images per location id and per `specimen:<id>`. */
  private async imageCounts(specimenIds: string[]): Promise<Map<string, number>> {
    const counts = new Map<string, number>();
    if (specimenIds.length === 0) return counts;
    const rows: { specimen_id: string; location_id: string | null; n: number }[] = await this.ds.query(
      'SELECT specimen_id, location_id, count(*)::int AS n FROM images WHERE specimen_id = ANY($1) GROUP BY specimen_id, location_id',
      [specimenIds],
    );
    for (const r of rows) {
      if (r.location_id) counts.set(r.location_id, r.n);
      counts.set(`specimen:${r.specimen_id}`, (counts.get(`specimen:${r.specimen_id}`) ?? 0) + r.n);
    }
    return counts;
  }

  private async find(m: EntityManager, projectId: string, specimenId: string): Promise<Specimen> {
    const specimen = await m.findOne(Specimen, { where: { id: specimenId, projectId }, relations: RELATIONS });
    if (!specimen) throw AppError.notFound('The specimen');
    return specimen;
  }

  private async findLocation(m: EntityManager, specimenId: string, locationId: string): Promise<SpecimenLocation> {
    const location = await m.findOneBy(SpecimenLocation, { id: locationId, specimenId });
    if (!location) throw AppError.notFound('The location');
    return location;
  }

  private async checkStep(m: EntityManager, sampleId: string, stepId: string | null): Promise<void> {
    if (stepId && !(await m.existsBy(RouteStep, { id: stepId, sampleId }))) {
      throw new AppError(422, 'validation_failed', 'Choose a step of this sample’s route.', [{ field: 'body.afterStepId', message: 'Not a step of this sample’s route.' }]);
    }
  }

  private async refuseTakenCode(m: EntityManager, sampleId: string, code: string): Promise<void> {
    if (await m.existsBy(Specimen, { sampleId, code })) {
      throw new AppError(409, 'conflict', `This sample already has a specimen ${code}.`, [{ field: 'body.code', message: 'This code is taken for this sample.' }]);
    }
  }

  private async refuseTakenLocation(m: EntityManager, specimenId: string, name: string): Promise<void> {
    if (await m.existsBy(SpecimenLocation, { specimenId, name })) {
      throw new AppError(409, 'conflict', `This specimen already has a location named ${name}.`, [{ field: 'body.name', message: 'This name is taken on this specimen.' }]);
    }
  }
}
