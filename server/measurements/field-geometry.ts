import { distanceToPolyline, inBand, layerBands, clipSegmentByDistance, clipSegmentToBand, type Axis, type LayerBand } from '../../shared/measurements/layers';
import type { TestPath } from '../../shared/measurements/measurement-records';
import type { WhereSpec } from '../../shared/measurements/measurements';
import { circlePoints, clipSegmentToRing, clipToRect, patternLines, pointInRing, type PatternSpec, type TestLine } from '../../shared/measurements/patterns';
import { gridPoints } from '../../shared/measurements/point-count';

type Point = [number, number];

/**
 * What the counted geometry of a field depends on, in full-resolution image px. It is stored with
 * the measurement, so a result can be recomputed later exactly as it was laid, whatever happens
 * to the annotations in between.
 */
export interface FieldFrame {
  width: number;
  height: number;
  /** The pixel size the distances in µm (sub-bands) are turned into pixels with. */
  umPerPx: number;
  /** Bond interfaces in band order (sorted across their axis). */
  interfaces: Point[][];
  axis: Axis;
  /** Whether "along" follows drawn bond interfaces or the image's x axis (nothing drawn). */
  axisSource: 'bond_interfaces' | 'assumed';
  /** The outline, for a region. */
  region: Point[] | null;
  where: WhereSpec;
}

/** Circles are clipped as polygons of this many sides. */
const CIRCLE_SIDES = 720;
const SAME = 1e-6;

/** Interfaces sorted across their common axis: the order layerBands numbers bands in. */
export function orderInterfaces(lines: Point[][]): { interfaces: Point[][]; axis: Axis; axisSource: FieldFrame['axisSource'] } {
  if (lines.length === 0) return { interfaces: [], axis: 'x', axisSource: 'assumed' };
  const k = spread(lines, 0) >= spread(lines, 1) ? 1 : 0; // the coordinate across the interfaces
  const mean = (l: Point[]) => l.reduce((a, p) => a + p[k], 0) / l.length;
  return { interfaces: [...lines].sort((a, b) => mean(a) - mean(b)), axis: k === 1 ? 'x' : 'y', axisSource: 'bond_interfaces' };
}

// The same rule as interfaceAxis(): the axis over which the lines' points spread most.
function spread(lines: Point[][], k: 0 | 1): number {
  return lines.reduce((sum, l) => sum + Math.max(...l.map((p) => p[k])) - Math.min(...l.map((p) => p[k])), 0);
}

/** The band a frame measures in, or null when its where is not a band or the band does not exist. */
export function bandOf(frame: FieldFrame): LayerBand | null {
  if (frame.where.type !== 'band') return null;
  return layerBands(frame.interfaces, frame.axis)[frame.where.band - 1] ?? null;
}

/** The pattern laid over the image at a pixel size and moved by the placement offset. */
export function layPattern(spec: PatternSpec, offset: readonly [number, number], width: number, height: number, umPerPx: number): TestLine[] {
  const [dx, dy] = offset;
  const move = (p: readonly [number, number]): Point => [p[0] + dx, p[1] + dy];
  return patternLines(spec, width, height, umPerPx).map((l) => (l.kind === 'circle' ? { ...l, centre: move(l.centre) } : { ...l, a: move(l.a), b: move(l.b) }));
}

/** The straight pieces of one laid line: a segment, or a circle as an inscribed polygon (vertices on the circle, so a tangent outline keeps them). */
function straightPieces(line: TestLine): [Point, Point][] {
  if (line.kind === 'segment') return [[[...line.a], [...line.b]]];
  const pts = circlePoints(line.centre, line.radius, CIRCLE_SIDES);
  return pts.slice(1).map((p, i) => [[...pts[i]!], [...p]] as [Point, Point]);
}

/** An inscribed regular n-gon is shorter than its circle by sin(π/n)/(π/n); arcs are scaled back by this factor. */
export const ARC_PER_CHORD = Math.PI / CIRCLE_SIDES / Math.sin(Math.PI / CIRCLE_SIDES);

/** The parts of one straight piece inside the image and the frame's region, band and sub-band. */
function clipPiece(a: Point, b: Point, frame: FieldFrame, band: LayerBand | null): [Point, Point][] {
  const onImage = clipToRect(a, b, frame.width, frame.height);
  if (!onImage) return [];
  const [p, q] = onImage.map((v) => [v[0], v[1]] as Point) as [Point, Point];
  const where = frame.where;
  if (where.type === 'image') return [[p, q]];
  if (where.type === 'region') return frame.region ? (clipSegmentToRing(p, q, frame.region) as [Point, Point][]) : [];
  if (!band) return [];
  const inBandPieces = clipSegmentToBand(p, q, band, frame.axis) as [Point, Point][];
  if (!where.distanceUm) return inBandPieces;
  const [lo, hi] = [where.distanceUm.min / frame.umPerPx, where.distanceUm.max / frame.umPerPx];
  return inBandPieces.flatMap(([s, e]) => clipSegmentByDistance(s, e, frame.interfaces, lo, hi) as [Point, Point][]);
}

