import { polylineLength, type Point } from '../annotations/geometry';
import { fieldStatistics } from './statistics';

/**
 * Layer bands of a laminate from its bond-interface lines. Interfaces run along the rolling
 * direction, so each is treated as a function across the image's long axis of the lines
 * (x for lines that run left-right, y for lines that run top-bottom); a line is extended flat past its ends.
 */
export type Axis = 'x' | 'y';

/** The axis the interfaces run along: the one over which their points spread most. */
export function interfaceAxis(lines: readonly (readonly Point[])[]): Axis {
  let dx = 0;
  let dy = 0;
  for (const l of lines) {
    const span = (k: 0 | 1) => l.reduce((a, p) => Math.max(a, p[k]), -Infinity) - l.reduce((a, p) => Math.min(a, p[k]), Infinity);
    dx += span(0);
    dy += span(1);
  }
  return dx >= dy ? 'x' : 'y';
}

/** A line as (u, v) pairs: u along the axis, v across it, sorted by u. */
function asFunction(line: readonly Point[], axis: Axis): [number, number][] {
  const uv = line.map((p) => (axis === 'x' ? [p[0], p[1]] : [p[1], p[0]]) as [number, number]);
  return uv.sort((a, b) => a[0] - b[0]);
}

/** v of a line at u, interpolated between vertices and held flat past the ends. */
export function lineAt(fn: readonly [number, number][], u: number): number {
  if (u <= fn[0]![0]) return fn[0]![1];
  const last = fn[fn.length - 1]!;
  if (u >= last[0]) return last[1];
  for (let i = 1; i < fn.length; i++) {
    const [u1, v1] = fn[i]!;
    if (u <= u1) {
      const [u0, v0] = fn[i - 1]!;
      return u1 === u0 ? v1 : v0 + ((u - u0) / (u1 - u0)) * (v1 - v0);
    }
  }
  return last[1];
}

export interface LayerBand {
  /** 1-based, from the image's top (or left) edge. */
  number: number;
  /** The interface above (before) and below (after) the band; null at the image edge. */
  upper: [number, number][] | null;
  lower: [number, number][] | null;
}

/** Bands between consecutive interfaces, plus the bands beyond the first and the last, ordered across the axis. */
export function layerBands(lines: readonly (readonly Point[])[], axis: Axis = interfaceAxis(lines)): LayerBand[] {
  const fns = lines.map((l) => asFunction(l, axis));
  const meanV = (fn: [number, number][]) => fn.reduce((a, p) => a + p[1], 0) / fn.length;
  fns.sort((a, b) => meanV(a) - meanV(b));
  const bands: LayerBand[] = [];
  for (let i = 0; i <= fns.length; i++) bands.push({ number: i + 1, upper: fns[i - 1] ?? null, lower: fns[i] ?? null });
  return bands;
}

/** Whether an image point lies inside a band. */
export function inBand(band: LayerBand, p: Point, axis: Axis): boolean {
  const [u, v] = axis === 'x' ? p : [p[1], p[0]];
  return (band.upper === null || v >= lineAt(band.upper, u)) && (band.lower === null || v <= lineAt(band.lower, u));
}

/**
 * The parts of a straight test segment that lie inside a band, as sub-segments.
 * Exact for polylines: inside each piece between breakpoints both distances are linear.
 */
export function clipSegmentToBand(a: Point, b: Point, band: LayerBand, axis: Axis): [Point, Point][] {
  const at = (t: number): Point => [a[0] + t * (b[0] - a[0]), a[1] + t * (b[1] - a[1])];
  const uOf = (p: Point) => (axis === 'x' ? p[0] : p[1]);
  const breaks = new Set<number>([0, 1]);
  const du = uOf(b) - uOf(a);
  for (const fn of [band.upper, band.lower]) {
    if (!fn || du === 0) continue;
    for (const [u] of fn) {
      const t = (u - uOf(a)) / du;
      if (t > 0 && t < 1) breaks.add(t);
    }
  }
  const ts = [...breaks].sort((x, y) => x - y);
  // Within each piece, find where the segment crosses either interface and split there too.
  const margin = (t: number) => {
    const p = at(t);
    const [u, v] = axis === 'x' ? p : [p[1], p[0]];
    return Math.min(band.upper ? v - lineAt(band.upper, u) : Infinity, band.lower ? lineAt(band.lower, u) - v : Infinity);
  };
  const cuts: number[] = [];
  for (let i = 1; i < ts.length; i++) {
    const [t0, t1] = [ts[i - 1]!, ts[i]!];
    cuts.push(t0);
    for (const fn of [band.upper, band.lower]) {
      if (!fn) continue;
      const side = (t: number) => {
        const p = at(t);
        const [u, v] = axis === 'x' ? p : [p[1], p[0]];
        return v - lineAt(fn, u);
      };
      const [s0, s1] = [side(t0), side(t1)];
      if (s0 * s1 < 0) cuts.push(t0 + (s0 / (s0 - s1)) * (t1 - t0));
    }
  }
  cuts.push(1);
  cuts.sort((x, y) => x - y);
  const inside: [Point, Point][] = [];
  for (let i = 1; i < cuts.length; i++) {
    const [t0, t1] = [cuts[i - 1]!, cuts[i]!];
    if (t1 - t0 < 1e-12 || margin((t0 + t1) / 2) < 0) continue;
    const last = inside[inside.length - 1];
    if (last && Math.abs(last[1][0] - at(t0)[0]) < 1e-9 && Math.abs(last[1][1] - at(t0)[1]) < 1e-9) last[1] = at(t1);
    else inside.push([at(t0), at(t1)]);
  }
  return inside;
}

