import type { Annotation, AnnotationClass } from '../../../shared/annotations/annotations';
import type { Point } from '../../../shared/annotations/geometry';
import { clipSegmentToBand, distanceToPolyline, inBand } from '../../../shared/measurements/layers';
import { markValue, type CountRules } from '../../../shared/measurements/e112';
import type { DraftMark } from './mark-counts';
import type { Measurement } from '../../../shared/measurements/measurement-records';
import type { WhereSpec } from '../../../shared/measurements/measurements';
import { circlePoints, clipSegmentToRing, pointInRing, type TestLine } from '../../../shared/measurements/patterns';
import type { BandFrame } from './measure-draft';

/**
 * Where a measurement applies, as the measuring page offers it: the whole image, a layer band, or one
 * outlined region (a polygon or rectangle drawn on the image); sub-band edges; the saved point counts
 * that can give a phase's volume fraction. No Angular, so mocha runs it.
 */

/** An outline on the image that a measurement can be confined to. */
export interface RegionChoice {
  id: string;
  /** "Deformation zone · brushed edge" (class, then label). */
  label: string;
  ring: Point[];
}

/** The page's choice of place: 'image', 'band:2' or 'region:<annotation id>'. */
export type PlaceValue = string;

/** Outlines (polygons and rectangles) of the image, by class then label, as a person picks them. Pure. */
export function regionChoices(shapes: readonly Annotation[], classes: readonly AnnotationClass[]): RegionChoice[] {
  const className = new Map(classes.map((c) => [c.id, c.name]));
  return shapes
    .filter((a) => a.kind === 'polygon' || a.kind === 'rectangle')
    .map((a, i) => ({ id: a.id, label: `${className.get(a.classId) ?? 'Outline'} · ${a.label.trim() || `unlabelled outline ${i + 1}`}`, ring: a.points.map(([x, y]) => [x, y] as Point) }))
    .sort((a, b) => a.label.localeCompare(b.label));
}

/** The select value for a where. Pure. */
export function placeValue(where: WhereSpec): PlaceValue {
  if (where.type === 'band') return `band:${where.band}`;
  if (where.type === 'region') return `region:${where.annotationId}`;
  return 'image';
}

/** The where a select value names (a band's sub-band range is not part of the choice). Pure. */
export function whereOfPlace(value: PlaceValue): WhereSpec {
  if (value.startsWith('band:')) return { type: 'band', band: Number(value.slice(5)) };
  if (value.startsWith('region:')) return { type: 'region', annotationId: value.slice(7) };
  return { type: 'image' };
}

/** Whether a point lies in the chosen place (always, for the whole image; never, for a region or band that is gone). Pure. */
export function insidePlace(where: WhereSpec, frame: BandFrame, regions: readonly RegionChoice[], p: Point): boolean {
  if (where.type === 'image') return true;
  if (where.type === 'region') {
    const r = regions.find((x) => x.id === where.annotationId);
    return r ? pointInRing(p, r.ring) : false;
  }
  const band = frame.bands[where.band - 1];
  return band ? inBand(band, p, frame.axis) : false;
}

/** Circles are drawn clipped as polygons of this many sides (display only; the server counts with finer ones). */
const DRAWN_CIRCLE_SIDES = 240;

/**
 * The parts of the laid test lines that count in the chosen place, as straight pieces to draw bright over
 * the faint full pattern; empty for the whole image (everything counts there). Pure.
 */
export function countedPieces(lines: readonly TestLine[], where: WhereSpec, frame: BandFrame, regions: readonly RegionChoice[]): [Point, Point][] {
  if (where.type === 'image') return [];
  const clip = clipperFor(where, frame, regions);
  if (!clip) return [];
  return lines.flatMap((l) => {
    if (l.kind === 'segment') return clip(l.a, l.b);
    const pts = circlePoints(l.centre, l.radius, DRAWN_CIRCLE_SIDES);
    return pts.slice(1).flatMap((q, i) => clip(pts[i]!, q));
  });
}

function clipperFor(where: WhereSpec, frame: BandFrame, regions: readonly RegionChoice[]): ((a: Point, b: Point) => [Point, Point][]) | null {
  if (where.type === 'region') {
    const r = regions.find((x) => x.id === where.annotationId);
    return r ? (a, b) => clipSegmentToRing(a, b, r.ring) as [Point, Point][] : null;
  }
  if (where.type !== 'band') return null;
  const band = frame.bands[where.band - 1];
  return band ? (a, b) => clipSegmentToBand(a, b, band, frame.axis) as [Point, Point][] : null;
}

/** Sub-band edges typed as "0, 20, 40" (µm): the numbers, or a sentence saying what is wrong. Empty text means no sub-bands. Pure. */
export function parseBinEdges(text: string): { edges: number[] | null; error: string } {
  const parts = text.split(/[\s,;]+/).filter((t) => t !== '');
  if (parts.length === 0) return { edges: null, error: '' };
  const edges = parts.map((t) => Number(t.replace(/µm$/i, '')));
  if (edges.some((e) => !Number.isFinite(e))) return { edges: null, error: 'Write the edges as numbers in µm, separated by commas (e.g. 0, 20, 40).' };
  if (edges.length < 2) return { edges: null, error: 'Give at least two edges (e.g. 0, 20) for one sub-band.' };
  if (edges[0]! < 0) return { edges: null, error: 'A distance from the interface cannot be negative.' };
  if (edges.some((e, i) => i > 0 && e <= edges[i - 1]!)) return { edges: null, error: 'Each edge must lie farther from the interface than the one before.' };
  if (edges.length > 21) return { edges: null, error: 'Use at most 20 sub-bands.' };
  return { edges, error: '' };
}

