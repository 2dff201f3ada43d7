import type { EntityManager } from 'typeorm';
import { recordActivity } from '../activity/record-activity';
import { notify, subjectFacts } from '../notifications/notify';
import { involvedInReview } from './involved';
import { ReviewEvent } from './review-event.entity';
import type { ReviewSubject } from './review-subject';

/** The parts of an image a review covers, as the editing services name them in sentences. */
export type ReviewedPart = 'the pixel size' | 'the annotations' | 'the measurements';

/**
 * Call from every service that edits what a review covers (pixel size, annotations, measurements),
 * with the manager of the edit's transaction: a cleared image no longer is what was cleared, so it
 * goes back to draft, the move is recorded, and everyone involved is told. `what` names the change
 * for people, e.g. "the pixel size" or "the annotations". Images that are not cleared are left alone.
 * Cleared figures whose panels draw what changed go back to draft the same way (see
 * `returnFiguresShowingImage`).
 *
 * The review row is locked first whatever its state, so an edit and a reviewer clearing the image
 * at the same moment are ordered: either the snapshot sees the edit, or the edit reopens the image.
 * Returns whether the image went back to draft.
 */
export async function returnToDraftIfCleared(m: EntityManager, imageId: string, actorId: string, what: ReviewedPart, options = { figures: true }): Promise<boolean> {
  // A caller that knows better which figures changed (a class change) passes figures: false.
  if (options.figures) await returnFiguresShowingImage(m, imageId, actorId, what);
  const [review]: { project_id: string; state: string }[] = await m.query(
    `SELECT project_id, state FROM review_states WHERE subject_type = 'image' AND subject_id = $1 FOR UPDATE`,
    [imageId],
  );
  if (review?.state !== 'cleared') return false;
  const note = `changed ${what}`;
  await backToDraft(m, { type: 'image', id: imageId }, review.project_id, actorId, note, `${note} after the image was cleared; it is a draft again`);
  return true;
}

/**
 * A cleared figure whose panels draw what changed on `imageId` goes back to draft: a new pixel size
 * changes every panel's scale bar; annotations change only panels that draw some annotation class;
 * measurements are not drawn, so they change no figure. A deleted image takes every panel showing it.
 * The figures' review rows are locked in a fixed order (by id), so two edits cannot deadlock, and a
 * figure being cleared at this moment is ordered with the edit as an image is.
 */
export async function returnFiguresShowingImage(m: EntityManager, imageId: string, actorId: string, change: ReviewedPart | 'deleted'): Promise<string[]> {
  if (change === 'the measurements') return [];
  const drawsAnnotations = change === 'the annotations';
  const rows: { subject_id: string; project_id: string; state: string; title: string; image_name: string | null }[] = await m.query(
    `SELECT r.subject_id, r.project_id, r.state, f.title,
            (SELECT original_name FROM images WHERE id = $1) AS image_name
       FROM review_states r JOIN figures f ON f.id = r.figure_id
      WHERE r.subject_type = 'figure'
        AND EXISTS (SELECT 1 FROM jsonb_array_elements(f.spec->'panels') p
                     WHERE p->>'imageId' = $1::text AND (NOT $2::boolean OR jsonb_array_length(p->'classIds') > 0))
      ORDER BY r.subject_id
      FOR UPDATE OF r`,
    [imageId, drawsAnnotations],
  );
  const returned: string[] = [];
  for (const row of rows.filter((r) => r.state === 'cleared')) {
    const image = row.image_name ?? 'a panel image';
    const note = change === 'deleted' ? `deleted ${image}, shown in a panel` : `changed ${change} of ${image}, shown in a panel`;
    await backToDraft(m, { type: 'figure', id: row.subject_id }, row.project_id, actorId, note, `${note}, after the figure “${row.title}” was cleared; it is a draft again`);
    returned.push(row.subject_id);
  }
  return returned;
}

/**
 * A change to an annotation class (its name or colour, or its deletion) changes every figure panel that
 * draws the class: shape colours and legend text. Cleared figures with such a panel go back to draft.
 * `onImages` narrows it to panels showing those images (a class that takes over moved shapes changes only
 * panels of images that had some). `change` names it for people, e.g. "renamed the annotation class “A” to “B”".
 * Review rows are locked by id, as `returnFiguresShowingImage` does.
 */
export async function returnFiguresDrawingClass(m: EntityManager, classId: string, actorId: string, change: string, onImages: readonly string[] | null = null): Promise<string[]> {
  const rows: { subject_id: string; project_id: string; state: string; title: string }[] = await m.query(
    `SELECT r.subject_id, r.project_id, r.state, f.title
       FROM review_states r JOIN figures f ON f.id = r.figure_id
      WHERE r.subject_type = 'figure'
        AND EXISTS (SELECT 1 FROM jsonb_array_elements(f.spec->'panels') p
                     WHERE p->'classIds' @> jsonb_build_array($1::text)
                       AND ($2::text[] IS NULL OR p->>'imageId' = ANY($2::text[])))
      ORDER BY r.subject_id
      FOR UPDATE OF r`,
    [classId, onImages],
  );
  const returned: string[] = [];
  for (const row of rows.filter((r) => r.state === 'cleared')) {
    const note = `${change}, drawn in a panel`;
    await backToDraft(m, { type: 'figure', id: row.subject_id }, row.project_id, actorId, note, `${note}, after the figure “${row.title}” was cleared; it is a draft again`);
    returned.push(row.subject_id);
  }
  return returned;
}

/** An edit of a cleared figure's own definition (layout, panels, print size) returns it to draft. */
export async function returnFigureToDraftIfCleared(m: EntityManager, figureId: string, actorId: string): Promise<boolean> {
  const [review]: { project_id: string; state: string; title: string }[] = await m.query(
    `SELECT r.project_id, r.state, f.title FROM review_states r JOIN figures f ON f.id = r.figure_id
      WHERE r.subject_type = 'figure' AND r.subject_id = $1 FOR UPDATE OF r`,
    [figureId],
  );
  if (review?.state !== 'cleared') return false;
  const note = 'changed the figure';
  await backToDraft(m, { type: 'figure', id: figureId }, review.project_id, actorId, note, `${note} “${review.title}” after it was cleared; it is a draft again`);
  return true;
}

/** The move itself, on a locked cleared row: state, review history, project history, and word to everyone involved. */
async function backToDraft(m: EntityManager, subject: ReviewSubject, projectId: string, actorId: string, note: string, summary: string): Promise<void> {
  await m.query(
    `UPDATE review_states SET state = 'draft', updated_by = $3, updated_at = clock_timestamp() WHERE subject_type = $1 AND subject_id = $2`,
    [subject.type, subject.id, actorId],
  );
  await m.insert(ReviewEvent, { subjectType: subject.type, subjectId: subject.id, projectId, fromState: 'cleared', toState: 'draft', reason: 'edited', actorId, note });
  await recordActivity(m, {
    projectId,
    imageId: subject.type === 'image' ? subject.id : null,
    actorId,
    action: 'review.state_changed',
    summary,
    details: { from: 'cleared', to: 'draft', reason: 'edited', ...(subject.type === 'figure' ? { figureId: subject.id } : {}) },
  });
  const facts = { ...(await subjectFacts(m, subject, actorId)), note };
  await notify(m, { kind: 'returned_to_draft', recipientIds: await involvedInReview(m, subject), actorId, projectId, subject, facts });
}
