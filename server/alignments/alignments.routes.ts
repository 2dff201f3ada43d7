import { Router, type Request, type RequestHandler } from 'express';
import { alignmentBody, alignmentParams, type AlignmentBody } from '../../shared/alignments';
import type { ProjectAction } from '../../shared/roles';
import type { AppContext } from '../app-context';
import { currentUser, requireSignedIn } from '../http/require-auth';
import { validate } from '../http/validate';
import { requireProjectAction } from '../projects/project-access';
import { AlignmentsService } from './alignments.service';

const imageParams = alignmentParams.omit({ otherImageId: true });
const p = (req: Request, name: string) => String(req.params[name]);

/**
 * Mounted at /api/projects/:projectId. Aligning images is viewer work on the image: those who may
 * annotate save and remove alignments; everyone who can view the image reads them.
 */
export function alignmentsRouter(ctx: AppContext): Router {
  const s = new AlignmentsService(ctx);
  const may = (action: ProjectAction) => requireProjectAction(ctx.dataSource, action);
  const handle = (fn: (req: Request) => Promise<unknown>): RequestHandler => async (req, res) => {
    const result = await fn(req);
    if (result === undefined) res.status(204).end();
    else res.json(result);
  };
  const router = Router({ mergeParams: true });
  router.use(requireSignedIn);

  const one = '/images/:imageId/alignments/:otherImageId';
  router.get('/images/:imageId/alignments', validate({ params: imageParams }), may('read'), handle((req) => s.list(p(req, 'projectId'), p(req, 'imageId'))));
  router.get(one, validate({ params: alignmentParams }), may('read'), handle((req) => s.one(p(req, 'projectId'), p(req, 'imageId'), p(req, 'otherImageId'))));
  router.put(one, validate({ params: alignmentParams }), may('annotate'), validate({ body: alignmentBody }),
    handle((req) => s.save(currentUser(req), p(req, 'projectId'), p(req, 'imageId'), p(req, 'otherImageId'), req.body as AlignmentBody)));
  router.delete(one, validate({ params: alignmentParams }), may('annotate'), handle((req) => s.remove(currentUser(req), p(req, 'projectId'), p(req, 'imageId'), p(req, 'otherImageId'))));
  return router;
}
