import type { Request, RequestHandler, Response } from 'express';
import type { CommentBody, CommentCountsQuery, NewFigureThreadBody, NewThreadBody, ReviewQueueQuery, ReviewTransition, ReviewTransitionBody, ThreadListQuery } from '../../shared/reviews';
import { can, PROJECT_ACTIONS, type ProjectAction } from '../../shared/roles';
import type { AppContext } from '../app-context';
import { currentUser } from '../http/require-auth';
import { projectRoleOf } from '../projects/project-access';
import { FigureClearancesService } from './figure-clearances.service';
import { ReviewQueueService } from './review-queue.service';
import { ReviewStateService } from './review-state.service';
import type { ReviewSubject } from './review-subject';
import { ThreadsService } from './threads.service';

const p = (req: Request, name: string) => String(req.params[name]);

/** The image or figure the route names (its params were validated, so exactly one is there). */
const subjectOf = (req: Request): ReviewSubject => (req.params['figureId'] ? { type: 'figure', id: p(req, 'figureId') } : { type: 'image', id: p(req, 'imageId') });

/** What the caller may do in this project, for the moves offered with a review's status. */
function allowedActions(req: Request, res: Response): ProjectAction[] {
  const user = currentUser(req);
  return PROJECT_ACTIONS.filter((a) => can(user.siteRole, projectRoleOf(res), a));
}

/** HTTP in, service call, HTTP out for review states, snapshots, cleared figures, the reviewer's queue and comment threads. */
export class ReviewsController {
  private readonly reviews: ReviewStateService;
  private readonly queueService: ReviewQueueService;
  private readonly threads: ThreadsService;
  private readonly clearances: FigureClearancesService;

  constructor(ctx: AppContext) {
    this.reviews = new ReviewStateService(ctx);
    this.queueService = new ReviewQueueService(ctx);
    this.threads = new ThreadsService(ctx);
    this.clearances = new FigureClearancesService(ctx);
  }

  status: RequestHandler = async (req, res) => {
    res.json(await this.reviews.status(p(req, 'projectId'), subjectOf(req), allowedActions(req, res)));
  };
  /** One handler per move; the route has already checked the role the move needs. */
  move = (transition: ReviewTransition): RequestHandler => async (req, res) => {
    const body = req.body as ReviewTransitionBody;
    res.json(await this.reviews.move(currentUser(req), p(req, 'projectId'), subjectOf(req), transition, body, allowedActions(req, res)));
  };
  snapshots: RequestHandler = async (req, res) => {
    res.json(await this.reviews.snapshots(p(req, 'projectId'), p(req, 'imageId')));
  };
  figureClearances: RequestHandler = async (req, res) => {
    res.json(await this.clearances.list(p(req, 'projectId'), p(req, 'figureId')));
  };
  clearedFile: RequestHandler = async (req, res) => {
    const file = await this.clearances.file(p(req, 'projectId'), p(req, 'figureId'), p(req, 'clearanceId'), p(req, 'format') as 'png' | 'tiff');
    res.type(file.contentType).attachment(file.name).setHeader('content-length', String(file.size));
    file.body.pipe(res);
  };
  queue: RequestHandler = async (req, res) => {
    res.json(await this.queueService.queue(currentUser(req), req.query as unknown as ReviewQueueQuery));
  };

  listThreads: RequestHandler = async (req, res) => {
    res.json(await this.threads.list(p(req, 'projectId'), subjectOf(req), req.query as unknown as ThreadListQuery));
  };
  openThread: RequestHandler = async (req, res) => {
    res.status(201).json(await this.threads.open(currentUser(req), p(req, 'projectId'), p(req, 'imageId'), req.body as NewThreadBody));
  };
  openFigureThread: RequestHandler = async (req, res) => {
    res.status(201).json(await this.threads.openOnFigure(currentUser(req), p(req, 'projectId'), p(req, 'figureId'), req.body as NewFigureThreadBody));
  };
  reply: RequestHandler = async (req, res) => {
    res.status(201).json(await this.threads.reply(currentUser(req), p(req, 'projectId'), subjectOf(req), p(req, 'threadId'), req.body as CommentBody));
  };
  resolve: RequestHandler = async (req, res) => {
    res.json(await this.threads.resolve(currentUser(req), p(req, 'projectId'), subjectOf(req), p(req, 'threadId')));
  };
  reopenThread: RequestHandler = async (req, res) => {
    res.json(await this.threads.reopen(currentUser(req), p(req, 'projectId'), subjectOf(req), p(req, 'threadId')));
  };
  counts: RequestHandler = async (req, res) => {
    res.json(await this.threads.counts(p(req, 'projectId'), (req.query as unknown as CommentCountsQuery).imageId));
  };
}
