import type { AnnotationKind, Coordinates } from '../../../shared/annotations/annotations';
import type { Point } from '../../../shared/annotations/geometry';
import type { ImageSize } from '../../../shared/viewer/viewport';
import { boundsOf } from './hit-test';

/**
 * Moving shapes and their vertices with the select tool, kept on the image (the server refuses
 * points outside it). Pure: each returns new coordinates and leaves its input alone.
 */

/** The point, moved onto the image if it lies off it. */
export function clampToImage(p: Point, image: ImageSize): [number, number] {
  return [Math.min(image.width, Math.max(0, p[0])), Math.min(image.height, Math.max(0, p[1]))];
}

/** The whole shape shifted by (dx, dy), the shift shortened so that no point leaves the image. */
export function translateShape(points: Coordinates, dx: number, dy: number, image: ImageSize): Coordinates {
  const b = boundsOf(points);
  const sx = Math.min(image.width - b.maxX, Math.max(-b.minX, dx));
  const sy = Math.min(image.height - b.maxY, Math.max(-b.minY, dy));
  return points.map(([x, y]) => [x + sx, y + sy]);
}

/**
 * One vertex dragged to `to`. A rectangle stays a rectangle: the opposite corner holds still and
 * the two neighbours follow, with corners kept in the order they had.
 */
export function moveVertex(kind: AnnotationKind, points: Coordinates, index: number, to: Point, image: ImageSize): Coordinates {
  const p = clampToImage(to, image);
  if (kind === 'rectangle' && points.length === 4) {
    const next = points.map(([x, y]) => [x, y] as [number, number]);
    const opposite = points[(index + 2) % 4]!;
    next[index] = p;
    // Neighbours share x with one corner and y with the other: which is which follows from the
    // edge they lie on before the move (corners go round the rectangle).
    const before = (index + 3) % 4;
    const after = (index + 1) % 4;
    const sharesX = (i: number) => points[i]![0] === points[index]![0];
    next[before] = sharesX(before) ? [p[0], opposite[1]] : [opposite[0], p[1]];
    next[after] = sharesX(after) ? [p[0], opposite[1]] : [opposite[0], p[1]];
    return next;
  }
  return points.map((q, i) => (i === index ? p : [q[0], q[1]]));
}

/** Whether two coordinate lists are the same point for point. */
export function samePoints(a: Coordinates, b: Coordinates): boolean {
  return a.length === b.length && a.every((p, i) => p[0] === b[i]![0] && p[1] === b[i]![1]);
}
