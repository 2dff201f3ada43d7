import type { AnnotationKind, Coordinates } from '../../../shared/annotations/annotations';
import { measurementLabel } from './measurements';
import type { OverlayShape } from './overlay-layer';
import { KIND_OF_TOOL, type ShapeDraft } from './shape-draft';
import type { ViewShape } from './view-shapes';

/** A colour no class uses, for the calibration line. */
export const CALIBRATION_COLOUR = '#ffd23f';

/**
 * What the overlay layer shows: the selected shape (with the points being dragged, if any) and
 * the shape being drawn, each with its measurement so far. Pure.
 */
export function selectionOverlay(selected: ViewShape | undefined, editedPoints: Coordinates | null, colour: string, umPerPx: number | null): OverlayShape | null {
  if (!selected) return null;
  const points = editedPoints ?? selected.points;
  return { kind: selected.kind, points, label: selected.label, colour, measurement: measurementLabel(selected.kind, points, umPerPx) };
}

export function draftOverlay(draft: ShapeDraft | null, classColour: string, umPerPx: number | null): OverlayShape | null {
  const preview = draft?.preview() ?? [];
  if (!draft || preview.length === 0) return null;
  const kind = KIND_OF_TOOL[draft.tool] ?? 'ruler';
  const points = preview.map((p) => [p[0], p[1]] as [number, number]);
  const colour = draft.tool === 'calibrate' ? CALIBRATION_COLOUR : classColour;
  return { kind, points, label: '', colour, measurement: draftMeasurement(kind, points, umPerPx) };
}

/** What a shape being drawn measures so far (nothing until it has enough points to measure). */
export function draftMeasurement(kind: AnnotationKind, points: Coordinates, umPerPx: number | null): string {
  if (kind === 'point' || kind === 'text') return '';
  if (kind === 'angle' && points.length < 3) return '';
  if ((kind === 'polygon' || kind === 'rectangle') && points.length < 3) return '';
  return measurementLabel(kind, points, umPerPx);
}
