import type {
  CommentThread as CommentThreadDto,
  PersonRef,
  ReviewEvent as ReviewEventDto,
  ReviewSnapshot as ReviewSnapshotDto,
  ThreadComment,
} from '../../shared/reviews';
import type { User } from '../auth/user.entity';
import type { CommentThread } from './comment-thread.entity';
import type { Comment } from './comment.entity';
import type { ReviewEvent } from './review-event.entity';
import type { ReviewSnapshot } from './review-snapshot.entity';

/** A user as a name with its id. */
export function toPerson(u: User): PersonRef {
  return { id: u.id, name: u.displayName };
}

/** Expects `actor` loaded. */
export function toReviewEventDto(e: ReviewEvent): ReviewEventDto {
  return { id: e.id, from: e.fromState, to: e.toState, reason: e.reason, actor: toPerson(e.actor), note: e.note, at: e.at.toISOString() };
}

/** Expects `clearer` loaded. */
export function toSnapshotDto(s: ReviewSnapshot): ReviewSnapshotDto {
  return {
    id: s.id,
    subjectId: s.subjectId,
    clearedBy: toPerson(s.clearer),
    clearedAt: s.clearedAt.toISOString(),
    pixelSize: s.pixelSize,
    annotations: s.annotations,
    measurements: s.measurements,
  };
}

/** Expects `author` loaded; `names` resolves mentioned user ids (a missing one shows as "a former member"). */
export function toCommentDto(c: Comment, names: ReadonlyMap<string, string>): ThreadComment {
  return {
    id: c.id,
    threadId: c.threadId,
    author: toPerson(c.author),
    body: c.body,
    mentions: c.mentions.map((id) => ({ id, name: names.get(id) ?? 'a former member' })),
    createdAt: c.createdAt.toISOString(),
  };
}

/** Expects `creator`, `resolver` and `comments.author` loaded, comments oldest first. */
export function toThreadDto(t: CommentThread, names: ReadonlyMap<string, string>, anchorPresent: boolean): CommentThreadDto {
  return {
    id: t.id,
    projectId: t.projectId,
    imageId: t.imageId,
    figureId: t.figureId,
    anchor: t.anchor,
    anchorPresent,
    status: t.status,
    createdBy: toPerson(t.creator),
    createdAt: t.createdAt.toISOString(),
    resolvedBy: t.resolver ? toPerson(t.resolver) : null,
    resolvedAt: t.resolvedAt?.toISOString() ?? null,
    comments: t.comments.map((c) => toCommentDto(c, names)),
  };
}