/** Shortest distance from a point to a polyline. */
export function distanceToPolyline(p: Point, line: readonly Point[]): number {
  let best = Infinity;
  for (let i = 1; i < line.length; i++) {
    const [a, b] = [line[i - 1]!, line[i]!];
    const [dx, dy] = [b[0] - a[0], b[1] - a[1]];
    const len2 = dx * dx + dy * dy;
    const t = len2 === 0 ? 0 : Math.max(0, Math.min(1, ((p[0] - a[0]) * dx + (p[1] - a[1]) * dy) / len2));
    best = Math.min(best, Math.hypot(p[0] - (a[0] + t * dx), p[1] - (a[1] + t * dy)));
  }
  return best;
}

/** Points along a polyline every `spacing` (same units), starting at its first vertex. */
export function samplesAlong(line: readonly Point[], spacing: number): Point[] {
  if (!(spacing > 0)) throw new RangeError('The sampling spacing must be above 0.');
  const out: Point[] = [line[0]!];
  let carried = 0;
  for (let i = 1; i < line.length; i++) {
    const [a, b] = [line[i - 1]!, line[i]!];
    const len = Math.hypot(b[0] - a[0], b[1] - a[1]);
    let d = spacing - carried;
    while (d <= len) {
      out.push([a[0] + ((b[0] - a[0]) * d) / len, a[1] + ((b[1] - a[1]) * d) / len]);
      d += spacing;
    }
    carried = len - (d - spacing);
  }
  return out;
}

export interface ThicknessProfile {
  /** Local thickness at each sample, µm. */
  samplesUm: number[];
  meanUm: number;
  sUm: number;
  minUm: number;
  maxUm: number;
}

/**
 * Local thickness of the layer between two interfaces: from points every `spacingUm` along the
 * first line, the perpendicular (shortest) distance to the second. Lengths in µm via `umPerPx`.
 */
export function layerThickness(first: readonly Point[], second: readonly Point[], umPerPx: number, spacingUm: number): ThicknessProfile {
  if (polylineLength(first) === 0 || polylineLength(second) === 0) throw new RangeError('Both interfaces need a length.');
  const samplesUm = samplesAlong(first, spacingUm / umPerPx).map((p) => distanceToPolyline(p, second) * umPerPx);
  const stats = samplesUm.length >= 2 ? fieldStatistics(samplesUm) : { mean: samplesUm[0]!, s: 0 };
  const minUm = samplesUm.reduce((a, b) => Math.min(a, b), Infinity);
  const maxUm = samplesUm.reduce((a, b) => Math.max(a, b), -Infinity);
  return { samplesUm, meanUm: stats.mean, sUm: stats.s, minUm, maxUm };
}

/**
 * The parts of a segment whose distance to the nearest of `lines` lies within [minDist, maxDist]
 * (a sub-band such as 0-20 µm from the interfaces, in the points' units). The distance along a
 * segment is piecewise smooth, so it is stepped every `step` and each change refined by bisection.
 */
export function clipSegmentByDistance(a: Point, b: Point, lines: readonly (readonly Point[])[], minDist: number, maxDist: number, step = 0.25): [Point, Point][] {
  const at = (t: number): Point => [a[0] + t * (b[0] - a[0]), a[1] + t * (b[1] - a[1])];
  const inRange = (t: number) => {
    const d = lines.reduce((best, l) => Math.min(best, distanceToPolyline(at(t), l)), Infinity);
    return d >= minDist && d <= maxDist;
  };
  const n = Math.max(1, Math.ceil(Math.hypot(b[0] - a[0], b[1] - a[1]) / step));
  const pieces: [Point, Point][] = [];
  let start: number | null = inRange(0) ? 0 : null;
  let prev = start !== null;
  for (let i = 1; i <= n; i++) {
    const now = inRange(i / n);
    if (now !== prev) {
      let [lo, hi] = [(i - 1) / n, i / n];
      for (let k = 0; k < 50; k++) {
        const mid = (lo + hi) / 2;
        if (inRange(mid) === prev) lo = mid;
        else hi = mid;
      }
      const edge = (lo + hi) / 2;
      if (now) start = edge;
      else if (start !== null) {
        if (edge > start) pieces.push([at(start), at(edge)]);
        start = null;
      }
      prev = now;
    }
  }
  if (start !== null && start < 1) pieces.push([at(start), at(1)]);
  return pieces;
}
