import type { Point } from '../../../shared/annotations/geometry';
import type { TestLine } from '../../../shared/measurements/patterns';

/** Where a click lands on the test pattern: the line it belongs to and the point on it. Pure. */
export interface SnappedClick {
  line: number;
  point: [number, number];
  /** Distance from the click to the line, image px. */
  distancePx: number;
}

/** The point of a test line nearest to `p` (a segment is clamped to its ends; a circle projects radially). Pure. */
export function nearestPointOn(line: TestLine, p: Point): [number, number] {
  if (line.kind === 'circle') {
    const [cx, cy] = line.centre;
    const [dx, dy] = [p[0] - cx, p[1] - cy];
    const len = Math.hypot(dx, dy);
    if (len === 0) return [cx + line.radius, cy];
    return [cx + (dx / len) * line.radius, cy + (dy / len) * line.radius];
  }
  const [ax, ay] = line.a;
  const [bx, by] = line.b;
  const [vx, vy] = [bx - ax, by - ay];
  const len2 = vx * vx + vy * vy;
  const t = len2 === 0 ? 0 : Math.max(0, Math.min(1, ((p[0] - ax) * vx + (p[1] - ay) * vy) / len2));
  return [ax + t * vx, ay + t * vy];
}

/**
 * Snaps a click to the nearest test line when it lies within `tolerancePx` of one; null when the
 * click is off the pattern. `accept` may refuse points (e.g. outside the chosen band). Pure.
 */
export function snapToTestLine(p: Point, lines: readonly TestLine[], tolerancePx: number, accept: (q: Point) => boolean = () => true): SnappedClick | null {
  let best: SnappedClick | null = null;
  lines.forEach((line, index) => {
    const point = nearestPointOn(line, p);
    const distancePx = Math.hypot(point[0] - p[0], point[1] - p[1]);
    if (distancePx > tolerancePx || (best && best.distancePx <= distancePx) || !accept(point)) return;
    best = { line: index, point, distancePx };
  });
  return best;
}

/** The index of the mark within `tolerancePx` of `p` (the nearest), or -1. Pure. */
export function markNear(p: Point, marks: readonly { x: number; y: number }[], tolerancePx: number): number {
  let found = -1;
  let bestD = Infinity;
  marks.forEach((m, i) => {
    const d = Math.hypot(m.x - p[0], m.y - p[1]);
    if (d <= tolerancePx && d < bestD) [found, bestD] = [i, d];
  });
  return found;
}

/** Line spacing in µm that lays about `count` lines across `acrossPx` with equal gaps (3 significant digits). Pure. */
export function spacingToReach(count: number, acrossPx: number, umPerPx: number): number {
  const raw = (acrossPx / (count + 1)) * umPerPx;
  // Three significant digits at any size (1234.4 µm → 1230 µm).
  return Number(raw.toPrecision(3));
}

/** A straight piece of a counted test line, named by the line it belongs to. */
export interface LineSegment {
  line: number;
  seg: TestLine;
}

/** The straight pieces of test lines as the server counted them (circles arrive as fine polygons). Pure. */
export function pathSegments(paths: readonly { line: number; pieces: readonly (readonly Point[])[] }[]): LineSegment[] {
  return paths.flatMap((path) =>
    path.pieces.flatMap((piece) =>
      piece.slice(1).map((b, i) => ({ line: path.line, seg: { kind: 'segment' as const, a: piece[i]!, b, family: 'angle' as const } })),
    ),
  );
}

/** Like snapToTestLine, over named pieces: the answer names the test line the piece belongs to. Pure. */
export function snapToSegments(p: Point, segments: readonly LineSegment[], tolerancePx: number, accept?: (q: Point) => boolean): SnappedClick | null {
  const hit = snapToTestLine(p, segments.map((s) => s.seg), tolerancePx, accept);
  return hit ? { ...hit, line: segments[hit.line]!.line } : null;
}
