import type { Annotation, AnnotationClass } from '../../../shared/annotations/annotations';
import type { Point } from '../../../shared/annotations/geometry';
import type { CountRules } from '../../../shared/measurements/e112';
import { inBand, interfaceAxis, layerBands, type Axis, type LayerBand } from '../../../shared/measurements/layers';
import type { MeasurementBody, PointMark, SuggestBody, WhereSpec } from '../../../shared/measurements/measurements';
import { BOND_INTERFACE_CLASS } from '../../../shared/measurements/measurements';
import type { PatternSpec } from '../../../shared/measurements/patterns';
import type { DraftMark } from './mark-counts';
import { spacingToReach } from './test-line-snap';

/** The measuring form as the page holds it, before it becomes a request body. */
export interface PatternForm {
  type: PatternSpec['type'];
  direction: 'horizontal' | 'vertical' | 'both' | 'angle';
  angleDeg: number;
  /** 'um': spacing typed in µm; 'reach': spacing chosen so `count` lines fill the image. */
  spacingMode: 'um' | 'reach';
  spacingUm: number;
  count: number;
  diameterUm: number;
  largestDiameterUm: number;
}

export const DEFAULT_PATTERN: PatternForm = {
  type: 'lines',
  direction: 'horizontal',
  angleDeg: 45,
  spacingMode: 'reach',
  spacingUm: 50,
  count: 5,
  diameterUm: 200,
  largestDiameterUm: 200,
};

/** A pattern as a request carries it. */
export type PatternBody = SuggestBody['pattern'];

/** The pattern the form describes on an image of `width` × `height` px at `umPerPx`. Pure. */
export function patternOf(form: PatternForm, width: number, height: number, umPerPx: number): PatternBody {
  if (form.type === 'circle') return { type: 'circle', diameterUm: form.diameterUm };
  if (form.type === 'three_circles') return { type: 'three_circles', largestDiameterUm: form.largestDiameterUm };
  const across = form.direction === 'horizontal' ? height : form.direction === 'vertical' ? width : Math.min(width, height);
  const spacingUm = form.spacingMode === 'reach' ? spacingToReach(form.count, across, umPerPx) : form.spacingUm;
  return {
    type: 'lines',
    direction: form.direction,
    ...(form.direction === 'angle' ? { angleDeg: form.angleDeg } : {}),
    spacingUm,
    count: form.count,
  };
}

/** The form that reopens a saved pattern (spacing as typed, since the server stores µm). Pure. */
export function formOf(spec: PatternSpec): PatternForm {
  if (spec.type === 'circle') return { ...DEFAULT_PATTERN, type: 'circle', diameterUm: spec.diameterUm };
  if (spec.type === 'three_circles') return { ...DEFAULT_PATTERN, type: 'three_circles', largestDiameterUm: spec.largestDiameterUm };
  return { ...DEFAULT_PATTERN, direction: spec.direction, angleDeg: spec.angleDeg ?? 45, spacingMode: 'um', spacingUm: spec.spacingUm, count: spec.count };
}

/** Where, as a number: 0 for the whole image, n for layer band n. Pure. */
export function whereOf(band: number): WhereSpec {
  return band > 0 ? { type: 'band', band } : { type: 'image' };
}

/** The bond interfaces drawn on an image and the bands they bound. */
export interface BandFrame {
  interfaces: Point[][];
  axis: Axis;
  bands: LayerBand[];
}

/** Bands from the image's annotations: polylines of the bond-interface class, as the server reads them. Pure. */
export function bandFrame(annotations: readonly Annotation[], classes: readonly AnnotationClass[]): BandFrame {
  const bondClass = classes.find((c) => c.name === BOND_INTERFACE_CLASS);
  const interfaces = bondClass
    ? annotations.filter((a) => a.classId === bondClass.id && a.kind === 'polyline').map((a) => a.points.map(([x, y]) => [x, y] as const))
    : [];
  if (interfaces.length === 0) return { interfaces: [], axis: 'x', bands: [] };
  const axis = interfaceAxis(interfaces);
  return { interfaces, axis, bands: layerBands(interfaces, axis) };
}

/** Whether a point lies where the measurement applies (always, for the whole image). Pure. */
export function insideWhere(frame: BandFrame, band: number, p: Point): boolean {
  if (band === 0) return true;
  const b = frame.bands[band - 1];
  return b ? inBand(b, p, frame.axis) : false;
}

/** What a person chose, gathered for one request. */
export interface DraftDefinition {
  kind: MeasurementBody['kind'];
  pattern: PatternBody;
  band: number;
  rules: CountRules;
  marks: DraftMark[];
  gridSpacingUm: number;
  phaseName: string;
  pointMarks: PointMark[];
  thicknessSpacingUm: number;
  note: string;
  /** An outline annotation to measure inside (instead of a band or the whole image). */
  regionId?: string | null;
  /** Sub-band edges in µm from the nearest bond interface (intercepts only). */
  distanceBinsUm?: number[] | null;
  /** Two-phase: the phase counted, with its V_V typed in or taken from a saved point count. */
  phase?: { name: string; volumeFraction?: number; pointCountId?: string } | null;
}

/** The request body for a save: only the fields of the chosen kind. Pure. */
export function bodyOf(d: DraftDefinition): MeasurementBody {
  const where: WhereSpec = d.regionId ? { type: 'region', annotationId: d.regionId } : whereOf(d.band);
  if (d.kind === 'thickness') {
    return { kind: 'thickness', where: { type: 'band', band: Math.max(1, d.band) }, spacingUm: d.thicknessSpacingUm, note: d.note };
  }
  if (d.kind === 'point_count') {
    return { kind: 'point_count', grid: { spacingUm: d.gridSpacingUm }, placement: { offsetPx: [0, 0] }, where, phaseName: d.phaseName, marks: d.pointMarks, note: d.note };
  }
  return {
    kind: 'intercept',
    pattern: d.pattern,
    placement: { offsetPx: [0, 0] },
    where,
    marks: d.marks.map((m) => ({ x: m.x, y: m.y, line: m.line, kind: m.kind, status: m.status })),
    rules: d.rules,
    twinsExcluded: true,
    phase: d.phase ?? null,
    distanceBinsUm: d.distanceBinsUm ?? null,
    note: d.note,
  };
}
