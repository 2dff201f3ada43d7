import type { Point } from '../annotations/geometry';

/**
 * E112 test patterns laid over an image, in full-resolution image pixels. Sizes are given
 * in µm on the specimen and turned into pixels with the image's pixel size.
 */
export type PatternSpec =
  | { type: 'lines'; direction: 'horizontal' | 'vertical' | 'both' | 'angle'; angleDeg?: number; spacingUm: number; count: number; marginUm?: number }
  | { type: 'circle'; diameterUm: number; centre?: Point }
  | { type: 'three_circles'; largestDiameterUm: number; centre?: Point };

/** A test line: a straight segment or a circle (approximated by `segments` for drawing and clipping). */
export type TestLine =
  | { kind: 'segment'; a: Point; b: Point; family: 'horizontal' | 'vertical' | 'angle' }
  | { kind: 'circle'; centre: Point; radius: number };

export const THREE_CIRCLE_RATIOS = [1, 2 / 3, 1 / 3] as const; // diameters 3 : 2 : 1 (E112 three-circle pattern)

/** The test lines of a pattern over a `width` × `height` image at `umPerPx`. */
export function patternLines(spec: PatternSpec, width: number, height: number, umPerPx: number): TestLine[] {
  const centre: Point = [width / 2, height / 2];
  if (spec.type === 'circle') return [{ kind: 'circle', centre: spec.centre ?? centre, radius: spec.diameterUm / umPerPx / 2 }];
  if (spec.type === 'three_circles') {
    return THREE_CIRCLE_RATIOS.map((r) => ({ kind: 'circle' as const, centre: spec.centre ?? centre, radius: (spec.largestDiameterUm * r) / umPerPx / 2 }));
  }
  const spacing = spec.spacingUm / umPerPx;
  const margin = (spec.marginUm ?? 0) / umPerPx;
  const lines: TestLine[] = [];
  const family = (dir: 'horizontal' | 'vertical') => {
    const across = dir === 'horizontal' ? height : width;
    const first = across / 2 - ((spec.count - 1) * spacing) / 2;
    for (let i = 0; i < spec.count; i++) {
      const c = first + i * spacing;
      if (c < 0 || c > across) continue;
      lines.push(
        dir === 'horizontal'
          ? { kind: 'segment', a: [margin, c], b: [width - margin, c], family: 'horizontal' }
          : { kind: 'segment', a: [c, margin], b: [c, height - margin], family: 'vertical' },
      );
    }
  };
  if (spec.direction === 'horizontal' || spec.direction === 'both') family('horizontal');
  if (spec.direction === 'vertical' || spec.direction === 'both') family('vertical');
  if (spec.direction === 'angle') {
    const theta = ((spec.angleDeg ?? 45) * Math.PI) / 180;
    const [dx, dy] = [Math.cos(theta), Math.sin(theta)];
    const [nx, ny] = [-dy, dx];
    const half = Math.hypot(width, height) / 2;
    for (let i = 0; i < spec.count; i++) {
      const off = (i - (spec.count - 1) / 2) * spacing;
      const mid: Point = [centre[0] + nx * off, centre[1] + ny * off];
      const clipped = clipToRect([mid[0] - dx * half, mid[1] - dy * half], [mid[0] + dx * half, mid[1] + dy * half], width, height);
      if (clipped) lines.push({ kind: 'segment', a: clipped[0], b: clipped[1], family: 'angle' });
    }
  }
  return lines;
}

/** Circle as a closed polyline of `n` points (for clipping against bands and regions). */
export function circlePoints(centre: Point, radius: number, n = 720): Point[] {
  return Array.from({ length: n + 1 }, (_, i) => [centre[0] + radius * Math.cos((2 * Math.PI * i) / n), centre[1] + radius * Math.sin((2 * Math.PI * i) / n)] as const);
}

/** Liang-Barsky clipping of a segment to the image rectangle; null when it misses. */
export function clipToRect(a: Point, b: Point, width: number, height: number): [Point, Point] | null {
  let [t0, t1] = [0, 1];
  const [dx, dy] = [b[0] - a[0], b[1] - a[1]];
  const edges: [number, number][] = [[-dx, a[0]], [dx, width - a[0]], [-dy, a[1]], [dy, height - a[1]]];
  for (const [p, q] of edges) {
    if (p === 0) {
      if (q < 0) return null;
      continue;
    }
    const r = q / p;
    if (p < 0) t0 = Math.max(t0, r);
    else t1 = Math.min(t1, r);
    if (t0 > t1) return null;
  }
  return [[a[0] + t0 * dx, a[1] + t0 * dy], [a[0] + t1 * dx, a[1] + t1 * dy]];
}

/** Spacing that puts `count` lines across the image with equal gaps (for "reach a target count"). */
export function spacingForCount(count: number, acrossPx: number, umPerPx: number): number {
  return (acrossPx / (count + 1)) * umPerPx;
}

/** Whether a point lies inside a closed ring (even-odd rule; the ring is not repeated at its end). */
export function pointInRing(p: Point, ring: readonly Point[]): boolean {
  let inside = false;
  for (let i = 0, j = ring.length - 1; i < ring.length; j = i++) {
    const [xi, yi] = ring[i]!;
    const [xj, yj] = ring[j]!;
    if (yi > p[1] !== yj > p[1] && p[0] < xj + ((p[1] - yj) / (yi - yj)) * (xi - xj)) inside = !inside;
  }
  return inside;
}

/**
 * The parts of a segment inside an outline (a region drawn as a polygon or rectangle): split at
 * every crossing with an edge, keep the pieces whose midpoints lie inside. Exact for straight edges.
 */
export function clipSegmentToRing(a: Point, b: Point, ring: readonly Point[]): [Point, Point][] {
  const [dx, dy] = [b[0] - a[0], b[1] - a[1]];
  const ts = [0, 1];
  for (let i = 0; i < ring.length; i++) {
    const p = ring[i]!;
    const q = ring[(i + 1) % ring.length]!;
    const [ex, ey] = [q[0] - p[0], q[1] - p[1]];
    const denom = dx * ey - dy * ex;
    if (denom === 0) continue; // parallel: a collinear overlap adds no crossing
    const t = ((p[0] - a[0]) * ey - (p[1] - a[1]) * ex) / denom;
    const u = ((p[0] - a[0]) * dy - (p[1] - a[1]) * dx) / denom;
    if (t > 0 && t < 1 && u >= 0 && u <= 1) ts.push(t);
  }
  ts.sort((x, y) => x - y);
  const at = (t: number): Point => [a[0] + t * dx, a[1] + t * dy];
  const pieces: [Point, Point][] = [];
  for (let i = 1; i < ts.length; i++) {
    const [t0, t1] = [ts[i - 1]!, ts[i]!];
    if (t1 - t0 < 1e-12 || !pointInRing(at((t0 + t1) / 2), ring)) continue;
    const last = pieces[pieces.length - 1];
    if (last && Math.abs(last[1][0] - at(t0)[0]) < 1e-9 && Math.abs(last[1][1] - at(t0)[1]) < 1e-9) last[1] = at(t1);
    else pieces.push([at(t0), at(t1)]);
  }
  return pieces;
}
