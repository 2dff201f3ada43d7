import type { Request, RequestHandler } from 'express';
import type { CreateMaterialBody, UpdateMaterialBody } from '../../shared/archive/materials';
import type { CreateSampleBody, UpdateSampleBody } from '../../shared/archive/samples';
import type { CreateSpecimenBody, LocationBody, UpdateSpecimenBody } from '../../shared/archive/specimens';
import type { AppContext } from '../app-context';
import { currentUser } from '../http/require-auth';
import { MaterialsService } from './materials.service';
import { SamplesService } from './samples.service';
import { SpecimensService } from './specimens.service';

const param = (req: Request, name: string) => String(req.params[name]);

/** HTTP in, service call, HTTP out for materials, samples, specimens and locations. */
export class ArchiveController {
  private readonly materials: MaterialsService;
  private readonly samples: SamplesService;
  private readonly specimens: SpecimensService;

  constructor(ctx: AppContext) {
    this.materials = new MaterialsService(ctx);
    this.samples = new SamplesService(ctx);
    this.specimens = new SpecimensService(ctx);
  }

  listMaterials: RequestHandler = async (req, res) => {
    res.json(await this.materials.list(param(req, 'projectId')));
  };
  createMaterial: RequestHandler = async (req, res) => {
    res.status(201).json(await this.materials.create(currentUser(req), param(req, 'projectId'), req.body as CreateMaterialBody));
  };
  updateMaterial: RequestHandler = async (req, res) => {
    res.json(await this.materials.update(currentUser(req), param(req, 'projectId'), param(req, 'materialId'), req.body as UpdateMaterialBody));
  };
  deleteMaterial: RequestHandler = async (req, res) => {
    await this.materials.remove(currentUser(req), param(req, 'projectId'), param(req, 'materialId'));
    res.status(204).end();
  };

  listSamples: RequestHandler = async (req, res) => {
    res.json(await this.samples.list(param(req, 'projectId')));
  };
  getSample: RequestHandler = async (req, res) => {
    res.json(await this.samples.detail(param(req, 'projectId'), param(req, 'sampleId')));
  };
  createSample: RequestHandler = async (req, res) => {
    res.status(201).json(await this.samples.create(currentUser(req), param(req, 'projectId'), req.body as CreateSampleBody));
  };
  updateSample: RequestHandler = async (req, res) => {
    res.json(await this.samples.update(currentUser(req), param(req, 'projectId'), param(req, 'sampleId'), req.body as UpdateSampleBody));
  };
  deleteSample: RequestHandler = async (req, res) => {
    await this.samples.remove(currentUser(req), param(req, 'projectId'), param(req, 'sampleId'));
    res.status(204).end();
  };

  listSpecimens: RequestHandler = async (req, res) => {
    const { sampleId } = req.query as { sampleId?: string };
    res.json(await this.specimens.list(param(req, 'projectId'), sampleId));
  };
  getSpecimen: RequestHandler = async (req, res) => {
    res.json(await this.specimens.detail(param(req, 'projectId'), param(req, 'specimenId')));
  };
  createSpecimen: RequestHandler = async (req, res) => {
    res.status(201).json(await this.specimens.create(currentUser(req), param(req, 'projectId'), req.body as CreateSpecimenBody));
  };
  updateSpecimen: RequestHandler = async (req, res) => {
    res.json(await this.specimens.update(currentUser(req), param(req, 'projectId'), param(req, 'specimenId'), req.body as UpdateSpecimenBody));
  };
  deleteSpecimen: RequestHandler = async (req, res) => {
    await this.specimens.remove(currentUser(req), param(req, 'projectId'), param(req, 'specimenId'));
    res.status(204).end();
  };

  addLocation: RequestHandler = async (req, res) => {
    res.status(201).json(await this.specimens.addLocation(currentUser(req), param(req, 'projectId'), param(req, 'specimenId'), req.body as LocationBody));
  };
  updateLocation: RequestHandler = async (req, res) => {
    const [p, s, l] = ['projectId', 'specimenId', 'locationId'].map((n) => param(req, n)) as [string, string, string];
    res.json(await this.specimens.updateLocation(currentUser(req), p, s, l, req.body as LocationBody));
  };
  deleteLocation: RequestHandler = async (req, res) => {
    const [p, s, l] = ['projectId', 'specimenId', 'locationId'].map((n) => param(req, n)) as [string, string, string];
    await this.specimens.removeLocation(currentUser(req), p, s, l);
    res.status(204).end();
  };
}
