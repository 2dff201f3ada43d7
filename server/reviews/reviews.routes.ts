import { Router } from 'express';
import { z } from 'zod';
import { imageParams } from '../../shared/images';
import { projectIdParams } from '../../shared/projects';
import { commentBody, commentCountsQuery, newFigureThreadBody, newThreadBody, reviewQueueQuery, reviewTransitionBody, threadListQuery } from '../../shared/reviews';
import type { ProjectAction } from '../../shared/roles';
import type { AppContext } from '../app-context';
import { requireSignedIn } from '../http/require-auth';
import { validate } from '../http/validate';
import { requireProjectAction } from '../projects/project-access';
import { ReviewsController } from './reviews.controller';

const threadId = z.uuid({ error: 'Not a valid thread id.' });
const threadParams = imageParams.extend({ threadId });
const figureParams = z.strictObject({ projectId: z.uuid({ error: 'Not a valid project id.' }), figureId: z.uuid({ error: 'Not a valid figure id.' }) });
const figureThreadParams = figureParams.extend({ threadId });
const clearedFileParams = figureParams.extend({
  clearanceId: z.uuid({ error: 'Not a valid clearance id.' }),
  format: z.enum(['png', 'tiff'], { error: 'Ask for the png or the tiff file.' }),
});
/** Resolve and reopen take no fields; anything sent is refused rather than ignored. */
const noBody = z.strictObject({});

/**
 * Mounted at /api/projects/:projectId, before the images router (whose '/:imageId' routes would
 * otherwise see these first). Each line: params checked, then the role, then the body; the state
 * a move starts from is checked by the service (409), after the role (403).
 */
export function reviewsRouter(ctx: AppContext): Router {
  const c = new ReviewsController(ctx);
  const may = (action: ProjectAction) => requireProjectAction(ctx.dataSource, action);
  const one = validate({ params: imageParams });
  const moveBody = validate({ body: reviewTransitionBody });
  const router = Router({ mergeParams: true });
  router.use(requireSignedIn);

  const review = '/images/:imageId/review';
  router.get(review, one, may('read'), c.status);
  router.post(`${review}/submit`, one, may('submitForReview'), moveBody, c.move('submit'));
  router.post(`${review}/request-changes`, one, may('decideReview'), moveBody, c.move('requestChanges'));
  router.post(`${review}/clear`, one, may('decideReview'), moveBody, c.move('clear'));
  router.post(`${review}/reopen`, one, may('reopenReview'), moveBody, c.move('reopen'));
  router.get(`${review}/snapshots`, one, may('read'), c.snapshots);

  const threads = '/images/:imageId/threads';
  router.get(threads, validate({ params: imageParams, query: threadListQuery }), may('read'), c.listThreads);
  router.post(threads, one, may('comment'), validate({ body: newThreadBody }), c.openThread);
  router.post(`${threads}/:threadId/comments`, validate({ params: threadParams }), may('comment'), validate({ body: commentBody }), c.reply);
  router.post(`${threads}/:threadId/resolve`, validate({ params: threadParams }), may('comment'), validate({ body: noBody }), c.resolve);
  router.post(`${threads}/:threadId/reopen`, validate({ params: threadParams }), may('comment'), validate({ body: noBody }), c.reopenThread);
  router.get('/comment-counts', validate({ params: projectIdParams, query: commentCountsQuery }), may('read'), c.counts);

  // Figures: the same moves, roles and thread handlers; clearing also keeps the rendered export.
  const fig = validate({ params: figureParams });
  const figureReview = '/figures/:figureId/review';
  router.get(figureReview, fig, may('read'), c.status);
  router.post(`${figureReview}/submit`, fig, may('submitForReview'), moveBody, c.move('submit'));
  router.post(`${figureReview}/request-changes`, fig, may('decideReview'), moveBody, c.move('requestChanges'));
  router.post(`${figureReview}/clear`, fig, may('decideReview'), moveBody, c.move('clear'));
  router.post(`${figureReview}/reopen`, fig, may('reopenReview'), moveBody, c.move('reopen'));
  router.get(`${figureReview}/clearances`, fig, may('read'), c.figureClearances);
  router.get(`${figureReview}/clearances/:clearanceId/:format`, validate({ params: clearedFileParams }), may('read'), c.clearedFile);

  const figureThreads = '/figures/:figureId/threads';
  const figThread = validate({ params: figureThreadParams });
  router.get(figureThreads, validate({ params: figureParams, query: threadListQuery }), may('read'), c.listThreads);
  router.post(figureThreads, fig, may('comment'), validate({ body: newFigureThreadBody }), c.openFigureThread);
  router.post(`${figureThreads}/:threadId/comments`, figThread, may('comment'), validate({ body: commentBody }), c.reply);
  router.post(`${figureThreads}/:threadId/resolve`, figThread, may('comment'), validate({ body: noBody }), c.resolve);
  router.post(`${figureThreads}/:threadId/reopen`, figThread, may('comment'), validate({ body: noBody }), c.reopenThread);
  return router;
}

/** Mounted at /api/review-queue: the signed-in reviewer's own queue across their projects. */
export function reviewQueueRouter(ctx: AppContext): Router {
  const c = new ReviewsController(ctx);
  const router = Router();
  router.get('/', requireSignedIn, validate({ query: reviewQueueQuery }), c.queue);
  return router;
}
