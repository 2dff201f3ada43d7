import type Konva from 'konva';
import type { Coordinates } from '../../../shared/annotations/annotations';
import type { Viewport } from '../../../shared/viewer/viewport';
import { NOTE_MAX_CHARS, POINT_RADIUS_PX, type Bounds } from './hit-test';
import { measurementLabel } from './measurements';
import { batchShapes, type ShapeBatch } from './shape-batches';
import type { ViewShape } from './view-shapes';

type KonvaModule = typeof Konva;

/** The view in image pixels and the zoom, for culling and screen-sized marks. */
interface DrawState {
  scale: number;
  visible: Bounds;
  umPerPx: number | null;
}

const HALO = 'rgba(12, 14, 18, 0.6)';
const LABEL_FONT = '500 12px "IBM Plex Sans", system-ui, sans-serif';

/**
 * All annotations on one layer that never listens (hits are found in image pixels, see
 * hit-test.ts), drawn by one node in batches: per colour, one path for the fills, one for the
 * strokes, one for the markers (see shape-batches.ts). Coordinates stay in image pixels; the
 * layer's transform does the zoom, and shapes out of view are left out.
 */
export class ShapeLayer {
  readonly layer: Konva.Layer;
  private readonly state: DrawState = { scale: 1, visible: { minX: 0, minY: 0, maxX: 0, maxY: 0 }, umPerPx: null };
  private shapes: readonly ViewShape[] = [];
  private colourOf: (s: ViewShape) => string = () => '#7a8894';
  private shown: (s: ViewShape) => boolean = () => true;
  private hiddenKey: string | null = null;

  constructor(K: KonvaModule) {
    this.layer = new K.Layer({ listening: false });
    this.layer.add(new K.Shape({ listening: false, perfectDrawEnabled: false, shadowForStrokeEnabled: false, sceneFunc: (ctx) => this.draw(ctx._context) }));
  }

  setViewport(v: Viewport): void {
    this.state.scale = v.scale;
    // A margin so labels and markers that stick out of a shape's bounds still draw at the edge.
    const m = 80 / v.scale;
    this.state.visible = { minX: v.x - m, minY: v.y - m, maxX: v.x + v.width / v.scale + m, maxY: v.y + v.height / v.scale + m };
  }

  setCalibration(umPerPx: number | null): void {
    this.state.umPerPx = umPerPx;
  }

  /** What to draw: the shapes in order, their colours, which are shown, and one left to the overlay while it is dragged. */
  sync(shapes: readonly ViewShape[], colourOf: (s: ViewShape) => string, shown: (s: ViewShape) => boolean, hiddenKey: string | null): void {
    this.shapes = shapes;
    this.colourOf = colourOf;
    this.shown = shown;
    this.hiddenKey = hiddenKey;
  }

  destroy(): void {
    this.layer.destroy();
  }

  private draw(c: CanvasRenderingContext2D): void {
    const pr = this.layer.getCanvas().getPixelRatio();
    const { scale, visible, umPerPx } = this.state;
    const { batches, labelled, count } = batchShapes(this.shapes, visible, this.shown, this.hiddenKey, this.colourOf);
    const dense = count > DENSE_SHAPES;
    for (const b of batches) drawBatch(c, scale, b, dense);
    if (dense && labelled.length > MAX_LABELS) return;
    for (const s of labelled) {
      const colour = this.colourOf(s);
      if (s.kind === 'text') screenText(c, pr, s.points[0]!, truncate(s.label), colour, 'note');
      else screenText(c, pr, labelAnchor(s.kind, s.points), measurementLabel(s.kind, s.points, umPerPx), colour, 'measure');
    }
  }
}

/** Above this many shapes in view, edges are drawn as thin lines without halo: software canvases rasterise hairlines far faster. */
const DENSE_SHAPES = 400;
/** Above this many labels in a dense view, labels are left out (they would cover each other anyway). */
const MAX_LABELS = 150;

/**
 * One colour's shapes. Widths are divided by the zoom because the path stays in image pixels
 * (no transform reset per shape); one screen pixel wide edges take the canvas's hairline path.
 */
function drawBatch(c: CanvasRenderingContext2D, scale: number, b: ShapeBatch, dense: boolean): void {
  const px = 1 / scale;
  c.lineJoin = 'round';
  c.lineCap = 'round';
  c.setLineDash(b.pending ? [6 * px, 4 * px] : []);
  c.fillStyle = `${b.colour}2e`;
  for (const s of [...b.outlines, ...b.lines]) {
    c.beginPath();
    pathThrough(c, s.points);
    const closed = s.kind === 'polygon' || s.kind === 'rectangle';
    if (closed) {
      c.closePath();
      c.fill();
    }
    if (s.kind === 'ruler' && s.points.length === 2) rulerEnds(c, scale, s.points);
    if (s.kind === 'angle' && s.points.length === 3) angleArc(c, scale, s.points);
    if (!dense) {
      c.lineWidth = 4 * px;
      c.strokeStyle = HALO;
      c.stroke();
    }
    c.lineWidth = (dense ? 1 : 2) * px;
    c.strokeStyle = b.colour;
    c.stroke();
  }
  if (b.markers.length === 0) return;
  const r = POINT_RADIUS_PX * px;
  c.fillStyle = b.colour;
  if (dense) {
    // Small squares: the cheapest mark that still shows where each point is.
    for (const s of b.markers) c.fillRect(s.points[0]![0] - 0.7 * r, s.points[0]![1] - 0.7 * r, 1.4 * r, 1.4 * r);
    return;
  }
  c.strokeStyle = '#ffffff';
  c.lineWidth = 1.5 * px;
  for (const s of b.markers) {
    c.beginPath();
    c.arc(s.points[0]![0], s.points[0]![1], r, 0, Math.PI * 2);
    c.fill();
    c.stroke();
  }
}

