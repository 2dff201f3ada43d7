import { In, type EntityManager } from 'typeorm';
import { ringProblem } from '../../shared/annotations/geometry';
import type { FieldProblem } from '../../shared/api-error';
import type { FigureSpec } from '../../shared/figures';
import type { CommentBody, CommentCounts, CommentThread as CommentThreadDto, FigureThreadAnchor, ImageThreadAnchor, NewFigureThreadBody, NewThreadBody, ThreadAnchor, ThreadListQuery } from '../../shared/reviews';
import { recordActivity } from '../activity/record-activity';
import type { AppContext } from '../app-context';
import { User } from '../auth/user.entity';
import { AppError } from '../http/app-error';
import { Figure } from '../figures/figure.entity';
import { Image } from '../images/image.entity';
import { excerpt, notify, subjectFacts } from '../notifications/notify';
import { CommentThread } from './comment-thread.entity';
import { Comment } from './comment.entity';
import { threadParticipants } from './involved';
import { requireSubject, type ReviewSubject } from './review-subject';
import { toThreadDto } from './review.mapper';

const invalid = (field: string, message: string) => new AppError(422, 'validation_failed', message, [{ field, message }]);

/** Where a thread belongs, as the entity's columns: on an image or on a figure. */
const subjectWhere = (subject: ReviewSubject) => (subject.type === 'image' ? { imageId: subject.id } : { figureId: subject.id });
const subjectColumns = (subject: ReviewSubject) => ({ imageId: subject.type === 'image' ? subject.id : null, figureId: subject.type === 'figure' ? subject.id : null });

/**
 * Comment threads on an image (pinned to a point, a region or a measurement) or on a figure (the
 * whole figure or one panel): open one, reply, resolve, reopen, and count what is open. Replies,
 * mentions and resolving work the same whatever the thread is on.
 */
export class ThreadsService {
  constructor(private readonly ctx: AppContext) {}

  async list(projectId: string, subject: ReviewSubject, query: ThreadListQuery): Promise<CommentThreadDto[]> {
    const m = this.ctx.dataSource.manager;
    await requireSubject(m, projectId, subject);
    const threads = await m.find(CommentThread, {
      where: { ...subjectWhere(subject), ...(query.status === 'all' ? {} : { status: query.status }) },
      relations: { creator: true, resolver: true, comments: { author: true } },
      order: { createdAt: 'ASC', comments: { createdAt: 'ASC' } },
    });
    return this.toDtos(m, threads);
  }

  /** Opens a thread with its first comment; the anchor must lie on the image (or name one of its measurements). */
  async open(user: Express.User, projectId: string, imageId: string, body: NewThreadBody): Promise<CommentThreadDto> {
    return this.start(user, projectId, { type: 'image', id: imageId }, body, async (m) => {
      const image = await this.image(m, projectId, imageId);
      await this.checkAnchor(m, image, body.anchor);
    });
  }

  /** Opens a thread on a figure, or on one of its panels (which must exist in the saved figure). */
  async openOnFigure(user: Express.User, projectId: string, figureId: string, body: NewFigureThreadBody): Promise<CommentThreadDto> {
    return this.start(user, projectId, { type: 'figure', id: figureId }, body, async (m) => {
      const figure = await m.findOneBy(Figure, { id: figureId, projectId });
      if (!figure) throw AppError.notFound('The figure');
      checkPanelAnchor(figure.spec, body.anchor);
    });
  }

  /** The part every new thread shares: checks (anchor, mentions), the rows, the history line, and word to those mentioned. */
  private async start(user: Express.User, projectId: string, subject: ReviewSubject, body: NewThreadBody | NewFigureThreadBody, checkAnchor: (m: EntityManager) => Promise<void>): Promise<CommentThreadDto> {
    const id = await this.ctx.dataSource.transaction(async (m) => {
      await checkAnchor(m);
      await this.checkMentions(m, projectId, body.mentions);
      const measurementId = body.anchor.kind === 'measurement' ? body.anchor.measurementId : null;
      const thread = await m.save(m.create(CommentThread, { projectId, ...subjectColumns(subject), anchorKind: body.anchor.kind, anchor: body.anchor, measurementId, createdBy: user.id }));
      await m.insert(Comment, { threadId: thread.id, authorId: user.id, body: body.body, mentions: body.mentions });
      const where = subject.type === 'image' ? describeAnchor(body.anchor) : `${describeAnchor(body.anchor)} of the figure “${await this.figureTitle(m, subject.id)}”`;
      await recordActivity(m, { ...this.activityOf(projectId, subject, user.id), action: 'comment.added', summary: `opened a thread on ${where}`, details: { threadId: thread.id, ...this.figureDetail(subject) } });
      const facts = { ...(await subjectFacts(m, subject, user.id)), excerpt: excerpt(body.body) };
      await notify(m, { kind: 'mention', recipientIds: body.mentions, actorId: user.id, projectId, subject, threadId: thread.id, facts });
      return thread.id;
    });
    return this.one(projectId, subject, id);
  }

