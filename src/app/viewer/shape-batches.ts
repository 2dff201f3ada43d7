import type { Bounds } from './hit-test';
import { boundsIntersect } from './hit-test';
import type { ViewShape } from './view-shapes';

/**
 * Shapes grouped for drawing: one batch per colour (and per saved/unsaved look), each split into
 * outlines, open lines and markers, so the canvas sets its colours and widths once per group.
 * Only shapes in view are included; `count` says how many, to choose the drawing detail. Pure.
 */
export interface ShapeBatch {
  colour: string;
  pending: boolean;
  /** Polygons and rectangles: filled and stroked. */
  outlines: ViewShape[];
  /** Polylines, rulers and angles: stroked. */
  lines: ViewShape[];
  /** Points and notes: round markers. */
  markers: ViewShape[];
}

export function batchShapes(
  shapes: readonly ViewShape[],
  visible: Bounds,
  shown: (s: ViewShape) => boolean,
  hiddenKey: string | null,
  colourOf: (s: ViewShape) => string,
): { batches: ShapeBatch[]; labelled: ViewShape[]; count: number } {
  const batches = new Map<string, ShapeBatch>();
  const labelled: ViewShape[] = [];
  let count = 0;
  for (const s of shapes) {
    if (s.key === hiddenKey || !shown(s) || !boundsIntersect(s.bounds, visible)) continue;
    count += 1;
    const colour = colourOf(s);
    const id = `${colour}|${s.pending}`;
    let b = batches.get(id);
    if (!b) {
      b = { colour, pending: s.pending, outlines: [], lines: [], markers: [] };
      batches.set(id, b);
    }
    if (s.kind === 'polygon' || s.kind === 'rectangle') b.outlines.push(s);
    else if (s.kind === 'point' || s.kind === 'text') b.markers.push(s);
    else b.lines.push(s);
    if (s.kind === 'ruler' || s.kind === 'angle' || s.kind === 'text') labelled.push(s);
  }
  // Saved shapes first, so the dashed unsaved ones lie on top.
  return { batches: [...batches.values()].sort((a, b) => Number(a.pending) - Number(b.pending)), labelled, count };
}
