import { distance, type Point } from '../../../shared/annotations/geometry';

/**
 * Turning a dragged pointer path into a compact outline: thin the samples while drawing (a point
 * only when it is far enough from the last one kept), then remove points that add no shape
 * (Ramer–Douglas–Peucker, the textbook line simplification). Distances are in image pixels; the
 * caller converts its screen tolerance with the view's scale. Pure.
 */

/** Default spacing of kept samples, in screen pixels. */
export const FREEHAND_MIN_SPACING_PX = 2;
/** Default simplification tolerance, in screen pixels. */
export const FREEHAND_TOLERANCE_PX = 1;

/** Adds `p` when it lies at least `minSpacing` from the last kept point; returns whether it did. */
export function appendIfApart(path: Point[], p: Point, minSpacing: number): boolean {
  const last = path[path.length - 1];
  if (last && distance(last, p) < minSpacing) return false;
  path.push(p);
  return true;
}

/** The samples of a path with every point at least `minSpacing` from the one kept before it. */
export function thinPath(points: readonly Point[], minSpacing: number): Point[] {
  const kept: Point[] = [];
  for (const p of points) appendIfApart(kept, p, minSpacing);
  return kept;
}

/** Distance from `p` to the segment a-b. */
export function distanceToSegment(p: Point, a: Point, b: Point): number {
  const dx = b[0] - a[0];
  const dy = b[1] - a[1];
  const len2 = dx * dx + dy * dy;
  if (len2 === 0) return distance(p, a);
  const t = Math.max(0, Math.min(1, ((p[0] - a[0]) * dx + (p[1] - a[1]) * dy) / len2));
  return Math.hypot(p[0] - (a[0] + t * dx), p[1] - (a[1] + t * dy));
}

/**
 * Ramer–Douglas–Peucker: keeps the end points and every point that lies farther than `tolerance`
 * from the chord of the stretch it belongs to. Iterative, so long paths do not exhaust the stack.
 */
export function simplifyPath(points: readonly Point[], tolerance: number): Point[] {
  if (points.length < 3) return points.slice();
  const keep = new Uint8Array(points.length);
  keep[0] = 1;
  keep[points.length - 1] = 1;
  const stack: [number, number][] = [[0, points.length - 1]];
  while (stack.length > 0) {
    const [first, last] = stack.pop()!;
    let worst = -1;
    let worstDistance = tolerance;
    for (let i = first + 1; i < last; i++) {
      const d = distanceToSegment(points[i]!, points[first]!, points[last]!);
      if (d > worstDistance) {
        worst = i;
        worstDistance = d;
      }
    }
    if (worst < 0) continue;
    keep[worst] = 1;
    stack.push([first, worst], [worst, last]);
  }
  return points.filter((_, i) => keep[i] === 1);
}

/**
 * A closed outline from a dragged path: thinned, simplified, and without the trailing points
 * that merely return to where the drag started (the ring closes by itself).
 */
export function freehandOutline(points: readonly Point[], minSpacing: number, tolerance: number): Point[] {
  const thin = thinPath(points, minSpacing);
  if (thin.length < 3) return thin;
  // Simplify as a loop: split at the point farthest from the start, so both halves have a real chord.
  const start = thin[0]!;
  let far = 1;
  for (let i = 2; i < thin.length; i++) if (distance(start, thin[i]!) > distance(start, thin[far]!)) far = i;
  const first = simplifyPath(thin.slice(0, far + 1), tolerance);
  const second = simplifyPath([...thin.slice(far), start], tolerance);
  const ring = [...first, ...second.slice(1, -1)];
  while (ring.length > 3 && distance(ring[ring.length - 1]!, start) < minSpacing) ring.pop();
  return ring;
}
