import { Router } from 'express';
import { z } from 'zod';
import { createMaterialBody, materialParams, updateMaterialBody } from '../../shared/archive/materials';
import { createSampleBody, sampleParams, updateSampleBody } from '../../shared/archive/samples';
import { createSpecimenBody, locationBody, locationParams, specimenParams, updateSpecimenBody } from '../../shared/archive/specimens';
import { projectIdParams } from '../../shared/projects';
import type { ProjectAction } from '../../shared/roles';
import type { AppContext } from '../app-context';
import { requireSignedIn } from '../http/require-auth';
import { validate } from '../http/validate';
import { requireProjectAction } from '../projects/project-access';
import { ArchiveController } from './archive.controller';

const listSpecimensQuery = z.strictObject({ sampleId: z.uuid({ error: 'Not a valid sample id.' }).optional() });

/** Mounted at /api/projects/:projectId; each line: params checked, then the role, then the body. */
export function archiveRouter(ctx: AppContext): Router {
  const c = new ArchiveController(ctx);
  const may = (action: ProjectAction) => requireProjectAction(ctx.dataSource, action);
  const router = Router({ mergeParams: true });
  router.use(requireSignedIn);

  router.get('/materials', validate({ params: projectIdParams }), may('read'), c.listMaterials);
  router.post('/materials', validate({ params: projectIdParams }), may('editMetadata'), validate({ body: createMaterialBody }), c.createMaterial);
  router.patch('/materials/:materialId', validate({ params: materialParams }), may('editMetadata'), validate({ body: updateMaterialBody }), c.updateMaterial);
  router.delete('/materials/:materialId', validate({ params: materialParams }), may('delete'), c.deleteMaterial);

  router.get('/samples', validate({ params: projectIdParams }), may('read'), c.listSamples);
  router.get('/samples/:sampleId', validate({ params: sampleParams }), may('read'), c.getSample);
  router.post('/samples', validate({ params: projectIdParams }), may('editMetadata'), validate({ body: createSampleBody }), c.createSample);
  router.patch('/samples/:sampleId', validate({ params: sampleParams }), may('editMetadata'), validate({ body: updateSampleBody }), c.updateSample);
  router.delete('/samples/:sampleId', validate({ params: sampleParams }), may('delete'), c.deleteSample);

  router.get('/specimens', validate({ params: projectIdParams, query: listSpecimensQuery }), may('read'), c.listSpecimens);
  router.get('/specimens/:specimenId', validate({ params: specimenParams }), may('read'), c.getSpecimen);
  router.post('/specimens', validate({ params: projectIdParams }), may('editMetadata'), validate({ body: createSpecimenBody }), c.createSpecimen);
  router.patch('/specimens/:specimenId', validate({ params: specimenParams }), may('editMetadata'), validate({ body: updateSpecimenBody }), c.updateSpecimen);
  router.delete('/specimens/:specimenId', validate({ params: specimenParams }), may('delete'), c.deleteSpecimen);

  router.post('/specimens/:specimenId/locations', validate({ params: specimenParams }), may('editMetadata'), validate({ body: locationBody }), c.addLocation);
  router.put('/specimens/:specimenId/locations/:locationId', validate({ params: locationParams }), may('editMetadata'), validate({ body: locationBody }), c.updateLocation);
  router.delete('/specimens/:specimenId/locations/:locationId', validate({ params: locationParams }), may('delete'), c.deleteLocation);
  return router;
}
