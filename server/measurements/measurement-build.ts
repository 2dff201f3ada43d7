import type { EntityManager } from 'typeorm';
import type { FieldProblem } from '../../shared/api-error';
import type { MeasurementResult, PointCountSource, TestPath } from '../../shared/measurements/measurement-records';
import { BOND_INTERFACE_CLASS, MARK_TOLERANCE_PX, type MeasurementBody, type WhereSpec } from '../../shared/measurements/measurements';
import { AppError } from '../http/app-error';
import type { Image } from '../images/image.entity';
import { countedGrid, countedPaths, distanceToLine, distanceToPath, insideWhere, layPattern, orderInterfaces, whereLabel, type FieldFrame } from './field-geometry';
import type { MeasurementLayout } from './measurement.entity';
import { gridPointOf, interceptResult, pointCountResult, thicknessResult } from './measurement-results';
import { followsInterfaces, interfaceName, usedAnnotations, type AnnotationSource } from './measurement-sources';

type Point = [number, number];

/** The layout before a pattern or grid is laid on it. */
export type FrameSnapshot = Omit<MeasurementLayout, 'laid' | 'gridSpacingPx' | 'counted'>;

/** A 422 with one field problem per detail; the message names the first. */
export function invalid(details: FieldProblem[]): AppError {
  const more = details.length > 1 ? ` (and ${details.length - 1} more)` : '';
  return new AppError(422, 'validation_failed', `${details[0]!.message}${more}`, details);
}

/** The image's pixel size, or a 422 that says how to get one; non-square pixels are refused (lengths would need two scales). */
export function pixelSizeOf(image: Image): number {
  const x = image.pixelSizeUm;
  if (x === null) throw invalid([{ field: 'params.imageId', message: 'This image has no pixel size: calibrate the image first (draw a line along its scale bar or apply a preset), then measure.' }]);
  const y = image.pixelSizeYUm ?? x;
  if (Math.abs(x - y) > 1e-6 * x) {
    throw invalid([{ field: 'params.imageId', message: `This image's pixels are not square (${x} × ${y} µm); measurements need square pixels, so check its calibration.` }]);
  }
  return x;
}

/** The image's bond interfaces, the region outline if one is named, and where "along" points; 422 for a band or region that is not there. */
export async function readFrame(m: EntityManager, image: Image, where: WhereSpec, field = 'body.where'): Promise<FrameSnapshot> {
  const rows: { id: string; version: number; label: string; points: Point[] }[] = await m.query(
    `SELECT a.id, a.version, a.label, a.points FROM annotations a JOIN annotation_classes c ON c.id = a.class_id
     WHERE a.image_id = $1 AND c.name = $2 AND a.kind = 'polyline' ORDER BY a.seq`,
    [image.id, BOND_INTERFACE_CLASS],
  );
  const { interfaces, axis, axisSource } = orderInterfaces(rows.map((r) => r.points));
  // Ids and versions in band order, so a later change can be named ("bond interface 2 was redrawn").
  const read: AnnotationSource[] = interfaces.map((line, i) => {
    const row = rows.find((r) => r.points === line)!;
    return { id: row.id, version: row.version, role: 'bond_interface', name: interfaceName(row.label, i) };
  });
  let region: Point[] | null = null;
  let regionLabel = '';
  if (where.type === 'region') {
    const [a]: { id: string; version: number; kind: string; points: Point[]; label: string; class_name: string }[] = await m.query(
      `SELECT a.id, a.version, a.kind, a.points, a.label, c.name AS class_name FROM annotations a JOIN annotation_classes c ON c.id = a.class_id WHERE a.id = $1 AND a.image_id = $2`,
      [where.annotationId, image.id],
    );
    if (!a) throw invalid([{ field: `${field}.annotationId`, message: 'No annotation with this id on this image; choose an outline drawn on it.' }]);
    if (a.kind !== 'polygon' && a.kind !== 'rectangle') throw invalid([{ field: `${field}.annotationId`, message: `That annotation is a ${a.kind}; a region must be an outline (polygon or rectangle).` }]);
    region = a.points;
    regionLabel = a.label || a.class_name;
    read.push({ id: a.id, version: a.version, role: 'region', name: `“${regionLabel}”` });
  }
  if (where.type === 'band') {
    const bands = interfaces.length + 1;
    if (interfaces.length === 0) {
      throw invalid([{ field: `${field}.band`, message: `This image has no bond interfaces; draw them with the “${BOND_INTERFACE_CLASS}” class, or measure the whole image.` }]);
    }
    if (where.band > bands) throw invalid([{ field: `${field}.band`, message: `Band ${where.band} does not exist: this image has ${interfaces.length} bond interface${interfaces.length > 1 ? 's' : ''}, so bands 1–${bands}.` }]);
  }
  return { width: image.width, height: image.height, interfaces, axis, axisSource, region, regionLabel, sources: { annotations: read, followsInterfaces: false, pointCount: null } };
}

