import express, { Router } from 'express';
import { z } from 'zod';
import { annotationBody, annotationClassBody, updateAnnotationBody } from '../../shared/annotations/annotations';
import { projectIdParams } from '../../shared/projects';
import type { ProjectAction } from '../../shared/roles';
import type { AppContext } from '../app-context';
import { AppError } from '../http/app-error';
import { requireSignedIn } from '../http/require-auth';
import { validate } from '../http/validate';
import { requireProjectAction } from '../projects/project-access';
import { AnnotationsController } from './annotations.controller';

const uuid = (what: string) => z.uuid({ error: `Not a valid ${what} id.` });
const classParams = z.strictObject({ projectId: uuid('project'), classId: uuid('class') });
const imageParams = z.strictObject({ projectId: uuid('project'), imageId: uuid('image') });
const annotationParams = imageParams.extend({ annotationId: uuid('annotation') });
const deleteClassQuery = z.strictObject({ moveTo: uuid('class').optional() });
const versionQuery = z.strictObject({ version: z.coerce.number().int().min(1, { error: 'Send the version you loaded.' }) });

// GeoJSON files are larger than ordinary requests: their own media type gets their own limit.
const geoJsonBody = express.json({ type: ['application/geo+json'], limit: '20mb' });

/** Mounted at /api/projects/:projectId. Classes are the lead's; shapes are drawn by those who may annotate. */
export function annotationsRouter(ctx: AppContext): Router {
  const c = new AnnotationsController(ctx);
  const may = (action: ProjectAction) => requireProjectAction(ctx.dataSource, action);
  const router = Router({ mergeParams: true });
  router.use(requireSignedIn);

  router.get('/annotation-classes', validate({ params: projectIdParams }), may('read'), c.listClasses);
  router.post('/annotation-classes', validate({ params: projectIdParams }), may('editProject'), validate({ body: annotationClassBody }), c.createClass);
  router.put('/annotation-classes/:classId', validate({ params: classParams }), may('editProject'), validate({ body: annotationClassBody }), c.updateClass);
  router.delete('/annotation-classes/:classId', validate({ params: classParams, query: deleteClassQuery }), may('editProject'), c.deleteClass);

  const shapes = '/images/:imageId/annotations';
  router.get(shapes, validate({ params: imageParams }), may('read'), c.list);
  router.post(shapes, validate({ params: imageParams }), may('annotate'), validate({ body: annotationBody }), c.create);
  router.patch(`${shapes}/:annotationId`, validate({ params: annotationParams }), may('annotate'), validate({ body: updateAnnotationBody }), c.update);
  router.delete(`${shapes}/:annotationId`, validate({ params: annotationParams, query: versionQuery }), may('annotate'), c.remove);
  router.get(`${shapes}.geojson`, validate({ params: imageParams }), may('read'), c.exportGeoJson);
  router.post(`${shapes}.geojson`, validate({ params: imageParams }), may('annotate'), geoJsonBody, (req, _res, next) => {
    if (!req.is('application/geo+json')) throw new AppError(400, 'malformed_json', 'Send the file as application/geo+json.');
    next();
  }, c.importGeoJson);
  return router;
}