  /** Adds a reply to an open thread. Those mentioned hear of the mention; everyone else in the thread hears of the reply. */
  async reply(user: Express.User, projectId: string, subject: ReviewSubject, threadId: string, body: CommentBody): Promise<CommentThreadDto> {
    await this.ctx.dataSource.transaction(async (m) => {
      await requireSubject(m, projectId, subject);
      const thread = await this.thread(m, subject, threadId);
      if (thread.status === 'resolved') throw AppError.conflict('This thread is resolved; reopen it to reply.');
      await this.checkMentions(m, projectId, body.mentions);
      const participants = await threadParticipants(m, threadId);
      await m.insert(Comment, { threadId, authorId: user.id, body: body.body, mentions: body.mentions });
      const summary = subject.type === 'image' ? 'replied in a thread' : `replied in a thread on the figure “${await this.figureTitle(m, subject.id)}”`;
      await recordActivity(m, { ...this.activityOf(projectId, subject, user.id), action: 'comment.added', summary, details: { threadId, ...this.figureDetail(subject) } });
      const facts = { ...(await subjectFacts(m, subject, user.id)), excerpt: excerpt(body.body) };
      const base = { actorId: user.id, projectId, subject, threadId, facts };
      await notify(m, { ...base, kind: 'mention', recipientIds: body.mentions });
      await notify(m, { ...base, kind: 'reply', recipientIds: participants.filter((id) => !body.mentions.includes(id)) });
    });
    return this.one(projectId, subject, threadId);
  }

  async resolve(user: Express.User, projectId: string, subject: ReviewSubject, threadId: string): Promise<CommentThreadDto> {
    return this.setStatus(user, projectId, subject, threadId, 'resolved');
  }

  async reopen(user: Express.User, projectId: string, subject: ReviewSubject, threadId: string): Promise<CommentThreadDto> {
    return this.setStatus(user, projectId, subject, threadId, 'open');
  }

  /** Open threads in the project, and per image (all images, or the ones asked for). */
  async counts(projectId: string, imageIds: string[] | undefined): Promise<CommentCounts> {
    const rows: { image_id: string; n: number }[] = await this.ctx.dataSource.query(
      `SELECT image_id, count(*)::int AS n FROM comment_threads WHERE project_id = $1 AND image_id IS NOT NULL AND status = 'open' GROUP BY image_id`,
      [projectId],
    );
    const wanted = imageIds ? new Set(imageIds) : null;
    const images = Object.fromEntries(rows.filter((r) => !wanted || wanted.has(r.image_id)).map((r) => [r.image_id, r.n]));
    return { projectId, unresolved: rows.reduce((sum, r) => sum + r.n, 0), images };
  }

  private async setStatus(user: Express.User, projectId: string, subject: ReviewSubject, threadId: string, to: 'open' | 'resolved'): Promise<CommentThreadDto> {
    await this.ctx.dataSource.transaction(async (m) => {
      await requireSubject(m, projectId, subject);
      const thread = await this.thread(m, subject, threadId);
      if (thread.status === to) {
        throw AppError.conflict(to === 'resolved' ? `${thread.resolver?.displayName ?? 'Someone'} already resolved this thread.` : 'This thread is already open.');
      }
      const resolved = to === 'resolved' ? { resolvedBy: user.id, resolvedAt: new Date() } : { resolvedBy: null, resolvedAt: null };
      await m.update(CommentThread, { id: threadId }, { status: to, ...resolved });
      const verb = to === 'resolved' ? 'resolved' : 'reopened';
      const summary = subject.type === 'image' ? `${verb} a thread` : `${verb} a thread on the figure “${await this.figureTitle(m, subject.id)}”`;
      await recordActivity(m, { ...this.activityOf(projectId, subject, user.id), action: to === 'resolved' ? 'comment.resolved' : 'comment.reopened', summary, details: { threadId, ...this.figureDetail(subject) } });
    });
    return this.one(projectId, subject, threadId);
  }

  /** History rows of image threads sit on the image's timeline; figure threads only on the project's. */
  private activityOf(projectId: string, subject: ReviewSubject, actorId: string) {
    return { projectId, imageId: subject.type === 'image' ? subject.id : null, actorId };
  }

  private figureDetail(subject: ReviewSubject): Record<string, string> {
    return subject.type === 'figure' ? { figureId: subject.id } : {};
  }

  private async figureTitle(m: EntityManager, figureId: string): Promise<string> {
    return (await m.findOneByOrFail(Figure, { id: figureId })).title;
  }

  private async one(projectId: string, subject: ReviewSubject, threadId: string): Promise<CommentThreadDto> {
    const m = this.ctx.dataSource.manager;
    const thread = await m.findOneOrFail(CommentThread, {
      where: { id: threadId, projectId, ...subjectWhere(subject) },
      relations: { creator: true, resolver: true, comments: { author: true } },
      order: { comments: { createdAt: 'ASC' } },
    });
    return (await this.toDtos(m, [thread]))[0]!;
  }

