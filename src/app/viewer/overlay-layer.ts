import type Konva from 'konva';
import type { AnnotationKind, Coordinates } from '../../../shared/annotations/annotations';
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

  /** The calibrate tool's line (drawn apart from annotations, in a colour no class uses). */
  setCalibrationLine(points: Coordinates | null): void {
    this.calibrationLine = points;
  }

  destroy(): void {
    this.layer.destroy();
  }

  private draw(c: CanvasRenderingContext2D): void {
    const pr = this.layer.getCanvas().getPixelRatio();
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
