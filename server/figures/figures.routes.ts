import { Router, type Request } from 'express';
import { z } from 'zod';
import { exportFigureBody, figureBody, updateFigureBody, type ExportFigureBody, type FigureBody, type UpdateFigureBody } from '../../shared/figures';
import { projectIdParams } from '../../shared/projects';
import type { ProjectAction } from '../../shared/roles';
import type { AppContext } from '../app-context';
import { currentUser, requireSignedIn } from '../http/require-auth';
import { validate } from '../http/validate';
import { requireProjectAction } from '../projects/project-access';
import { FiguresService } from './figures.service';

const figureParams = z.strictObject({ projectId: z.uuid({ error: 'Not a valid project id.' }), figureId: z.uuid({ error: 'Not a valid figure id.' }) });
const p = (req: Request, name: string) => String(req.params[name]);

/** Mounted at /api/projects/:projectId. Composing figures is metadata work; anyone who reads may export. */
export function figuresRouter(ctx: AppContext): Router {
  const s = new FiguresService(ctx);
  const may = (action: ProjectAction) => requireProjectAction(ctx.dataSource, action);
  const router = Router({ mergeParams: true });
  router.use(requireSignedIn);

  router.get('/figures', validate({ params: projectIdParams }), may('read'), async (req, res) => {
    res.json(await s.list(p(req, 'projectId')));
  });
  router.post('/figures', validate({ params: projectIdParams }), may('editMetadata'), validate({ body: figureBody }), async (req, res) => {
    res.status(201).json(await s.create(currentUser(req), p(req, 'projectId'), req.body as FigureBody));
  });
  router.get('/figures/:figureId', validate({ params: figureParams }), may('read'), async (req, res) => {
    res.json(await s.get(p(req, 'projectId'), p(req, 'figureId')));
  });
  router.patch('/figures/:figureId', validate({ params: figureParams }), may('editMetadata'), validate({ body: updateFigureBody }), async (req, res) => {
    res.json(await s.update(currentUser(req), p(req, 'projectId'), p(req, 'figureId'), req.body as UpdateFigureBody));
  });
  router.delete('/figures/:figureId', validate({ params: figureParams }), may('delete'), async (req, res) => {
    await s.remove(currentUser(req), p(req, 'projectId'), p(req, 'figureId'));
    res.status(204).end();
  });
  router.get('/figures/:figureId/measurements.csv', validate({ params: figureParams }), may('read'), async (req, res) => {
    const { name, body } = await s.measurementsCsv(p(req, 'projectId'), p(req, 'figureId'));
    res.type('text/csv; charset=utf-8').attachment(name).send(body);
  });
  router.post('/figures/:figureId/export', validate({ params: figureParams }), may('read'), validate({ body: exportFigureBody }), async (req, res) => {
    const { record, file, name } = await s.export(currentUser(req), p(req, 'projectId'), p(req, 'figureId'), req.body as ExportFigureBody);
    res.setHeader('x-export-id', record.id);
    res.type(record.format === 'png' ? 'image/png' : 'image/tiff').attachment(name).send(file);
  });
  return router;
}