/** Evenly spaced edges from 0: width 20 µm × 3 → [0, 20, 40, 60]. Pure. */
export function evenEdges(widthUm: number, count: number): number[] {
  return Array.from({ length: count + 1 }, (_, i) => Number((i * widthUm).toPrecision(12)));
}

/**
 * Where the sub-band edges lie on the image: each interface offset by every edge distance (µm → px) to both
 * sides, along the local normal, keeping the points that lie in the chosen place. For drawing only. Pure.
 */
export function subBandEdgeLines(frame: BandFrame, edgesUm: readonly number[], umPerPx: number, inside: (p: Point) => boolean): { edgeUm: number; points: Point[] }[] {
  const out: { edgeUm: number; points: Point[] }[] = [];
  for (const edgeUm of edgesUm) {
    if (!(edgeUm > 0)) continue; // the 0 µm edge is the interface itself
    const d = edgeUm / umPerPx;
    for (const line of frame.interfaces) {
      for (const side of [1, -1]) {
        let run: Point[] = [];
        for (const p of offsetPolyline(densify(line, Math.max(2, d / 4)), side * d)) {
          if (inside(p)) run.push(p);
          else if (run.length > 0) (run.length > 1 && out.push({ edgeUm, points: run }), (run = []));
        }
        if (run.length > 1) out.push({ edgeUm, points: run });
      }
    }
  }
  return out;
}

/** A polyline moved sideways by `d` (positive to the left of its direction of travel in image coordinates). Pure. */
export function offsetPolyline(line: readonly Point[], d: number): Point[] {
  return line.map((p, i) => {
    const a = line[Math.max(0, i - 1)]!;
    const b = line[Math.min(line.length - 1, i + 1)]!;
    const len = Math.hypot(b[0] - a[0], b[1] - a[1]) || 1;
    const [nx, ny] = [-(b[1] - a[1]) / len, (b[0] - a[0]) / len];
    return [p[0] + nx * d, p[1] + ny * d] as Point;
  });
}

/** Extra vertices every `step` px, so an offset line follows bends and can be cut at the place's edge. */
function densify(line: readonly Point[], step: number): Point[] {
  const out: Point[] = [line[0]!];
  for (let i = 1; i < line.length; i++) {
    const [a, b] = [line[i - 1]!, line[i]!];
    const n = Math.max(1, Math.ceil(Math.hypot(b[0] - a[0], b[1] - a[1]) / step));
    for (let k = 1; k <= n; k++) out.push([a[0] + ((b[0] - a[0]) * k) / n, a[1] + ((b[1] - a[1]) * k) / n]);
  }
  return out;
}

/** A saved point count that can give a phase's volume fraction. */
export interface PointCountChoice {
  id: string;
  label: string;
  fraction: number;
}

/** Saved point counts of the same place (a count of another place does not describe these grains), newest first. Pure. */
export function pointCountChoices(saved: readonly Measurement[], where: WhereSpec): PointCountChoice[] {
  const key = (w: WhereSpec) => `${placeValue(w)}|${w.type === 'band' && w.distanceUm ? `${w.distanceUm.min}-${w.distanceUm.max}` : ''}`;
  return saved
    .filter((m) => m.result.kind === 'point_count' && key(m.definition.where) === key(where) && m.result.pointFraction > 0)
    .slice()
    .reverse()
    .map((m) => {
      const r = m.result as Extract<Measurement['result'], { kind: 'point_count' }>;
      return { id: m.id, label: `${r.phaseName}: P_p ${(r.pointFraction * 100).toFixed(1)} % on ${m.whereLabel} (version ${m.version}, ${m.authorName})`, fraction: r.pointFraction };
    });
}

/**
 * The live count per sub-band: confirmed marks by their distance from the nearest interface, with the
 * server's rule for a mark on an edge (it belongs to the farther sub-band; the last keeps its outer edge). Pure.
 */
export function countsPerSubBand(marks: readonly DraftMark[], interfaces: readonly (readonly Point[])[], edgesUm: readonly number[], umPerPx: number, rules: CountRules): { minUm: number; maxUm: number; count: number }[] {
  const distances = marks
    .filter((m) => m.status === 'confirmed')
    .map((m) => ({ m, d: interfaces.reduce((best, l) => Math.min(best, distanceToPolyline([m.x, m.y], l)), Infinity) * umPerPx }));
  return edgesUm.slice(1).map((maxUm, i) => {
    const minUm = edgesUm[i]!;
    const last = i === edgesUm.length - 2;
    const count = distances.filter(({ d }) => d >= minUm && (d < maxUm || (last && d <= maxUm))).reduce((sum, { m }) => sum + markValue(m.kind, rules), 0);
    return { minUm, maxUm, count };
  });
}
