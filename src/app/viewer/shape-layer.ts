import type Konva from 'konva';
import type { Context } from 'konva/lib/Context';
import type { Coordinates } from '../../../shared/annotations/annotations';
import type { Viewport } from '../../../shared/viewer/viewport';
import { boundsIntersect, NOTE_MAX_CHARS, POINT_RADIUS_PX, type Bounds } from './hit-test';
import { measurementLabel } from './measurements';
import type { ViewShape } from './view-shapes';

type KonvaModule = typeof Konva;

/** What a shape is drawn with. */
export interface ShapeStyle {
  colour: string;
}

/** Shared with every node's draw function: the view in image pixels and the zoom. */
interface DrawState {
  scale: number;
  visible: Bounds;
  umPerPx: number | null;
}

const HALO = 'rgba(12, 14, 18, 0.6)';
const LABEL_FONT = '500 12px "IBM Plex Sans", system-ui, sans-serif';

/**
 * All annotations on one layer that never listens (hits are found in image pixels, see
 * hit-test.ts). Nodes carry image coordinates; the layer's transform does the zoom, so a pan
 * or zoom redraws without touching a single shape. Each node skips itself when out of view.
 */
export class ShapeLayer {
  readonly layer: Konva.Layer;
  private readonly nodes = new Map<string, Konva.Shape>();
  private readonly state: DrawState = { scale: 1, visible: { minX: 0, minY: 0, maxX: 0, maxY: 0 }, umPerPx: null };

  constructor(private readonly K: KonvaModule) {
    this.layer = new K.Layer({ listening: false });
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

  /** Brings the nodes in line with the list: new, changed (by identity), gone, order, visibility. */
  sync(shapes: readonly ViewShape[], styleOf: (s: ViewShape) => ShapeStyle, shown: (s: ViewShape) => boolean, hiddenKey: string | null): void {
    const keep = new Set<string>();
    let orderChanged = false;
    shapes.forEach((s, i) => {
      keep.add(s.key);
      let node = this.nodes.get(s.key);
      if (!node) {
        node = new this.K.Shape({ listening: false, perfectDrawEnabled: false, shadowForStrokeEnabled: false, sceneFunc: (ctx, n) => this.draw(ctx, n) });
        this.layer.add(node);
        this.nodes.set(s.key, node);
        orderChanged = true;
      }
      if (node.getAttr('shape') !== s) node.setAttr('shape', s);
      node.setAttr('colour', styleOf(s).colour);
      node.visible(shown(s) && s.key !== hiddenKey);
      if (node.index !== i) orderChanged = true;
    });
    for (const [key, node] of this.nodes) {
      if (keep.has(key)) continue;
      node.destroy();
      this.nodes.delete(key);
      orderChanged = true;
    }
    if (orderChanged) shapes.forEach((s, i) => this.nodes.get(s.key)?.zIndex(i));
  }

  destroy(): void {
    this.layer.destroy();
  }

  private draw(ctx: Context, node: Konva.Shape): void {
    const s = node.getAttr('shape') as ViewShape;
    if (!boundsIntersect(s.bounds, this.state.visible)) return;
    drawShape(ctx._context, node.getLayer()!.getCanvas().getPixelRatio(), this.state.scale, s.kind, s.points, s.label, node.getAttr('colour'), {
      label: s.kind === 'ruler' || s.kind === 'angle' ? measurementLabel(s.kind, s.points, this.state.umPerPx) : '',
      pending: s.pending,
    });
  }
}

/**
 * Draws one shape with the raw canvas context, whose transform maps image pixels to the screen.
 * Paths are built in image pixels; strokes, markers and text are sized in screen pixels.
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
  const width = extra.width ?? 2;
  if (points.length === 0) return;
  c.beginPath();
  if (kind === 'point' || kind === 'text') {
    const [x, y] = points[0]!;
    c.arc(x, y, POINT_RADIUS_PX / scale, 0, Math.PI * 2);
  } else if (kind === 'angle') {
    pathThrough(c, points);
  } else {
    pathThrough(c, points);
    if (kind === 'polygon' || kind === 'rectangle') c.closePath();
  }
  c.save();
  if (kind === 'polygon' || kind === 'rectangle' || kind === 'point' || kind === 'text') {
    c.fillStyle = kind === 'point' || kind === 'text' ? colour : `${colour}2e`;
    c.fill();
  }
  // Strokes in screen pixels: the path is already transformed, so resetting the transform keeps it.
  c.setTransform(pixelRatio, 0, 0, pixelRatio, 0, 0);
  if (extra.pending) c.setLineDash([6, 4]);
  c.lineJoin = 'round';
  c.lineCap = 'round';
  c.lineWidth = width + 2;
  c.strokeStyle = HALO;
  c.stroke();
  c.lineWidth = kind === 'point' || kind === 'text' ? 1.5 : width;
  c.strokeStyle = kind === 'point' || kind === 'text' ? '#ffffff' : colour;
  c.stroke();
  c.restore();
  if (kind === 'ruler' && points.length === 2) drawRulerEnds(c, pixelRatio, scale, points, colour);
  if (kind === 'angle' && points.length === 3) drawAngleArc(c, pixelRatio, scale, points, colour);
  const at = labelAnchor(kind, points);
  if (kind === 'text') screenText(c, pixelRatio, at, truncate(text), colour, 'note');
  else if (extra.label) screenText(c, pixelRatio, at, extra.label, colour, 'measure');
}

function pathThrough(c: CanvasRenderingContext2D, points: Coordinates): void {
  c.moveTo(points[0]![0], points[0]![1]);
  for (let i = 1; i < points.length; i++) c.lineTo(points[i]![0], points[i]![1]);
}

/** Short ticks across both ends of a ruler, 10 screen px long. */
function drawRulerEnds(c: CanvasRenderingContext2D, pixelRatio: number, scale: number, [a, b]: Coordinates, colour: string): void {
  const dx = b![0] - a![0];
  const dy = b![1] - a![1];
  const len = Math.hypot(dx, dy) || 1;
  const nx = (-dy / len) * (5 / scale);
  const ny = (dx / len) * (5 / scale);
  c.beginPath();
  for (const [x, y] of [a!, b!]) {
    c.moveTo(x - nx, y - ny);
    c.lineTo(x + nx, y + ny);
  }
  strokeScreen(c, pixelRatio, colour, 2);
}

/** A small arc at the vertex between the two rays. */
function drawAngleArc(c: CanvasRenderingContext2D, pixelRatio: number, scale: number, [a, v, b]: Coordinates, colour: string): void {
  const r = 18 / scale;
  const a1 = Math.atan2(a![1] - v![1], a![0] - v![0]);
  const a2 = Math.atan2(b![1] - v![1], b![0] - v![0]);
  let delta = a2 - a1;
  while (delta > Math.PI) delta -= 2 * Math.PI;
  while (delta < -Math.PI) delta += 2 * Math.PI;
  c.beginPath();
  c.arc(v![0], v![1], r, a1, a1 + delta, delta < 0);
  strokeScreen(c, pixelRatio, colour, 1.5);
}

function strokeScreen(c: CanvasRenderingContext2D, pixelRatio: number, colour: string, width: number): void {
  c.save();
  c.setTransform(pixelRatio, 0, 0, pixelRatio, 0, 0);
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
