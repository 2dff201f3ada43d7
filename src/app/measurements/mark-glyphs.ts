import type { MarkKind } from '../../../shared/measurements/e112';
import type { TestPath } from '../../../shared/measurements/measurement-records';

/**
 * How test lines and marks are drawn over a micrograph, in image pixels: shared by the measuring page
 * and the field figures of the grain size summary. No Angular, so mocha runs it.
 */

/** A mark as both pages hold it (the shape the server stores). */
export interface DrawnMark {
  x: number;
  y: number;
  kind: MarkKind;
  status: 'confirmed' | 'suggested';
}

/** One SVG shape for a mark: filled by kind when confirmed, a hollow ring when only suggested. */
export type MarkGlyph =
  | { shape: 'circle'; cls: string; cx: number; cy: number; r: number }
  | { shape: 'rect'; cls: string; x: number; y: number; width: number; height: number }
  | { shape: 'polygon'; cls: string; points: string };

/** Mark size in image px: about 6 screen px on a picture some 900 px wide, never below 2 px. Pure. */
export function markRadiusFor(imageWidthPx: number): number {
  return Math.max(2, imageWidthPx / 150);
}

/**
 * The glyph of one mark of radius `r`: crossing a disc, tangent a square, triple point a triangle,
 * line end a diamond; a suggestion a ring (`selected` when it is the one being moved). Pure.
 */
export function markGlyph(m: DrawnMark, r: number, selected = false): MarkGlyph {
  const { x, y } = m;
  if (m.status === 'suggested') return { shape: 'circle', cls: selected ? 'suggestion selected' : 'suggestion', cx: x, cy: y, r };
  switch (m.kind) {
    case 'tangent':
      return { shape: 'rect', cls: 'mark', x: x - r, y: y - r, width: 2 * r, height: 2 * r };
    case 'triple_point':
      return { shape: 'polygon', cls: 'mark triple', points: pointList([[x, y - r * 1.3], [x - r * 1.2, y + r], [x + r * 1.2, y + r]]) };
    case 'line_end':
      return { shape: 'polygon', cls: 'mark end', points: pointList([[x, y - r], [x + r, y], [x, y + r], [x - r, y]]) };
    default:
      return { shape: 'circle', cls: 'mark', cx: x, cy: y, r };
  }
}

/** The counted pieces of laid test lines as SVG `points` strings, one per connected piece. Pure. */
export function pathPolylines(paths: readonly TestPath[]): string[] {
  return paths.flatMap((p) => p.pieces.map((piece) => pointList(piece)));
}

function pointList(points: readonly (readonly [number, number])[]): string {
  return points.map(([x, y]) => `${x},${y}`).join(' ');
}
