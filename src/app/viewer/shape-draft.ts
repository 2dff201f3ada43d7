import type { AnnotationKind } from '../../../shared/annotations/annotations';
import { distance, type Point } from '../../../shared/annotations/geometry';
import { appendIfApart, FREEHAND_MIN_SPACING_PX, FREEHAND_TOLERANCE_PX, freehandOutline } from './freehand';

/**
 * The shape being drawn, as a small state machine fed with pointer events in image pixels.
 * `unit` in every call is image pixels per screen pixel (1 / scale), so thresholds stay the
 * same on screen at any zoom. Pure: the canvas only forwards events and draws `preview()`.
 */

export const DRAW_TOOLS = ['polyline', 'polygon', 'freehand', 'rectangle', 'point', 'ruler', 'angle', 'text', 'calibrate', 'pin'] as const;
export type DrawTool = (typeof DRAW_TOOLS)[number];

/** The stored kind each tool makes; the calibration line and a comment pin are not annotations. */
export const KIND_OF_TOOL: Record<DrawTool, AnnotationKind | null> = {
  polyline: 'polyline',
  polygon: 'polygon',
  freehand: 'polygon',
  rectangle: 'rectangle',
  point: 'point',
  ruler: 'ruler',
  angle: 'angle',
  text: 'text',
  calibrate: null,
  pin: null,
};

/** Tools whose shape follows a drag; the others place points by clicks, and a drag pans. */
export const DRAG_TOOLS: ReadonlySet<DrawTool> = new Set(['freehand', 'rectangle', 'ruler', 'calibrate', 'pin']);

/** Screen pixels: a click that closes an outline on its first point, and a move still counted as a click. */
export const CLOSE_RADIUS_PX = 8;
export const CLICK_SLOP_PX = 4;

export interface FinishedDraft {
  tool: DrawTool;
  points: [number, number][];
}

export class ShapeDraft {
  private vertices: Point[] = [];
  private cursor: Point | null = null;
  /** The drag tools' first point, and whether it was placed by the press under way. */
  private anchor: Point | null = null;
  private anchorThisPress = false;
  private pressed = false;

  constructor(readonly tool: DrawTool) {}

  /** Nothing placed yet. */
  get isEmpty(): boolean {
    return this.vertices.length === 0 && this.anchor === null;
  }

  /** A click of the click tools (a press and release without moving). */
  click(p: Point, unit: number): FinishedDraft | null {
    switch (this.tool) {
      case 'point':
      case 'text':
        return this.done([p]);
      case 'angle':
        this.vertices.push(p);
        return this.vertices.length === 3 ? this.done(this.vertices) : null;
      case 'polygon':
        if (this.vertices.length >= 3 && distance(p, this.vertices[0]!) <= CLOSE_RADIUS_PX * unit) return this.done(this.vertices);
        this.pushDistinct(p, unit);
        return null;
      case 'polyline':
        this.pushDistinct(p, unit);
        return null;
      default:
        return null;
    }
  }

  /** Enter or a double click: ends a polyline or polygon with what it has, when that is enough. */
  finish(): FinishedDraft | null {
    if (this.tool === 'polyline' && this.vertices.length >= 2) return this.done(this.vertices);
    if (this.tool === 'polygon' && this.vertices.length >= 3) return this.done(this.vertices);
    return null;
  }

  /** Pointer down with a drag tool. */
  press(p: Point): void {
    this.pressed = true;
    if (this.tool === 'freehand') {
      this.vertices = [p];
      return;
    }
    if (!this.anchor) {
      this.anchor = p;
      this.anchorThisPress = true;
    }
    this.cursor = p;
  }

  /** Pointer moves with the button held (drag tools). */
  drag(p: Point, unit: number): void {
    if (!this.pressed) return this.hover(p);
    if (this.tool === 'freehand') appendIfApart(this.vertices, p, FREEHAND_MIN_SPACING_PX * unit);
    else this.cursor = p;
  }

  /** Pointer up with a drag tool; `moved` when the pointer left the click slop since the press. */
  release(p: Point, moved: boolean, unit: number): FinishedDraft | null {
    if (!this.pressed) return null;
    this.pressed = false;
    if (this.tool === 'freehand') {
      appendIfApart(this.vertices, p, FREEHAND_MIN_SPACING_PX * unit);
      const ring = freehandOutline(this.vertices, FREEHAND_MIN_SPACING_PX * unit, FREEHAND_TOLERANCE_PX * unit);
      if (ring.length < 3) return this.reset();
      return this.done(ring);
    }
    const anchor = this.anchor;
    if (!anchor) return null;
    // A comment pin: a click pins a point, a drag a box-shaped region.
    if (this.tool === 'pin' && (!moved || distance(anchor, p) <= CLICK_SLOP_PX * unit)) return this.done([anchor]);
    if (this.tool === 'pin') return this.done(rectangleCorners(anchor, p));
    // A click without dragging places the first point; the next click places the second.
    if (this.anchorThisPress && !moved) {
      this.anchorThisPress = false;
      return null;
    }
    if (distance(anchor, p) <= CLICK_SLOP_PX * unit) return null;
    return this.done(this.tool === 'rectangle' ? rectangleCorners(anchor, p) : [anchor, p]);
  }

  /** Pointer moves without a button: the rubber band follows. */
  hover(p: Point): void {
    this.cursor = p;
  }

  /** Backspace: takes the last placed point back; false when there was none. */
  removeLast(): boolean {
    if (this.anchor && this.tool !== 'freehand') {
      this.reset();
      return true;
    }
    if (this.vertices.length === 0) return false;
    this.vertices.pop();
    return true;
  }

  /** What to draw now: the placed points and the rubber band to the cursor. */
  preview(): Point[] {
    if (this.tool === 'freehand') return this.vertices.slice();
    if (this.anchor) {
      const to = this.cursor ?? this.anchor;
      return this.tool === 'rectangle' || this.tool === 'pin' ? rectangleCorners(this.anchor, to) : [this.anchor, to];
    }
    if (this.vertices.length === 0) return [];
    return this.cursor ? [...this.vertices, this.cursor] : this.vertices.slice();
  }

  private pushDistinct(p: Point, unit: number): void {
    const last = this.vertices[this.vertices.length - 1];
    if (!last || distance(last, p) > CLICK_SLOP_PX * unit) this.vertices.push(p);
  }

  private done(points: readonly Point[]): FinishedDraft {
    const finished = { tool: this.tool, points: points.map((q) => [q[0], q[1]] as [number, number]) };
    this.reset();
    return finished;
  }

  private reset(): null {
    this.vertices = [];
    this.anchor = null;
    this.anchorThisPress = false;
    this.pressed = false;
    return null;
  }
}

/** The four corners of an axis-aligned rectangle from two opposite corners, clockwise on screen. */
export function rectangleCorners(a: Point, b: Point): [number, number][] {
  const [x0, x1] = [Math.min(a[0], b[0]), Math.max(a[0], b[0])];
  const [y0, y1] = [Math.min(a[1], b[1]), Math.max(a[1], b[1])];
  return [
    [x0, y0],
    [x1, y0],
    [x1, y1],
    [x0, y1],
  ];
}
