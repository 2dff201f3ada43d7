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
import { Figure } from '../figures/figure.entity';
import { AppError } from '../http/app-error';
import { notify, subjectFacts } from '../notifications/notify';
import { checkPanelImages, freezeFigure, specOf } from './freeze-figure';
import { involvedInReview, membersWithRole } from './involved';
import { ReviewEvent } from './review-event.entity';
import { ReviewSnapshot } from './review-snapshot.entity';
import { requireSubject, subjectColumn, type ReviewSubject } from './review-subject';
import { Review } from './review.entity';
import { toPerson, toReviewEventDto, toSnapshotDto } from './review.mapper';
import { takeSnapshot } from './take-snapshot';

/** The review of an image or a figure: where it stands, the moves between states, and what was cleared. */
export class ReviewStateService {
  constructor(private readonly ctx: AppContext) {}

  /** Where the subject stands and what `allowed` (the caller's actions) lets them do next. */
  async status(projectId: string, subject: ReviewSubject, allowed: readonly ProjectAction[]): Promise<ReviewStatus> {
    const m = this.ctx.dataSource.manager;
    await requireSubject(m, projectId, subject);
    const where = { subjectType: subject.type, subjectId: subject.id };
    const review = await m.findOne(Review, { where, relations: { submitter: true } });
    const history = await m.find(ReviewEvent, { where, relations: { actor: true }, order: { seq: 'ASC' } });
    const state: ReviewState = review?.state ?? 'draft';
    return {
      subjectType: subject.type,
      subjectId: subject.id,
      state,
      stateLabel: REVIEW_STATE_LABELS[state],
      submittedBy: review?.submitter ? toPerson(review.submitter) : null,
      submittedAt: review?.submittedAt?.toISOString() ?? null,
      openThreads: await this.openThreads(m, subject),
      transitions: availableTransitions(state, allowed),
      history: history.map(toReviewEventDto),
    };
  }

  /**
   * Makes one move. The route has checked the role; here the state is checked under a row lock
   * (409 from the wrong state), the move and the activity are recorded, clearing freezes what was
   * cleared (an image's snapshot; a figure's definition and rendered export), and the people
   * concerned are notified, all in one transaction.
   */
  async move(user: Express.User, projectId: string, subject: ReviewSubject, transition: ReviewTransition, body: ReviewTransitionBody, allowed: readonly ProjectAction[]): Promise<ReviewStatus> {
    const word = subject.type;
    await this.ctx.dataSource.transaction(async (m) => {
      await requireSubject(m, projectId, subject);
      await m.query(
        `INSERT INTO review_states (subject_type, subject_id, project_id, image_id, figure_id, state, updated_by)
         VALUES ($1, $2, $3, $4, $5, 'draft', $6) ON CONFLICT DO NOTHING`,
        [subject.type, subject.id, projectId, subject.type === 'image' ? subject.id : null, subject.type === 'figure' ? subject.id : null, user.id],
      );
      const [locked]: { state: ReviewState; submitted_by: string | null }[] = await m.query(
        `SELECT state, submitted_by FROM review_states WHERE subject_type = $1 AND subject_id = $2 FOR UPDATE`,
        [subject.type, subject.id],
      );
      const from = locked!.state;
      const problem = transitionProblem(transition, from);
      if (problem) throw AppError.conflict(problem);
      const rule = TRANSITION_RULES[transition];
      if (transition === 'clear') {
        const open = await this.openThreads(m, subject);
        if (open > 0) throw AppError.conflict(`${open} comment thread${open > 1 ? 's are' : ' is'} still open on this ${word}; resolve ${open > 1 ? 'them' : 'it'} before clearing.`);
      }
      // A figure showing a deleted image can be neither reviewed nor rendered as it was seen.
      if (subject.type === 'figure' && (transition === 'submit' || transition === 'clear')) {
        await checkPanelImages(m, projectId, specOf(await m.findOneByOrFail(Figure, { id: subject.id })));
      }
      const submitted = transition === 'submit' ? { submittedBy: user.id, submittedAt: new Date() } : {};
      await m.update(Review, { subjectType: subject.type, subjectId: subject.id }, { state: rule.to, updatedBy: user.id, updatedAt: new Date(), ...submitted });
      const event = await m.save(m.create(ReviewEvent, { subjectType: subject.type, subjectId: subject.id, projectId, fromState: from, toState: rule.to, reason: transition, actorId: user.id, note: body.note }));
      if (transition === 'clear' && subject.type === 'image') await takeSnapshot(m, subject.id, event.id, user.id);
      if (transition === 'clear' && subject.type === 'figure') await freezeFigure(this.ctx, m, projectId, subject.id, event.id, user.id);
      const change = `${rule.label.toLowerCase()}: ${REVIEW_STATE_LABELS[from].toLowerCase()} → ${REVIEW_STATE_LABELS[rule.to].toLowerCase()}`;
      await recordActivity(m, {
        projectId,
        imageId: subject.type === 'image' ? subject.id : null,
        actorId: user.id,
        action: 'review.state_changed',
        summary: subject.type === 'image' ? change : `${change} for the figure “${(await m.findOneByOrFail(Figure, { id: subject.id })).title}”`,
        details: { from, to: rule.to, reason: transition, ...(body.note ? { note: body.note } : {}), ...(subject.type === 'figure' ? { figureId: subject.id } : {}) },
      });
      await this.tell(m, user.id, projectId, subject, transition, body.note, transition === 'submit' ? user.id : locked!.submitted_by);
    });
    return this.status(projectId, subject, allowed);
  }

  /** Every snapshot of the image, newest first, with what it froze. */
  async snapshots(projectId: string, imageId: string): Promise<ReviewSnapshotDto[]> {
    const m = this.ctx.dataSource.manager;
    await requireSubject(m, projectId, { type: 'image', id: imageId });
    const rows = await m.find(ReviewSnapshot, { where: { subjectType: 'image', subjectId: imageId }, relations: { clearer: true }, order: { seq: 'DESC' } });
    return rows.map(toSnapshotDto);
  }

  /** Who hears of a move: reviewers of a submission, the submitter of a decision, everyone involved of a reopening. */
  private async tell(m: EntityManager, actorId: string, projectId: string, subject: ReviewSubject, transition: ReviewTransition, note: string, submitter: string | null): Promise<void> {
    const plan: Record<ReviewTransition, () => Promise<[NotificationKind, string[]]>> = {
      submit: async () => ['review_requested', await membersWithRole(m, projectId, 'reviewer')],
      requestChanges: async () => ['changes_requested', submitter ? [submitter] : []],
      clear: async () => ['cleared', submitter ? [submitter] : []],
      reopen: async () => ['returned_to_draft', await involvedInReview(m, subject)],
    };
    const [kind, recipientIds] = await plan[transition]();
    const facts = await subjectFacts(m, subject, actorId);
    const said = transition === 'reopen' ? `reopened it${note ? ` (“${note}”)` : ''}` : note;
    await notify(m, { kind, recipientIds, actorId, projectId, subject, facts: { ...facts, ...(said ? { note: said } : {}) } });
  }

  private async openThreads(m: EntityManager, subject: ReviewSubject): Promise<number> {
    const [row] = await m.query(`SELECT count(*)::int AS n FROM comment_threads WHERE ${subjectColumn(subject)} = $1 AND status = 'open'`, [subject.id]);
    return row.n as number;
  }
}
