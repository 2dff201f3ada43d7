import { REVIEW_STATE_LABELS, TRANSITION_RULES, type ReviewState, type ReviewTransition } from '../../../shared/review-states';
import type { ReviewEvent, ReviewSnapshot, ThreadAnchor } from '../../../shared/reviews';

/**
 * Words the review screens show: state names, move names, anchors, history lines.
 * Plain functions (no Angular), so test/src can run them under mocha.
 */

/** The state as a short badge text: "Draft", "With reviewers", "Needs changes", "Cleared for publication". */
export function reviewStateLabel(state: ReviewState): string {
  return REVIEW_STATE_LABELS[state];
}

/** One sentence under the badge: what the state means for the people looking at it. */
export function reviewStateHint(state: ReviewState, subject: 'image' | 'figure' = 'image'): string {
  switch (state) {
    case 'draft':
      return 'Not yet handed to the reviewers; edits are free.';
    case 'with_reviewers':
      return 'Waiting for a reviewer to clear it or ask for changes.';
    case 'needs_changes':
      return 'A reviewer asked for changes; submit again once they are made.';
    case 'cleared':
      return subject === 'figure'
        ? 'Fit to publish as it stands. Any edit of the figure, or of the annotations or pixel size of a panel image, puts it back to draft; the cleared export stays below.'
        : 'Fit to publish as it stands. Any edit puts it back to draft.';
  }
}

/** The button text of a move (also its accessible name). */
export function moveLabel(move: ReviewTransition): string {
  return TRANSITION_RULES[move].label;
}

/** The last part of the move's address: …/review/<segment>. */
export function moveSegment(move: ReviewTransition): string {
  return move === 'requestChanges' ? 'request-changes' : move;
}

/** A pixel coordinate as people read it: whole pixels, no minus zero. */
function pixel(value: number): string {
  const rounded = Math.round(value);
  return String(rounded === 0 ? 0 : rounded);
}

/**
 * Where a thread is pinned, in words: "point at 812, 440 px", "region of 5 points around 300, 210 px",
 * "measurement"; on a figure "whole figure" or "panel b" (`panelLetters` gives the figure's letters,
 * a panel without one is named by its place). `present` false adds that the measurement is gone.
 */
export function describeAnchor(anchor: ThreadAnchor, present = true, panelLetters: readonly string[] = []): string {
  switch (anchor.kind) {
    case 'point':
      return `point at ${pixel(anchor.at[0])}, ${pixel(anchor.at[1])} px`;
    case 'region': {
      const n = anchor.ring.length;
      const cx = anchor.ring.reduce((sum, p) => sum + p[0], 0) / Math.max(n, 1);
      const cy = anchor.ring.reduce((sum, p) => sum + p[1], 0) / Math.max(n, 1);
      return `region of ${n} points around ${pixel(cx)}, ${pixel(cy)} px`;
    }
    case 'measurement':
      return present ? 'measurement' : 'measurement (since deleted)';
    case 'figure':
      return 'whole figure';
    case 'panel':
      return panelName(anchor.panel, panelLetters);
  }
}

/** "panel b" for the second panel lettered b; "panel 2" when it has no letter or no longer exists. */
export function panelName(index: number, panelLetters: readonly string[]): string {
  const letter = panelLetters[index]?.trim();
  return `panel ${letter || index + 1}`;
}

/** The centre of an image of `width` × `height` px, as a point anchor. */
export function centreAnchor(width: number, height: number): ThreadAnchor {
  return { kind: 'point', at: [Math.round(width / 2), Math.round(height / 2)] };
}

/** What is wrong with each typed coordinate; null where that one is fine. */
export interface PointProblems {
  x: string | null;
  y: string | null;
}

/** One typed coordinate against the image side it lies along, or why it cannot be used. */
function coordinateProblem(value: number | null, size: number): string | null {
  if (value === null || !Number.isFinite(value)) return 'Give a number of pixels.';
  if (value < 0 || value > size) return `Between 0 and ${size} px.`;
  return null;
}

/** A typed point as an anchor, or the problem of each coordinate (outside the image, missing). */
export function typedPoint(x: number | null, y: number | null, width: number, height: number): ThreadAnchor | PointProblems {
  const problems = { x: coordinateProblem(x, width), y: coordinateProblem(y, height) };
  if (problems.x || problems.y || x === null || y === null) return problems;
  return { kind: 'point', at: [x, y] };
}

/** One history step as a line: "Submitted for review", "Back to draft after an edit", … */
export function historyLine(event: Pick<ReviewEvent, 'reason' | 'to'>): string {
  switch (event.reason) {
    case 'submit':
      return 'Submitted for review';
    case 'requestChanges':
      return 'Changes requested';
    case 'clear':
      return 'Cleared for publication';
    case 'reopen':
      return 'Reopened as a draft';
    case 'edited':
      return `Back to ${reviewStateLabel(event.to).toLowerCase()} after an edit`;
  }
}

/** "1 annotation", "3 measurements", "no annotations". */
export function countOf(n: number, singular: string, plural = `${singular}s`): string {
  return n === 0 ? `no ${plural}` : `${n} ${n === 1 ? singular : plural}`;
}

/** What a clearing froze, in one line: "18 annotations, 2 measurements". */
export function snapshotCounts(snapshot: Pick<ReviewSnapshot, 'annotations' | 'measurements'>): string {
  return `${countOf(snapshot.annotations.length, 'annotation')}, ${countOf(snapshot.measurements.length, 'measurement')}`;
}

/** Why clearing will be refused now, or '' when nothing stands in the way. */
export function clearingBlocker(openThreads: number, subject: 'image' | 'figure' = 'image'): string {
  if (openThreads <= 0) return '';
  return `${countOf(openThreads, 'open thread')} on this ${subject}; resolve ${openThreads === 1 ? 'it' : 'them'} before clearing.`;
}

/** "PNG, 2008 × 1004 px, 170 mm at 300 dpi, 1.2 MB": one kept file, as the cleared list shows it. */
export function clearedFileLine(file: { format: 'png' | 'tiff'; width: number; height: number; widthMm: number; dpi: number; byteSize: number }): string {
  const size = file.byteSize >= 1_000_000 ? `${(file.byteSize / 1_000_000).toFixed(1)} MB` : `${Math.max(1, Math.round(file.byteSize / 1000))} kB`;
  return `${file.format === 'png' ? 'PNG' : 'TIFF'}, ${file.width} × ${file.height} px, ${file.widthMm} mm at ${file.dpi} dpi, ${size}`;
}
