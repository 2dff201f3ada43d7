import type { EntityManager } from 'typeorm';
import type { NotificationKind } from '../../shared/notifications';
import type { ProjectAction } from '../../shared/roles';
import {
  availableTransitions,
  REVIEW_STATE_LABELS,
  TRANSITION_RULES,
  transitionProblem,
  type ReviewSnapshot as ReviewSnapshotDto,
  type ReviewState,
  type ReviewStatus,
  type ReviewTransition,
  type ReviewTransitionBody,
} from '../../shared/reviews';
import { recordActivity } from '../activity/record-activity';
import type { AppContext } from '../app-context';
import { AppError } from '../http/app-error';
import { Image } from '../images/image.entity';
import { imageFacts, notify } from '../notifications/notify';
import { involvedInReview, membersWithRole } from './involved';
import { ReviewEvent } from './review-event.entity';
import { ReviewSnapshot } from './review-snapshot.entity';
import { Review } from './review.entity';
import { toPerson, toReviewEventDto, toSnapshotDto } from './review.mapper';
import { takeSnapshot } from './take-snapshot';

const IMAGE = 'image' as const;

/** The review of an image: where it stands, the moves between states, and what was cleared. */
export class ReviewStateService {
  constructor(private readonly ctx: AppContext) {}

  /** Where the image stands and what `allowed` (the caller's actions) lets them do next. */
  async status(projectId: string, imageId: string, allowed: readonly ProjectAction[]): Promise<ReviewStatus> {
    const m = this.ctx.dataSource.manager;
    await this.image(m, projectId, imageId);
    const review = await m.findOne(Review, { where: { subjectType: IMAGE, subjectId: imageId }, relations: { submitter: true } });
    const history = await m.find(ReviewEvent, { where: { subjectType: IMAGE, subjectId: imageId }, relations: { actor: true }, order: { seq: 'ASC' } });
    const state: ReviewState = review?.state ?? 'draft';
    return {
      subjectType: IMAGE,
      subjectId: imageId,
      state,
      stateLabel: REVIEW_STATE_LABELS[state],
      submittedBy: review?.submitter ? toPerson(review.submitter) : null,
      submittedAt: review?.submittedAt?.toISOString() ?? null,
      openThreads: await this.openThreads(m, imageId),
      transitions: availableTransitions(state, allowed),
      history: history.map(toReviewEventDto),
    };
  }

  /**
   * Makes one move. The route has checked the role; here the state is checked under a row lock
   * (409 from the wrong state), the move and the activity are recorded, clearing freezes a snapshot,
   * and the people concerned are notified, all in one transaction.
   */
  async move(user: Express.User, projectId: string, imageId: string, transition: ReviewTransition, body: ReviewTransitionBody, allowed: readonly ProjectAction[]): Promise<ReviewStatus> {
    await this.ctx.dataSource.transaction(async (m) => {
      await this.image(m, projectId, imageId);
      await m.query(
        `INSERT INTO review_states (subject_type, subject_id, project_id, image_id, state, updated_by)
         VALUES ('image', $1, $2, $1, 'draft', $3) ON CONFLICT DO NOTHING`,
        [imageId, projectId, user.id],
      );
      const [locked]: { state: ReviewState; submitted_by: string | null }[] = await m.query(
        `SELECT state, submitted_by FROM review_states WHERE subject_type = 'image' AND subject_id = $1 FOR UPDATE`,
        [imageId],
      );
      const from = locked!.state;
      const problem = transitionProblem(transition, from);
      if (problem) throw AppError.conflict(problem);
      const rule = TRANSITION_RULES[transition];
      if (transition === 'clear') {
        const open = await this.openThreads(m, imageId);
        if (open > 0) throw AppError.conflict(`${open} comment thread${open > 1 ? 's are' : ' is'} still open on this image; resolve ${open > 1 ? 'them' : 'it'} before clearing.`);
      }
      const submitted = transition === 'submit' ? { submittedBy: user.id, submittedAt: new Date() } : {};
      await m.update(Review, { subjectType: IMAGE, subjectId: imageId }, { state: rule.to, updatedBy: user.id, updatedAt: new Date(), ...submitted });
      const event = await m.save(m.create(ReviewEvent, { subjectType: IMAGE, subjectId: imageId, projectId, fromState: from, toState: rule.to, reason: transition, actorId: user.id, note: body.note }));
      if (transition === 'clear') await takeSnapshot(m, imageId, event.id, user.id);
      await recordActivity(m, {
        projectId,
        imageId,
        actorId: user.id,
        action: 'review.state_changed',
        summary: `${rule.label.toLowerCase()}: ${REVIEW_STATE_LABELS[from].toLowerCase()} → ${REVIEW_STATE_LABELS[rule.to].toLowerCase()}`,
        details: { from, to: rule.to, reason: transition, ...(body.note ? { note: body.note } : {}) },
      });
      await this.tell(m, user.id, projectId, imageId, transition, body.note, transition === 'submit' ? user.id : locked!.submitted_by);
    });
    return this.status(projectId, imageId, allowed);
  }

  /** Every snapshot of the image, newest first, with what it froze. */
  async snapshots(projectId: string, imageId: string): Promise<ReviewSnapshotDto[]> {
    const m = this.ctx.dataSource.manager;
    await this.image(m, projectId, imageId);
    const rows = await m.find(ReviewSnapshot, { where: { subjectType: IMAGE, subjectId: imageId }, relations: { clearer: true }, order: { seq: 'DESC' } });
    return rows.map(toSnapshotDto);
  }

  /** Who hears of a move: reviewers of a submission, the submitter of a decision, everyone involved of a reopening. */
  private async tell(m: EntityManager, actorId: string, projectId: string, imageId: string, transition: ReviewTransition, note: string, submitter: string | null): Promise<void> {
    const plan: Record<ReviewTransition, () => Promise<[NotificationKind, string[]]>> = {
      submit: async () => ['review_requested', await membersWithRole(m, projectId, 'reviewer')],
      requestChanges: async () => ['changes_requested', submitter ? [submitter] : []],
      clear: async () => ['cleared', submitter ? [submitter] : []],
      reopen: async () => ['returned_to_draft', await involvedInReview(m, imageId)],
    };
    const [kind, recipientIds] = await plan[transition]();
    const facts = await imageFacts(m, imageId, actorId);
    const said = transition === 'reopen' ? `reopened it${note ? ` (“${note}”)` : ''}` : note;
    await notify(m, { kind, recipientIds, actorId, projectId, imageId, facts: { ...facts, ...(said ? { note: said } : {}) } });
  }

  private async image(m: EntityManager, projectId: string, imageId: string): Promise<Image> {
    const image = await m.findOneBy(Image, { id: imageId, projectId });
    if (!image) throw AppError.notFound('The image');
    return image;
  }

  private async openThreads(m: EntityManager, imageId: string): Promise<number> {
    const [row] = await m.query(`SELECT count(*)::int AS n FROM comment_threads WHERE image_id = $1 AND status = 'open'`, [imageId]);
    return row.n as number;
  }
}
