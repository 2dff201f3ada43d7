import type { Request, RequestHandler } from 'express';
import type { AnnotationBody, AnnotationClassBody, UpdateAnnotationBody } from '../../shared/annotations/annotations';
import type { AppContext } from '../app-context';
import { currentUser } from '../http/require-auth';
import { AnnotationClassesService } from './annotation-classes.service';
import { AnnotationsGeoJsonService } from './annotations-geojson.service';
import { AnnotationsService } from './annotations.service';

const p = (req: Request, name: string) => String(req.params[name]);

/** HTTP in, service call, HTTP out for annotation classes, annotations and their GeoJSON exchange. */
export class AnnotationsController {
  private readonly classes: AnnotationClassesService;
  private readonly annotations: AnnotationsService;
  private readonly geojson: AnnotationsGeoJsonService;

  constructor(ctx: AppContext) {
    this.classes = new AnnotationClassesService(ctx);
    this.annotations = new AnnotationsService(ctx);
    this.geojson = new AnnotationsGeoJsonService(ctx);
  }

  listClasses: RequestHandler = async (req, res) => {
    res.json(await this.classes.list(p(req, 'projectId')));
  };
  createClass: RequestHandler = async (req, res) => {
    res.status(201).json(await this.classes.create(p(req, 'projectId'), req.body as AnnotationClassBody));
  };
  updateClass: RequestHandler = async (req, res) => {
    res.json(await this.classes.update(currentUser(req), p(req, 'projectId'), p(req, 'classId'), req.body as AnnotationClassBody));
  };
  deleteClass: RequestHandler = async (req, res) => {
    await this.classes.remove(currentUser(req), p(req, 'projectId'), p(req, 'classId'), (req.query as { moveTo?: string }).moveTo);
    res.status(204).end();
  };

  list: RequestHandler = async (req, res) => {
    res.json(await this.annotations.list(p(req, 'projectId'), p(req, 'imageId')));
  };
  create: RequestHandler = async (req, res) => {
    res.status(201).json(await this.annotations.create(currentUser(req), p(req, 'projectId'), p(req, 'imageId'), req.body as AnnotationBody));
  };
  update: RequestHandler = async (req, res) => {
    const [projectId, imageId, id] = [p(req, 'projectId'), p(req, 'imageId'), p(req, 'annotationId')];
    res.json(await this.annotations.update(currentUser(req), projectId, imageId, id, req.body as UpdateAnnotationBody));
  };
  remove: RequestHandler = async (req, res) => {
    const { version } = req.query as unknown as { version: number };
    await this.annotations.remove(currentUser(req), p(req, 'projectId'), p(req, 'imageId'), p(req, 'annotationId'), version);
    res.status(204).end();
  };

  exportGeoJson: RequestHandler = async (req, res) => {
    const fc = await this.geojson.export(p(req, 'projectId'), p(req, 'imageId'));
    res.type('application/geo+json').attachment(`annotations-${p(req, 'imageId')}.geojson`).send(JSON.stringify(fc, null, 1));
  };
  importGeoJson: RequestHandler = async (req, res) => {
    res.status(201).json(await this.geojson.import(currentUser(req), p(req, 'projectId'), p(req, 'imageId'), req.body));
  };
}