  /** Resolves mentioned names and whether measurement anchors still exist, in one query each. */
  private async toDtos(m: EntityManager, threads: CommentThread[]): Promise<CommentThreadDto[]> {
    const mentioned = [...new Set(threads.flatMap((t) => t.comments.flatMap((c) => c.mentions)))];
    const users = mentioned.length > 0 ? await m.find(User, { where: { id: In(mentioned) } }) : [];
    const names = new Map(users.map((u) => [u.id, u.displayName]));
    const measured = threads.map((t) => t.measurementId).filter((id): id is string => id !== null);
    const present: { id: string }[] = measured.length > 0 ? await m.query(`SELECT id FROM measurements WHERE id = ANY($1::uuid[])`, [measured]) : [];
    const existing = new Set(present.map((r) => r.id));
    return threads.map((t) => toThreadDto(t, names, t.measurementId === null || existing.has(t.measurementId)));
  }

  private async image(m: EntityManager, projectId: string, imageId: string): Promise<Image> {
    const image = await m.findOneBy(Image, { id: imageId, projectId });
    if (!image) throw AppError.notFound('The image');
    return image;
  }

  /** The thread on this image or figure, locked for the rest of the transaction so two people resolving at once are ordered. */
  private async thread(m: EntityManager, subject: ReviewSubject, threadId: string): Promise<CommentThread> {
    await m.query(`SELECT 1 FROM comment_threads WHERE id = $1 FOR UPDATE`, [threadId]);
    const thread = await m.findOne(CommentThread, { where: { id: threadId, ...subjectWhere(subject) }, relations: { resolver: true } });
    if (!thread) throw AppError.notFound('The thread');
    return thread;
  }

  private async checkAnchor(m: EntityManager, image: Image, anchor: ImageThreadAnchor): Promise<void> {
    const outside = (x: number, y: number) => x < 0 || y < 0 || x > image.width || y > image.height;
    const size = `${image.width} × ${image.height} px`;
    if (anchor.kind === 'point' && outside(...anchor.at)) {
      throw invalid('body.anchor.at', `The point (${anchor.at[0]}, ${anchor.at[1]}) lies outside the image (${size}).`);
    }
    if (anchor.kind === 'region') {
      const i = anchor.ring.findIndex(([x, y]) => outside(x, y));
      if (i >= 0) throw invalid(`body.anchor.ring.${i}`, `Point ${i + 1} of the region lies outside the image (${size}).`);
      const problem = ringProblem(anchor.ring);
      if (problem) throw invalid('body.anchor.ring', problem.replace('outline', 'region'));
    }
    if (anchor.kind === 'measurement') {
      const found: unknown[] = await m.query(`SELECT 1 FROM measurements WHERE id = $1 AND image_id = $2`, [anchor.measurementId, image.id]);
      if (found.length === 0) throw invalid('body.anchor.measurementId', 'Pin the thread to a measurement on this image; that one is not.');
    }
  }

  /** Every mentioned id must be a member of the project; each one that is not is named. */
  private async checkMentions(m: EntityManager, projectId: string, mentions: string[]): Promise<void> {
    if (mentions.length === 0) return;
    const rows: { user_id: string }[] = await m.query(`SELECT user_id FROM project_memberships WHERE project_id = $1 AND user_id = ANY($2::uuid[])`, [projectId, mentions]);
    const members = new Set(rows.map((r) => r.user_id));
    const problems: FieldProblem[] = mentions.flatMap((id, i) => (members.has(id) ? [] : [{ field: `body.mentions.${i}`, message: `${id} is not a member of this project; mention only members.` }]));
    if (problems.length > 0) {
      throw new AppError(422, 'validation_failed', `Mention only members of this project: ${problems.map((p) => p.message.split(' ')[0]).join(', ')} ${problems.length > 1 ? 'are' : 'is'} not.`, problems);
    }
  }
}

/** A panel pin must name a panel the saved figure has. */
function checkPanelAnchor(spec: Pick<FigureSpec, 'panels'>, anchor: FigureThreadAnchor): void {
  if (anchor.kind === 'panel' && anchor.panel >= spec.panels.length) {
    const n = spec.panels.length;
    throw invalid('body.anchor.panel', `The figure has ${n} panel${n === 1 ? '' : 's'} (places 0 to ${n - 1}); there is no panel at place ${anchor.panel}.`);
  }
}

function describeAnchor(anchor: ThreadAnchor): string {
  switch (anchor.kind) {
    case 'point':
      return `a point (${Math.round(anchor.at[0])}, ${Math.round(anchor.at[1])})`;
    case 'region':
      return `a region of ${anchor.ring.length} points`;
    case 'measurement':
      return 'a measurement';
    case 'figure':
      return 'the whole';
    case 'panel':
      return `panel ${anchor.panel + 1}`;
  }
}
