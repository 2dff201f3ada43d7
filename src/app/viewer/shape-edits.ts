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

/** Shapes whose vertices can be added and removed: the others have a fixed number of points. */
export const MIN_VERTICES: Partial<Record<AnnotationKind, number>> = { polyline: 2, polygon: 3 };

export function canReshape(kind: AnnotationKind): boolean {
  return MIN_VERTICES[kind] !== undefined;
}

/** The middle of every edge, where a new vertex can be pulled out; a polygon's closing edge included. */
export function edgeMidpoints(kind: AnnotationKind, points: Coordinates): Point[] {
  if (!canReshape(kind)) return [];
  const edges = kind === 'polygon' ? points.length : points.length - 1;
  const mids: Point[] = [];
  for (let i = 0; i < edges; i++) {
    const a = points[i]!;
    const b = points[(i + 1) % points.length]!;
    mids.push([(a[0] + b[0]) / 2, (a[1] + b[1]) / 2]);
  }
  return mids;
}

/** A new vertex on edge `edge` (between vertex `edge` and the next), at `at`. */
export function insertVertex(points: Coordinates, edge: number, at: Point, image: ImageSize): Coordinates {
  const next: Coordinates = points.map(([x, y]) => [x, y]);
  next.splice(edge + 1, 0, clampToImage(at, image));
  return next;
}

/** The shape without vertex `index`, or a reason why it cannot lose one. */
export function removeVertex(kind: AnnotationKind, points: Coordinates, index: number): Coordinates | string {
  const min = MIN_VERTICES[kind];
  if (min === undefined) return 'Only lines and outlines can lose a vertex; this shape has a fixed number of points.';
  if (points.length <= min) {
    return kind === 'polygon'
      ? 'An outline needs at least 3 vertices: delete the shape instead.'
      : 'A line needs at least 2 vertices: delete the shape instead.';
  }
  return points.filter((_, i) => i !== index).map(([x, y]) => [x, y]);
}

/** Whether two coordinate lists are the same point for point. */
export function samePoints(a: Coordinates, b: Coordinates): boolean {
  return a.length === b.length && a.every((p, i) => p[0] === b[i]![0] && p[1] === b[i]![1]);
}
