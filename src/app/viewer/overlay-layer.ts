import type Konva from 'konva';
import type { AnnotationKind, Coordinates } from '../../../shared/annotations/annotations';
import { PIN_RADIUS_PX, type ViewPin } from './review-pins';
import { edgeMidpoints } from './shape-edits';
import { drawShape } from './shape-layer';

type KonvaModule = typeof Konva;

/** A shape drawn over the others: the selection being edited, or the draft being drawn. */
export interface OverlayShape {
  kind: AnnotationKind;
  points: Coordinates;
  label: string;
  colour: string;
  /** Measurement shown beside it while it is drawn or edited. */
  measurement: string;
}

const HANDLE_PX = 7;
const MIDPOINT_RADIUS_PX = 3.5;
const PIN_OPEN = '#e0892b';
const PIN_RESOLVED = '#8d969e';
const PIN_FONT = '600 11px "IBM Plex Mono", ui-monospace, monospace';
const CALIBRATION_COLOUR = '#ffd23f';

/**
 * The few things that change while the pointer moves (the selection with its vertex handles,
 * the shape being drawn, the calibration line) on a small layer of their own, so a drag redraws
 * one node and not the thousands of stored shapes.
 */
export class OverlayLayer {
  readonly layer: Konva.Layer;
  private selection: OverlayShape | null = null;
  private handles = false;
  private draft: OverlayShape | null = null;
  private calibrationLine: Coordinates | null = null;
  private pins: readonly ViewPin[] = [];
  private focusedPin: string | null = null;
  private scale = 1;

  constructor(K: KonvaModule) {
    this.layer = new K.Layer({ listening: false });
    this.layer.add(new K.Shape({ listening: false, perfectDrawEnabled: false, sceneFunc: (ctx) => this.draw(ctx._context) }));
  }

  setScale(scale: number): void {
    this.scale = scale;
  }

  setSelection(shape: OverlayShape | null, handles: boolean): void {
    this.selection = shape;
    this.handles = handles;
  }

  setDraft(shape: OverlayShape | null): void {
    this.draft = shape;
  }

  /** Comment pins, numbered; the focused one ringed. */
  setPins(pins: readonly ViewPin[], focused: string | null): void {
    this.pins = pins;
    this.focusedPin = focused;
  }

  /** The calibrate tool's line (drawn apart from annotations, in a colour no class uses). */
  setCalibrationLine(points: Coordinates | null): void {
    this.calibrationLine = points;
  }

  destroy(): void {
    this.layer.destroy();
  }

  private draw(c: CanvasRenderingContext2D): void {
    const pr = this.layer.getCanvas().getPixelRatio();
    if (this.pins.length > 0) this.drawPins(c, pr);
    if (this.selection) {
      const s = this.selection;
      drawShape(c, pr, this.scale, s.kind, s.points, s.label, s.colour, { label: s.measurement, pending: false, width: 3 });
      if (this.handles && s.kind !== 'point' && s.kind !== 'text') this.drawHandles(c, pr, s.kind, s.points);
    }
    if (this.calibrationLine && this.calibrationLine.length === 2) {
      drawShape(c, pr, this.scale, 'ruler', this.calibrationLine, '', CALIBRATION_COLOUR, { label: '', pending: false, width: 2 });
    }
    if (this.draft) {
      const d = this.draft;
      // An outline being clicked point by point shows as an open path until it closes.
      const kind = d.kind === 'polygon' ? 'polyline' : d.kind;
      drawShape(c, pr, this.scale, kind, d.points, d.label, d.colour, { label: d.measurement, pending: true, width: 2 });
    }
  }

  /**
   * Comment pins: a region's outline dashed, then every marker as a numbered disc in screen
   * pixels (amber while open, grey once resolved), the focused one with a white ring.
   */
  private drawPins(c: CanvasRenderingContext2D, pr: number): void {
    const m = c.getTransform();
    for (const pin of this.pins) {
      if (!pin.ring) continue;
      c.beginPath();
      pin.ring.forEach(([x, y], i) => (i === 0 ? c.moveTo(x, y) : c.lineTo(x, y)));
      c.closePath();
      c.save();
      c.setTransform(pr, 0, 0, pr, 0, 0);
      c.setLineDash([5, 4]);
      c.lineWidth = pin.threadId === this.focusedPin ? 2.5 : 1.5;
      c.strokeStyle = pin.open ? PIN_OPEN : PIN_RESOLVED;
      c.stroke();
      c.restore();
    }
    c.save();
    c.setTransform(pr, 0, 0, pr, 0, 0);
    c.font = PIN_FONT;
    c.textAlign = 'center';
    c.textBaseline = 'middle';
    for (const pin of this.pins) {
      const [x, y] = pin.at;
      const sx = (m.a * x + m.c * y + m.e) / pr;
      const sy = (m.b * x + m.d * y + m.f) / pr;
      c.beginPath();
      c.arc(sx, sy, PIN_RADIUS_PX, 0, Math.PI * 2);
      c.fillStyle = pin.open ? PIN_OPEN : PIN_RESOLVED;
      c.fill();
      c.lineWidth = pin.threadId === this.focusedPin ? 3 : 1.5;
      c.strokeStyle = pin.threadId === this.focusedPin ? '#ffffff' : '#101418';
      c.stroke();
      c.fillStyle = '#1b1208';
      c.fillText(String(pin.number), sx, sy + 0.5);
    }
    c.restore();
  }

  /**
   * Square handles, fixed in screen size, on every vertex; on lines and outlines also small round
   * ones in the middle of each edge, to pull a new vertex out of.
   */
  private drawHandles(c: CanvasRenderingContext2D, pr: number, kind: AnnotationKind, points: Coordinates): void {
    const m = c.getTransform();
    const toScreen = ([x, y]: readonly [number, number]) => [(m.a * x + m.c * y + m.e) / pr, (m.b * x + m.d * y + m.f) / pr] as const;
    c.save();
    c.setTransform(pr, 0, 0, pr, 0, 0);
    c.strokeStyle = '#101418';
    c.lineWidth = 1.5;
    c.fillStyle = 'rgba(255, 255, 255, 0.7)';
    for (const mid of edgeMidpoints(kind, points)) {
      const [sx, sy] = toScreen(mid);
      c.beginPath();
      c.arc(sx, sy, MIDPOINT_RADIUS_PX, 0, Math.PI * 2);
      c.fill();
      c.stroke();
    }
    c.fillStyle = '#ffffff';
    for (const p of points) {
      const [sx, sy] = toScreen(p);
      c.fillRect(sx - HANDLE_PX / 2, sy - HANDLE_PX / 2, HANDLE_PX, HANDLE_PX);
      c.strokeRect(sx - HANDLE_PX / 2, sy - HANDLE_PX / 2, HANDLE_PX, HANDLE_PX);
    }
    c.restore();
  }
}