/** The frame's sources narrowed to what this definition depends on, with the point count it took V_V from. */
export function withSources<T extends FrameSnapshot>(frame: T, def: MeasurementBody, pointCount: PointCountSource | null): T {
  const read = frame.sources?.annotations ?? [];
  return { ...frame, sources: { annotations: usedAnnotations(def, read), followsInterfaces: followsInterfaces(def), pointCount } };
}

/** Sub-bands are distances from bond interfaces: 422 when the image has none. */
export function checkBins(def: MeasurementBody, frame: FrameSnapshot): void {
  if (def.kind !== 'intercept' || def.distanceBinsUm === null || frame.interfaces.length > 0) return;
  throw invalid([{ field: 'body.distanceBinsUm', message: `Sub-bands are distances from bond interfaces, and this image has none; draw them with the “${BOND_INTERFACE_CLASS}” class first.` }]);
}

/**
 * Two-phase with a saved point count: V_V is that count's P_p, and the count must be of the same place on
 * this image (a fraction measured elsewhere would not describe these grains). Returns the definition
 * with V_V filled in and the count as it was, or the definition unchanged when V_V was typed in.
 */
export async function resolvePhase(m: EntityManager, imageId: string, def: MeasurementBody, placeLabel: string): Promise<{ def: MeasurementBody; pointCount: PointCountSource | null }> {
  if (def.kind !== 'intercept' || !def.phase?.pointCountId) return { def, pointCount: null };
  const field = 'body.phase.pointCountId';
  const [row]: { id: string; version: number; kind: string; definition: MeasurementBody; result: MeasurementResult; where_label: string }[] = await m.query(
    'SELECT id, version, kind, definition, result, where_label FROM measurements WHERE id = $1 AND image_id = $2',
    [def.phase.pointCountId, imageId],
  );
  if (!row || row.kind !== 'point_count' || row.result.kind !== 'point_count') throw invalid([{ field, message: 'No saved point count with this id on this image; choose one from the list, or type the volume fraction.' }]);
  if (placeKey(row.definition.where) !== placeKey(def.where)) {
    throw invalid([{ field, message: `That point count was made on ${row.where_label}, not on ${placeLabel}; choose a point count of the same place.` }]);
  }
  const vv = row.result.pointFraction;
  if (!(vv > 0)) throw invalid([{ field, message: `That point count found no “${row.result.phaseName}” (P_p = 0), so it cannot give a volume fraction.` }]);
  const pointCount: PointCountSource = { id: row.id, version: row.version, phaseName: row.result.phaseName, whereLabel: row.where_label, pointFraction: vv };
  return { def: { ...def, phase: { ...def.phase, volumeFraction: vv } }, pointCount };
}

/** The place a where names, without sub-band details: image, a region id, or a band number. */
function placeKey(where: WhereSpec): string {
  if (where.type === 'region') return `region:${where.annotationId}`;
  if (where.type === 'band') return `band:${where.band}:${where.distanceUm ? `${where.distanceUm.min}-${where.distanceUm.max}` : ''}`;
  return 'image';
}

/** The pattern or grid laid at a pixel size. */
export function layOut(def: MeasurementBody, frame: FrameSnapshot, umPerPx: number): MeasurementLayout {
  const counted = { testLines: [], grid: [] };
  if (def.kind === 'intercept') return { ...frame, laid: layPattern(def.pattern, def.placement.offsetPx, frame.width, frame.height, umPerPx), gridSpacingPx: null, counted };
  if (def.kind === 'point_count') return { ...frame, laid: [], gridSpacingPx: def.grid.spacingUm / umPerPx, counted };
  return { ...frame, laid: [], gridSpacingPx: null, counted };
}

export interface Computed {
  result: MeasurementResult;
  testLines: TestPath[];
  grid: Point[];
  whereLabel: string;
}

