/**
 * Plane geometry of annotations, in full-resolution image pixels. Lengths and areas
 * become µm by the pixel size (square pixels assumed unless x and y are given apart).
 */
export type Point = readonly [number, number];

export function distance(a: Point, b: Point): number {
  return Math.hypot(b[0] - a[0], b[1] - a[1]);
}

/** Length of an open polyline. */
export function polylineLength(points: readonly Point[]): number {
  let sum = 0;
  for (let i = 1; i < points.length; i++) sum += distance(points[i - 1]!, points[i]!);
  return sum;
}

/** Perimeter of a closed ring (the closing edge included; do not repeat the first point). */
export function ringPerimeter(ring: readonly Point[]): number {
  return ring.length < 2 ? 0 : polylineLength(ring) + distance(ring[ring.length - 1]!, ring[0]!);
}

/** Signed shoelace area: positive for counter-clockwise in a y-up frame (clockwise on screen, y down). */
export function signedArea(ring: readonly Point[]): number {
  let twice = 0;
  for (let i = 0; i < ring.length; i++) {
    const [x1, y1] = ring[i]!;
    const [x2, y2] = ring[(i + 1) % ring.length]!;
    twice += x1 * y2 - x2 * y1;
  }
  return twice / 2;
}

export function ringArea(ring: readonly Point[]): number {
  return Math.abs(signedArea(ring));
}

/** Angle at `vertex` between the rays to `a` and `b`, degrees in [0, 180]. */
export function angleDeg(a: Point, vertex: Point, b: Point): number {
  const v1 = [a[0] - vertex[0], a[1] - vertex[1]];
  const v2 = [b[0] - vertex[0], b[1] - vertex[1]];
  const cos = (v1[0]! * v2[0]! + v1[1]! * v2[1]!) / (Math.hypot(v1[0]!, v1[1]!) * Math.hypot(v2[0]!, v2[1]!));
  return (Math.acos(Math.min(1, Math.max(-1, cos))) * 180) / Math.PI;
}

function orientation(p: Point, q: Point, r: Point): number {
  const v = (q[1] - p[1]) * (r[0] - q[0]) - (q[0] - p[0]) * (r[1] - q[1]);
  return Math.abs(v) < 1e-12 ? 0 : v > 0 ? 1 : 2;
}

function onSegment(p: Point, q: Point, r: Point): boolean {
  return Math.min(p[0], r[0]) <= q[0] && q[0] <= Math.max(p[0], r[0]) && Math.min(p[1], r[1]) <= q[1] && q[1] <= Math.max(p[1], r[1]);
}

/** Whether segments p1-q1 and p2-q2 touch or cross (textbook orientation test). */
export function segmentsIntersect(p1: Point, q1: Point, p2: Point, q2: Point): boolean {
  const o1 = orientation(p1, q1, p2);
  const o2 = orientation(p1, q1, q2);
  const o3 = orientation(p2, q2, p1);
  const o4 = orientation(p2, q2, q1);
  if (o1 !== o2 && o3 !== o4) return true;
  return (o1 === 0 && onSegment(p1, p2, q1)) || (o2 === 0 && onSegment(p1, q2, q1)) || (o3 === 0 && onSegment(p2, p1, q2)) || (o4 === 0 && onSegment(p2, q1, q2));
}

/** True when two non-adjacent edges of the closed ring touch or cross. O(n²), fine for hand-drawn outlines. */
export function ringSelfIntersects(ring: readonly Point[]): boolean {
  const n = ring.length;
  for (let i = 0; i < n; i++) {
    for (let j = i + 1; j < n; j++) {
      const adjacent = j === i + 1 || (i === 0 && j === n - 1);
      if (adjacent) continue;
      if (segmentsIntersect(ring[i]!, ring[(i + 1) % n]!, ring[j]!, ring[(j + 1) % n]!)) return true;
    }
  }
  return false;
}

/** Why an outline cannot be an area, or null when it can. */
export function ringProblem(ring: readonly Point[]): string | null {
  const distinct = new Set(ring.map((p) => `${p[0]},${p[1]}`));
  if (distinct.size < 3) return 'An outline needs at least three distinct points.';
  const [a, b] = [ring[0]!, ring.find((p) => p[0] !== ring[0]![0] || p[1] !== ring[0]![1])!];
  if (ring.every((p) => orientation(a, b, p) === 0)) return 'The outline encloses no area (all points lie on one line).';
  if (ringSelfIntersects(ring)) return 'The outline crosses itself; redraw it so its edges do not cross.';
  return null;
}
