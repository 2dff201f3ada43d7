import { Router, type Request, type RequestHandler } from 'express';
import { z } from 'zod';
import { applyPresetBody, calibrationPresetBody, drawnCalibrationBody, type ApplyPresetBody, type CalibrationPresetBody, type DrawnCalibrationBody } from '../../shared/calibration';
import { projectIdParams } from '../../shared/projects';
import type { ProjectAction } from '../../shared/roles';
import type { AppContext } from '../app-context';
import { currentUser, requireSignedIn } from '../http/require-auth';
import { validate } from '../http/validate';
import { requireProjectAction } from '../projects/project-access';
import { CalibrationService } from './calibration.service';

const imageParams = z.strictObject({ projectId: z.uuid({ error: 'Not a valid project id.' }), imageId: z.uuid({ error: 'Not a valid image id.' }) });
const presetParams = z.strictObject({ projectId: z.uuid({ error: 'Not a valid project id.' }), presetId: z.uuid({ error: 'Not a valid preset id.' }) });
const p = (req: Request, name: string) => String(req.params[name]);

/** Mounted at /api/projects/:projectId. A pixel size is metadata: those who edit metadata may set it. */
export function calibrationRouter(ctx: AppContext): Router {
  const s = new CalibrationService(ctx);
  const may = (action: ProjectAction) => requireProjectAction(ctx.dataSource, action);
  const handle = (fn: (req: Request) => Promise<unknown>, status = 200): RequestHandler => async (req, res) => {
    const result = await fn(req);
    if (result === undefined) res.status(204).end();
    else res.status(status).json(result);
  };
  const router = Router({ mergeParams: true });
  router.use(requireSignedIn);

  router.post('/images/:imageId/calibration/drawn', validate({ params: imageParams }), may('editMetadata'), validate({ body: drawnCalibrationBody }),
    handle((req) => s.drawn(currentUser(req), p(req, 'projectId'), p(req, 'imageId'), req.body as DrawnCalibrationBody)));
  router.get('/images/:imageId/calibration/history', validate({ params: imageParams }), may('read'), handle((req) => s.history(p(req, 'projectId'), p(req, 'imageId'))));

  router.get('/calibration-presets', validate({ params: projectIdParams }), may('read'), handle((req) => s.presets(p(req, 'projectId'))));
  router.post('/calibration-presets', validate({ params: projectIdParams }), may('editMetadata'), validate({ body: calibrationPresetBody }),
    handle((req) => s.createPreset(p(req, 'projectId'), req.body as CalibrationPresetBody), 201));
  router.put('/calibration-presets/:presetId', validate({ params: presetParams }), may('editMetadata'), validate({ body: calibrationPresetBody }),
    handle((req) => s.updatePreset(p(req, 'projectId'), p(req, 'presetId'), req.body as CalibrationPresetBody)));
  router.delete('/calibration-presets/:presetId', validate({ params: presetParams }), may('delete'), handle((req) => s.removePreset(p(req, 'projectId'), p(req, 'presetId'))));
  router.post('/calibration-presets/:presetId/apply', validate({ params: presetParams }), may('editMetadata'), validate({ body: applyPresetBody }),
    handle((req) => s.applyPreset(currentUser(req), p(req, 'projectId'), p(req, 'presetId'), req.body as ApplyPresetBody)));
  return router;
}