/** Recomputes a result from its definition and layout; 422 when nothing of the pattern or grid lies where it should. */
export function compute(def: MeasurementBody, layout: MeasurementLayout, umPerPx: number): Computed {
  const frame: FieldFrame = { ...layout, where: def.where, umPerPx };
  const label = whereLabel(def.where, layout.regionLabel);
  if (def.kind === 'intercept') {
    const testLines = countedPaths(layout.laid, frame);
    if (!(testLines.reduce((sum, p) => sum + p.lengthPx, 0) > 0)) {
      throw invalid([{ field: 'body.pattern', message: `The pattern misses ${place(label)}: no test line lies in it (0 µm of line). Move or resize the pattern, or choose another place.` }]);
    }
    return { result: interceptResult(def, testLines, frame, umPerPx, layout.sources?.pointCount ?? null), testLines, grid: [], whereLabel: label };
  }
  if (def.kind === 'point_count') {
    const grid = countedGrid(layout.gridSpacingPx!, def.placement.offsetPx, frame);
    if (grid.length === 0) throw invalid([{ field: 'body.grid', message: `No grid point lies in ${place(label)}; use a finer grid or move it.` }]);
    if (grid.length > 10_000) throw invalid([{ field: 'body.grid.spacingUm', message: `This grid has ${grid.length} points in ${place(label)}; use a coarser grid (at most 10 000 points).` }]);
    return { result: pointCountResult(def, grid), testLines: [], grid, whereLabel: label };
  }
  const n = def.where.band;
  const k = layout.interfaces.length;
  if (n < 2 || n > k) {
    const which = k < 2 ? 'this image has fewer than two bond interfaces' : k === 2 ? 'band 2' : `bands 2–${k}`;
    throw invalid([{ field: 'body.where.band', message: `Band ${n} is bounded by the image edge; thickness needs a band between two bond interfaces (${which}).` }]);
  }
  return { result: thicknessResult(def, frame, umPerPx), testLines: [], grid: [], whereLabel: label };
}

/** Every mark must lie on the image and on the counted part of its line (or on a counted grid point): one problem per bad mark. */
export function checkMarks(def: MeasurementBody, layout: MeasurementLayout, computed: Computed, umPerPx: number): void {
  if (def.kind === 'thickness') return;
  const frame: FieldFrame = { ...layout, where: def.where, umPerPx };
  const problems: FieldProblem[] = [];
  const seen = new Map<number, number>();
  def.marks.forEach((mark, i) => {
    const p: Point = [mark.x, mark.y];
    const field = `body.marks.${i}`;
    const name = `Mark ${i + 1} at (${round(mark.x)}, ${round(mark.y)})`;
    if (mark.x < 0 || mark.y < 0 || mark.x > layout.width || mark.y > layout.height) {
      problems.push({ field, message: `${name} lies outside the image (${layout.width} × ${layout.height} px).` });
      return;
    }
    if (def.kind === 'point_count') {
      const at = gridPointOf(mark, computed.grid);
      if (at < 0) {
        const message = insideWhere(p, frame) ? 'is not on a grid point; place it on one.' : `lies outside ${place(computed.whereLabel)}; only grid points there count.`;
        problems.push({ field, message: `${name} ${message}` });
      } else if (seen.has(at)) problems.push({ field, message: `${name} marks the same grid point as mark ${seen.get(at)! + 1}; each point counts once.` });
      else seen.set(at, i);
      return;
    }
    if (!('line' in mark)) return;
    const line = layout.laid[mark.line];
    if (!line) {
      problems.push({ field: `${field}.line`, message: `${name} names test line ${mark.line}; the pattern has lines 0–${layout.laid.length - 1}.` });
    } else if (line.kind === 'circle' && mark.kind === 'line_end') {
      problems.push({ field: `${field}.kind`, message: `${name} is a line end on a circle; circles have no ends.` });
    } else if (distanceToLine(p, line) > MARK_TOLERANCE_PX) {
      problems.push({ field, message: `${name} lies ${round(distanceToLine(p, line))} px from test line ${mark.line}; place it on the line.` });
    } else if (distanceToPath(p, computed.testLines[mark.line]!) > MARK_TOLERANCE_PX) {
      problems.push({ field, message: `${name} lies on test line ${mark.line} but outside ${place(computed.whereLabel)}; only the counted part of a line takes marks.` });
    }
  });
  if (problems.length > 0) throw invalid(problems);
}

/** A where label as the object of a sentence ("misses band 2", "misses the image"). */
function place(label: string): string {
  return label === 'whole image' ? 'the image' : label;
}

function round(v: number): number {
  return Math.round(v * 10) / 10;
}
