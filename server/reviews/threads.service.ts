import { In, type EntityManager } from 'typeorm';
import { ringProblem } from '../../shared/annotations/geometry';
import type { FieldProblem } from '../../shared/api-error';
import type { CommentBody, CommentCounts, CommentThread as CommentThreadDto, NewThreadBody, ThreadAnchor, ThreadListQuery } from '../../shared/reviews';
import { recordActivity } from '../activity/record-activity';
import type { AppContext } from '../app-context';
import { User } from '../auth/user.entity';
import { AppError } from '../http/app-error';
import { Image } from '../images/image.entity';
import { excerpt, imageFacts, notify } from '../notifications/notify';
import { CommentThread } from './comment-thread.entity';
import { Comment } from './comment.entity';
import { threadParticipants } from './involved';
import { toThreadDto } from './review.mapper';

const invalid = (field: string, message: string) => new AppError(422, 'validation_failed', message, [{ field, message }]);

/** Comment threads pinned to an image: open one, reply, resolve, reopen, and count what is open. */
export class ThreadsService {
  constructor(private readonly ctx: AppContext) {}

  async list(projectId: string, imageId: string, query: ThreadListQuery): Promise<CommentThreadDto[]> {
    const m = this.ctx.dataSource.manager;
    await this.image(m, projectId, imageId);
    const threads = await m.find(CommentThread, {
      where: { imageId, ...(query.status === 'all' ? {} : { status: query.status }) },
      relations: { creator: true, resolver: true, comments: { author: true } },
      order: { createdAt: 'ASC', comments: { createdAt: 'ASC' } },
    });
    return this.toDtos(m, threads);
  }

  /** Opens a thread with its first comment; the anchor must lie on the image (or name one of its measurements). */
  async open(user: Express.User, projectId: string, imageId: string, body: NewThreadBody): Promise<CommentThreadDto> {
    const id = await this.ctx.dataSource.transaction(async (m) => {
      const image = await this.image(m, projectId, imageId);
      await this.checkAnchor(m, image, body.anchor);
      await this.checkMentions(m, projectId, body.mentions);
      const measurementId = body.anchor.kind === 'measurement' ? body.anchor.measurementId : null;
      const thread = await m.save(m.create(CommentThread, { projectId, imageId, anchorKind: body.anchor.kind, anchor: body.anchor, measurementId, createdBy: user.id }));
      await m.insert(Comment, { threadId: thread.id, authorId: user.id, body: body.body, mentions: body.mentions });
      await recordActivity(m, { projectId, imageId, actorId: user.id, action: 'comment.added', summary: `opened a thread on ${describeAnchor(body.anchor)}`, details: { threadId: thread.id } });
      const facts = { ...(await imageFacts(m, imageId, user.id)), excerpt: excerpt(body.body) };
      await notify(m, { kind: 'mention', recipientIds: body.mentions, actorId: user.id, projectId, imageId, threadId: thread.id, facts });
      return thread.id;
    });
    return this.one(projectId, imageId, id);
  }

  /** Adds a reply to an open thread. Those mentioned hear of the mention; everyone else in the thread hears of the reply. */
  async reply(user: Express.User, projectId: string, imageId: string, threadId: string, body: CommentBody): Promise<CommentThreadDto> {
    await this.ctx.dataSource.transaction(async (m) => {
      await this.image(m, projectId, imageId);
      const thread = await this.thread(m, imageId, threadId);
      if (thread.status === 'resolved') throw AppError.conflict('This thread is resolved; reopen it to reply.');
      await this.checkMentions(m, projectId, body.mentions);
      const participants = await threadParticipants(m, threadId);
      await m.insert(Comment, { threadId, authorId: user.id, body: body.body, mentions: body.mentions });
      await recordActivity(m, { projectId, imageId, actorId: user.id, action: 'comment.added', summary: 'replied in a thread', details: { threadId } });
      const facts = { ...(await imageFacts(m, imageId, user.id)), excerpt: excerpt(body.body) };
      const base = { actorId: user.id, projectId, imageId, threadId, facts };
      await notify(m, { ...base, kind: 'mention', recipientIds: body.mentions });
      await notify(m, { ...base, kind: 'reply', recipientIds: participants.filter((id) => !body.mentions.includes(id)) });
    });
    return this.one(projectId, imageId, threadId);
  }

  async resolve(user: Express.User, projectId: string, imageId: string, threadId: string): Promise<CommentThreadDto> {
    return this.setStatus(user, projectId, imageId, threadId, 'resolved');
  }

  async reopen(user: Express.User, projectId: string, imageId: string, threadId: string): Promise<CommentThreadDto> {
    return this.setStatus(user, projectId, imageId, threadId, 'open');
  }

  /** Open threads in the project, and per image (all images, or the ones asked for). */
  async counts(projectId: string, imageIds: string[] | undefined): Promise<CommentCounts> {
    const rows: { image_id: string; n: number }[] = await this.ctx.dataSource.query(
      `SELECT image_id, count(*)::int AS n FROM comment_threads WHERE project_id = $1 AND status = 'open' GROUP BY image_id`,
      [projectId],
    );
    const wanted = imageIds ? new Set(imageIds) : null;
    const images = Object.fromEntries(rows.filter((r) => !wanted || wanted.has(r.image_id)).map((r) => [r.image_id, r.n]));
    return { projectId, unresolved: rows.reduce((sum, r) => sum + r.n, 0), images };
  }

  private async setStatus(user: Express.User, projectId: string, imageId: string, threadId: string, to: 'open' | 'resolved'): Promise<CommentThreadDto> {
    await this.ctx.dataSource.transaction(async (m) => {
      await this.image(m, projectId, imageId);
      const thread = await this.thread(m, imageId, threadId);
      if (thread.status === to) {
        throw AppError.conflict(to === 'resolved' ? `${thread.resolver?.displayName ?? 'Someone'} already resolved this thread.` : 'This thread is already open.');
      }
      const resolved = to === 'resolved' ? { resolvedBy: user.id, resolvedAt: new Date() } : { resolvedBy: null, resolvedAt: null };
      await m.update(CommentThread, { id: threadId }, { status: to, ...resolved });
      const verb = to === 'resolved' ? 'resolved' : 'reopened';
      await recordActivity(m, { projectId, imageId, actorId: user.id, action: to === 'resolved' ? 'comment.resolved' : 'comment.reopened', summary: `${verb} a thread`, details: { threadId } });
    });
    return this.one(projectId, imageId, threadId);
  }

  private async one(projectId: string, imageId: string, threadId: string): Promise<CommentThreadDto> {
    const m = this.ctx.dataSource.manager;
    const thread = await m.findOneOrFail(CommentThread, {
      where: { id: threadId, projectId, imageId },
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

  /** The thread on this image, locked for the rest of the transaction so two people resolving at once are ordered. */
  private async thread(m: EntityManager, imageId: string, threadId: string): Promise<CommentThread> {
    await m.query(`SELECT 1 FROM comment_threads WHERE id = $1 FOR UPDATE`, [threadId]);
    const thread = await m.findOne(CommentThread, { where: { id: threadId, imageId }, relations: { resolver: true } });
    if (!thread) throw AppError.notFound('The thread');
    return thread;
  }

  private async checkAnchor(m: EntityManager, image: Image, anchor: ThreadAnchor): Promise<void> {
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

function describeAnchor(anchor: ThreadAnchor): string {
  if (anchor.kind === 'point') return `a point (${Math.round(anchor.at[0])}, ${Math.round(anchor.at[1])})`;
  if (anchor.kind === 'region') return `a region of ${anchor.ring.length} points`;
  return 'a measurement';
}
