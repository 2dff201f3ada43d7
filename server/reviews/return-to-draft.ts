import type { EntityManager } from 'typeorm';
import { recordActivity } from '../activity/record-activity';
import { imageFacts, notify } from '../notifications/notify';
import { involvedInReview } from './involved';
import { ReviewEvent } from './review-event.entity';

/**
 * Call from every service that edits what a review covers (pixel size, annotations, measurements),
 * with the manager of the edit's transaction: a cleared image no longer is what was cleared, so it
 * goes back to draft, the move is recorded, and everyone involved is told. `what` names the change
 * for people, e.g. "the pixel size" or "an annotation". Images that are not cleared are left alone.
 *
 * The review row is locked first whatever its state, so an edit and a reviewer clearing the image
 * at the same moment are ordered: either the snapshot sees the edit, or the edit reopens the image.
 * Returns whether the image went back to draft.
 */
export async function returnToDraftIfCleared(m: EntityManager, imageId: string, actorId: string, what: string): Promise<boolean> {
  const [review]: { project_id: string; state: string }[] = await m.query(
    `SELECT project_id, state FROM review_states WHERE subject_type = 'image' AND subject_id = $1 FOR UPDATE`,
    [imageId],
  );
  if (review?.state !== 'cleared') return false;
  const projectId = review.project_id;
  await m.query(
    `UPDATE review_states SET state = 'draft', updated_by = $2, updated_at = clock_timestamp() WHERE subject_type = 'image' AND subject_id = $1`,
    [imageId, actorId],
  );
  const note = `changed ${what}`;
  await m.insert(ReviewEvent, { subjectType: 'image', subjectId: imageId, projectId, fromState: 'cleared', toState: 'draft', reason: 'edited', actorId, note });
  await recordActivity(m, {
    projectId,
    imageId,
    actorId,
    action: 'review.state_changed',
    summary: `${note} after the image was cleared; it is a draft again`,
    details: { from: 'cleared', to: 'draft', reason: 'edited' },
  });
  const facts = { ...(await imageFacts(m, imageId, actorId)), note };
  await notify(m, { kind: 'returned_to_draft', recipientIds: await involvedInReview(m, imageId), actorId, projectId, imageId, facts });
  return true;
}