/** Each laid line as counted: clipped, joined into connected pieces, with its length in px. */
export function countedPaths(lines: readonly TestLine[], frame: FieldFrame): TestPath[] {
  const band = bandOf(frame);
  return lines.map((line, index) => {
    const chains: Point[][] = [];
    for (const [a, b] of straightPieces(line)) {
      for (const [s, e] of clipPiece(a, b, frame, band)) {
        const last = chains[chains.length - 1];
        const end = last?.[last.length - 1];
        if (last && end && Math.abs(end[0] - s[0]) < SAME && Math.abs(end[1] - s[1]) < SAME) last.push(e);
        else chains.push([s, e]);
      }
    }
    // A clipped circle may start mid-arc: join its last piece to its first so the arc reads as one.
    if (line.kind === 'circle' && chains.length > 1) {
      const [first, last] = [chains[0]!, chains[chains.length - 1]!];
      const [end, start] = [last[last.length - 1]!, first[0]!];
      if (Math.abs(end[0] - start[0]) < SAME && Math.abs(end[1] - start[1]) < SAME) {
        chains[0] = [...last, ...first.slice(1)];
        chains.pop();
      }
    }
    const chords = chains.reduce((sum, c) => sum + chainLength(c), 0);
    const lengthPx = line.kind === 'circle' ? chords * ARC_PER_CHORD : chords;
    const family = line.kind === 'circle' ? 'circle' : line.family;
    return { line: index, family, pieces: chains, lengthPx };
  });
}

export function chainLength(chain: readonly Point[]): number {
  let sum = 0;
  for (let i = 1; i < chain.length; i++) sum += Math.hypot(chain[i]![0] - chain[i - 1]![0], chain[i]![1] - chain[i - 1]![1]);
  return sum;
}

/** Shortest distance (px) from a point to the nearest bond interface of the frame. */
export function distanceToInterfaces(p: Point, frame: Pick<FieldFrame, 'interfaces'>): number {
  return frame.interfaces.reduce((best, l) => Math.min(best, distanceToPolyline(p, l)), Infinity);
}

/** Length (px) of the counted part of a path lying loPx–hiPx from the nearest bond interface; arcs scaled like the whole. */
export function lengthInDistanceRange(path: TestPath, frame: Pick<FieldFrame, 'interfaces'>, loPx: number, hiPx: number): number {
  let sum = 0;
  for (const chain of path.pieces) {
    for (let i = 1; i < chain.length; i++) {
      for (const [s, e] of clipSegmentByDistance(chain[i - 1]!, chain[i]!, frame.interfaces, loPx, hiPx)) sum += Math.hypot(e[0] - s[0], e[1] - s[1]);
    }
  }
  return path.family === 'circle' ? sum * ARC_PER_CHORD : sum;
}

/** Shortest distance from a point to the counted part of a test line (Infinity when nothing of it is counted). */
export function distanceToPath(p: Point, path: TestPath): number {
  return path.pieces.reduce((best, c) => Math.min(best, distanceToPolyline(p, c)), Infinity);
}

/** Shortest distance from a point to a whole laid line, before any clipping. */
export function distanceToLine(p: Point, line: TestLine): number {
  if (line.kind === 'circle') return Math.abs(Math.hypot(p[0] - line.centre[0], p[1] - line.centre[1]) - line.radius);
  return distanceToPolyline(p, [line.a, line.b]);
}

/** Whether a point lies in the frame's image, region, band and sub-band. */
export function insideWhere(p: Point, frame: FieldFrame): boolean {
  if (p[0] < 0 || p[1] < 0 || p[0] > frame.width || p[1] > frame.height) return false;
  const where = frame.where;
  if (where.type === 'image') return true;
  if (where.type === 'region') return frame.region !== null && pointInRing(p, frame.region);
  const band = bandOf(frame);
  if (!band || !inBand(band, p, frame.axis)) return false;
  if (!where.distanceUm) return true;
  const d = frame.interfaces.reduce((best, l) => Math.min(best, distanceToPolyline(p, l)), Infinity) * frame.umPerPx;
  return d >= where.distanceUm.min && d <= where.distanceUm.max;
}

/** The E562 grid points that count: those in the frame's region or band. */
export function countedGrid(spacingPx: number, offset: readonly [number, number], frame: FieldFrame): Point[] {
  return gridPoints(frame.width, frame.height, spacingPx, offset).filter((p) => insideWhere(p, frame));
}

/** How a where reads beside a number. */
export function whereLabel(where: WhereSpec, regionLabel = ''): string {
  if (where.type === 'image') return 'whole image';
  if (where.type === 'region') return regionLabel ? `region “${regionLabel}”` : 'outlined region';
  const sub = where.distanceUm ? `, ${where.distanceUm.min}–${where.distanceUm.max} µm from the nearest bond interface` : '';
  return `band ${where.band}${sub}`;
}
