import { Router } from 'express';
import { projectIdParams } from '../../shared/projects';
import type { AppContext } from '../app-context';
import { requireSignedIn } from '../http/require-auth';
import { validate } from '../http/validate';
import { requireProjectAction } from '../projects/project-access';
import { writeProjectExport } from './project-export';

/** Mounted at /api/projects/:projectId: the supplementary data for a paper, for anyone who may read. */
export function exportsRouter(ctx: AppContext): Router {
  const router = Router({ mergeParams: true });
  router.get('/export.zip', requireSignedIn, validate({ params: projectIdParams }), requireProjectAction(ctx.dataSource, 'read'), async (req, res) => {
    const [project] = await ctx.dataSource.query('SELECT code FROM projects WHERE id = $1', [String(req.params['projectId'])]);
    res.type('application/zip').attachment(`${project.code}-supplementary-data-${new Date().toISOString().slice(0, 10)}.zip`);
    await writeProjectExport(ctx, String(req.params['projectId']), res);
  });
  return router;
}