/**
 * Draws one shape (the selection, the draft) with the raw canvas context, whose transform maps
 * image pixels to the screen. Paths are built in image pixels; strokes, markers and text are
 * sized in screen pixels.
 */
export function drawShape(
  c: CanvasRenderingContext2D,
  pixelRatio: number,
  scale: number,
  kind: ViewShape['kind'],
  points: Coordinates,
  text: string,
  colour: string,
  extra: { label: string; pending: boolean; width?: number },
): void {
  if (points.length === 0) return;
  const width = extra.width ?? 2;
  const marker = kind === 'point' || kind === 'text';
  c.beginPath();
  if (marker) {
    const [x, y] = points[0]!;
    c.arc(x, y, POINT_RADIUS_PX / scale, 0, Math.PI * 2);
  } else {
    pathThrough(c, points);
    if (kind === 'polygon' || kind === 'rectangle') c.closePath();
    if (kind === 'ruler' && points.length === 2) rulerEnds(c, scale, points);
    if (kind === 'angle' && points.length === 3) angleArc(c, scale, points);
  }
  if (kind === 'polygon' || kind === 'rectangle' || marker) {
    c.fillStyle = marker ? colour : `${colour}2e`;
    c.fill();
  }
  strokeScreen(c, pixelRatio, marker ? '#ffffff' : colour, marker ? 1.5 : width, extra.pending);
  const at = labelAnchor(kind, points);
  if (kind === 'text') screenText(c, pixelRatio, at, truncate(text), colour, 'note');
  else if (extra.label) screenText(c, pixelRatio, at, extra.label, colour, 'measure');
}

function pathThrough(c: CanvasRenderingContext2D, points: Coordinates): void {
  c.moveTo(points[0]![0], points[0]![1]);
  for (let i = 1; i < points.length; i++) c.lineTo(points[i]![0], points[i]![1]);
}

/** Adds short ticks across both ends of a ruler, 10 screen px long, to the current path. */
function rulerEnds(c: CanvasRenderingContext2D, scale: number, [a, b]: Coordinates): void {
  const dx = b![0] - a![0];
  const dy = b![1] - a![1];
  const len = Math.hypot(dx, dy) || 1;
  const nx = (-dy / len) * (5 / scale);
  const ny = (dx / len) * (5 / scale);
  for (const [x, y] of [a!, b!]) {
    c.moveTo(x - nx, y - ny);
    c.lineTo(x + nx, y + ny);
  }
}

/** Adds a small arc at the vertex, between the two rays, to the current path. */
function angleArc(c: CanvasRenderingContext2D, scale: number, [a, v, b]: Coordinates): void {
  const r = 18 / scale;
  const a1 = Math.atan2(a![1] - v![1], a![0] - v![0]);
  const a2 = Math.atan2(b![1] - v![1], b![0] - v![0]);
  let delta = a2 - a1;
  while (delta > Math.PI) delta -= 2 * Math.PI;
  while (delta < -Math.PI) delta += 2 * Math.PI;
  c.moveTo(v![0] + r * Math.cos(a1), v![1] + r * Math.sin(a1));
  c.arc(v![0], v![1], r, a1, a1 + delta, delta < 0);
}

/**
 * Strokes the current path in screen pixels with a dark halo under the colour, so lines read on
 * bright and dark micrographs. The path is already transformed, so resetting the transform keeps it.
 */
function strokeScreen(c: CanvasRenderingContext2D, pixelRatio: number, colour: string, width: number, dashed: boolean): void {
  c.save();
  c.setTransform(pixelRatio, 0, 0, pixelRatio, 0, 0);
  if (dashed) c.setLineDash([6, 4]);
  c.lineJoin = 'round';
  c.lineCap = 'round';
  c.lineWidth = width + 2;
  c.strokeStyle = HALO;
  c.stroke();
  c.lineWidth = width;
  c.strokeStyle = colour;
  c.stroke();
  c.restore();
}

function labelAnchor(kind: ViewShape['kind'], points: Coordinates): [number, number] {
  if (kind === 'angle' && points.length === 3) return points[1]!;
  if (kind === 'ruler' && points.length === 2) return [(points[0]![0] + points[1]![0]) / 2, (points[0]![1] + points[1]![1]) / 2];
  return points[0]!;
}

function truncate(text: string): string {
  return text.length > NOTE_MAX_CHARS ? `${text.slice(0, NOTE_MAX_CHARS - 1)}…` : text;
}

/** Text at an image point, in screen pixels, light on a dark plate so it reads on any micrograph. */
export function screenText(c: CanvasRenderingContext2D, pixelRatio: number, at: readonly [number, number], text: string, colour: string, style: 'note' | 'measure'): void {
  if (!text) return;
  const m = c.getTransform();
  // Where the image point lands on the canvas, in CSS pixels.
  const sx = (m.a * at[0] + m.c * at[1] + m.e) / pixelRatio;
  const sy = (m.b * at[0] + m.d * at[1] + m.f) / pixelRatio;
  c.save();
  c.setTransform(pixelRatio, 0, 0, pixelRatio, 0, 0);
  c.font = LABEL_FONT;
  const w = c.measureText(text).width;
  const x = sx + (style === 'note' ? POINT_RADIUS_PX + 4 : 8);
  const y = sy - (style === 'note' ? 4 : 8);
  c.fillStyle = 'rgba(12, 14, 18, 0.72)';
  c.fillRect(x - 4, y - 14, w + 8, 18);
  c.fillStyle = colour;
  c.fillRect(x - 4, y - 14, 3, 18);
  c.fillStyle = '#ffffff';
  c.textBaseline = 'alphabetic';
  c.fillText(text, x + 1, y);
  c.restore();
}
