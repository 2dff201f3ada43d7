import { Router } from 'express';
import {
  deleteMeasurementQuery,
  imageMeasurementsParams,
  measurementBody,
  measurementParams,
  recomputeBody,
  specimenMeasurementsParams,
  suggestBody,
  updateMeasurementBody,
} from '../../shared/measurements/measurements';
import type { ProjectAction } from '../../shared/roles';
import type { AppContext } from '../app-context';
import { requireSignedIn } from '../http/require-auth';
import { validate } from '../http/validate';
import { requireProjectAction } from '../projects/project-access';
import { MeasurementsController } from './measurements.controller';

/**
 * Mounted at /api/projects/:projectId, before the images router (whose '/:imageId' routes would
 * otherwise see these first). Each line: params checked, then the role, then the body.
 */
export function measurementsRouter(ctx: AppContext): Router {
  const c = new MeasurementsController(ctx);
  const may = (action: ProjectAction) => requireProjectAction(ctx.dataSource, action);
  const router = Router({ mergeParams: true });
  router.use(requireSignedIn);

  const onImage = '/images/:imageId/measurements';
  const one = `${onImage}/:measurementId`;
  router.get(onImage, validate({ params: imageMeasurementsParams }), may('read'), c.list);
  router.post(onImage, validate({ params: imageMeasurementsParams }), may('measure'), validate({ body: measurementBody }), c.create);
  // Before '/:measurementId', so "suggest" is never read as an id.
  router.post(`${onImage}/suggest`, validate({ params: imageMeasurementsParams }), may('measure'), validate({ body: suggestBody }), c.suggest);
  router.get(one, validate({ params: measurementParams }), may('read'), c.detail);
  router.patch(one, validate({ params: measurementParams }), may('measure'), validate({ body: updateMeasurementBody }), c.update);
  router.delete(one, validate({ params: measurementParams, query: deleteMeasurementQuery }), may('measure'), c.remove);
  router.post(`${one}/recompute`, validate({ params: measurementParams }), may('measure'), validate({ body: recomputeBody }), c.recompute);

  const onSpecimen = '/specimens/:specimenId';
  router.get(`${onSpecimen}/measurements/summary`, validate({ params: specimenMeasurementsParams }), may('read'), c.summary);
  router.get(`${onSpecimen}/measurements/summary.csv`, validate({ params: specimenMeasurementsParams }), may('read'), c.summaryCsv);
  router.get(`${onSpecimen}/measurements.csv`, validate({ params: specimenMeasurementsParams }), may('read'), c.fieldsCsv);
  return router;
}
