import type { AnnotationKind } from '../../../shared/annotations/annotations';
import { distance, type Point } from '../../../shared/annotations/geometry';
import { distanceToSegment } from './freehand';

/**
 * Which shape is under the pointer, found in image pixels without a hit canvas, so the shape
 * layer can stay `listening(false)` with thousands of shapes. Pure.
 */

export interface Bounds {
  minX: number;
  minY: number;
  maxX: number;
  maxY: number;
}

export interface HitTarget {
  key: string;
  kind: AnnotationKind;
  points: readonly Point[];
  label: string;
  bounds: Bounds;
}

/** Screen pixels: how near the pointer must come to a line or a vertex handle. */
export const HIT_TOLERANCE_PX = 6;
/** Screen pixels: the drawn radius of a point marker. */
export const POINT_RADIUS_PX = 5;
/** Screen pixels: the approximate box of a note's text, drawn to the right of and above its pin. */
export const NOTE_CHAR_WIDTH_PX = 7;
export const NOTE_HEIGHT_PX = 18;
export const NOTE_MAX_CHARS = 48;

export function boundsOf(points: readonly Point[]): Bounds {
  let minX = Infinity;
  let minY = Infinity;
  let maxX = -Infinity;
  let maxY = -Infinity;
  for (const [x, y] of points) {
    if (x < minX) minX = x;
    if (y < minY) minY = y;
    if (x > maxX) maxX = x;
    if (y > maxY) maxY = y;
  }
  return { minX, minY, maxX, maxY };
}

export function boundsIntersect(a: Bounds, b: Bounds): boolean {
  return a.minX <= b.maxX && b.minX <= a.maxX && a.minY <= b.maxY && b.minY <= a.maxY;
}

export function growBounds(b: Bounds, by: number): Bounds {
  return { minX: b.minX - by, minY: b.minY - by, maxX: b.maxX + by, maxY: b.maxY + by };
}

/** Even-odd ray casting: whether `p` lies inside the closed ring. */
export function pointInRing(p: Point, ring: readonly Point[]): boolean {
  let inside = false;
  for (let i = 0, j = ring.length - 1; i < ring.length; j = i++) {
    const [xi, yi] = ring[i]!;
    const [xj, yj] = ring[j]!;
    if (yi > p[1] !== yj > p[1] && p[0] < ((xj - xi) * (p[1] - yi)) / (yj - yi) + xi) inside = !inside;
  }
  return inside;
}

/** Distance from `p` to the nearest edge; closing edge included for rings. */
export function distanceToPath(p: Point, points: readonly Point[], closed: boolean): number {
  if (points.length === 1) return distance(p, points[0]!);
  let best = Infinity;
  const n = closed ? points.length : points.length - 1;
  for (let i = 0; i < n; i++) best = Math.min(best, distanceToSegment(p, points[i]!, points[(i + 1) % points.length]!));
  return best;
}

const isOutline = (kind: AnnotationKind) => kind === 'polygon' || kind === 'rectangle';

/** Whether `p` touches the shape; `unit` is image pixels per screen pixel. */
export function hitsShape(t: HitTarget, p: Point, unit: number): boolean {
  const tol = HIT_TOLERANCE_PX * unit;
  if (t.kind === 'text') {
    const [x, y] = t.points[0]!;
    const width = Math.min(t.label.length, NOTE_MAX_CHARS) * NOTE_CHAR_WIDTH_PX * unit + 2 * POINT_RADIUS_PX * unit;
    const inBox = p[0] >= x - tol && p[0] <= x + width && p[1] >= y - NOTE_HEIGHT_PX * unit - tol && p[1] <= y + tol;
    return inBox || distance(p, [x, y]) <= POINT_RADIUS_PX * unit + tol;
  }
  if (t.kind === 'point') return distance(p, t.points[0]!) <= POINT_RADIUS_PX * unit + tol;
  if (!boundsIntersect(growBounds(t.bounds, tol), { minX: p[0], minY: p[1], maxX: p[0], maxY: p[1] })) return false;
  if (isOutline(t.kind) && pointInRing(p, t.points)) return true;
  return distanceToPath(p, t.points, isOutline(t.kind)) <= tol;
}

/**
 * The topmost shape under `p`: later shapes are drawn over earlier ones, so the search runs
 * backwards. Lines and points win over the inside of an outline they lie in, so small marks
 * inside a large region stay selectable.
 */
export function topmostHit(targets: readonly HitTarget[], p: Point, unit: number): string | null {
  let inside: string | null = null;
  for (let i = targets.length - 1; i >= 0; i--) {
    const t = targets[i]!;
    if (!hitsShape(t, p, unit)) continue;
    const onEdge = !isOutline(t.kind) || distanceToPath(p, t.points, true) <= HIT_TOLERANCE_PX * unit;
    if (onEdge) return t.key;
    inside ??= t.key;
  }
  return inside;
}

/** Index of the vertex within the handle tolerance of `p` (the nearest one), or -1. */
export function nearestVertex(points: readonly Point[], p: Point, unit: number): number {
  let best = -1;
  let bestDistance = (HIT_TOLERANCE_PX + 2) * unit;
  points.forEach((q, i) => {
    const d = distance(p, q);
    if (d <= bestDistance) {
      best = i;
      bestDistance = d;
    }
  });
  return best;
}
