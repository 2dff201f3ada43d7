import type Konva from 'konva';
import type { ImageSize, Viewport } from '../../../shared/viewer/viewport';
import { OverlayLayer } from './overlay-layer';
import { ShapeLayer } from './shape-layer';
import { TileLayer } from './tile-layer';

type KonvaModule = typeof Konva;

/** While the view moves, the shape layer is redrawn this long after the last move… */
const SHAPES_SETTLE_MS = 120;
/** …or at least this often, so shapes panned into view do not wait for the end of a long drag. */
const SHAPES_MAX_STALE_MS = 1000;

/**
 * The konva stage of one image: tiles, the shape layer and the overlay, stacked. A view change
 * only moves and scales the layers; drawing happens once per animation frame, whatever number of
 * changes arrived in between. While the view moves, the shape layer (thousands of shapes) is not
 * drawn again each frame: its last picture is moved and scaled by a CSS transform, and it is
 * drawn afresh when the movement pauses. No Angular here: the page feeds it.
 */
export class MicrographStage {
  readonly tiles: TileLayer;
  readonly shapes: ShapeLayer;
  readonly overlay: OverlayLayer;
  private readonly stage: Konva.Stage;
  private view: Viewport;
  private frame = 0;
  private dirty = { tiles: false, shapes: false, overlay: false };
  /** The view the shape layer's canvas shows, and when it was drawn. */
  private shapesView: Viewport | null = null;
  private shapesDrawnAt = 0;
  private settleTimer: ReturnType<typeof setTimeout> | null = null;

  constructor(
    K: KonvaModule,
    container: HTMLDivElement,
    image: ImageSize,
    view: Viewport,
    urls: { tile: (level: number, col: number, row: number) => string; preview: string },
  ) {
    this.view = view;
    this.stage = new K.Stage({ container, width: view.width, height: view.height, listening: false });
    this.tiles = new TileLayer(K, image, urls.tile, urls.preview, () => this.invalidate('tiles'));
    this.shapes = new ShapeLayer(K);
    this.overlay = new OverlayLayer(K);
    this.stage.add(this.tiles.layer, this.shapes.layer, this.overlay.layer);
    this.setViewport(view);
  }

  /** The layer whose canvas the display-only tone filter applies to. */
  get tileCanvas(): HTMLCanvasElement {
    return this.tiles.layer.getNativeCanvasElement();
  }

  setViewport(v: Viewport): void {
    if (v.width !== this.view.width || v.height !== this.view.height) this.stage.size({ width: v.width, height: v.height });
    this.view = v;
    const t = { x: -v.x * v.scale, y: -v.y * v.scale, scaleX: v.scale, scaleY: v.scale };
    this.tiles.layer.setAttrs(t);
    this.shapes.layer.setAttrs(t);
    this.overlay.layer.setAttrs(t);
    this.shapes.setViewport(v);
    this.overlay.setScale(v.scale);
    this.invalidate('tiles', 'overlay');
    this.moveShapesPicture(v);
  }

  /** Draws the named layers at the next frame. */
  invalidate(...layers: ('tiles' | 'shapes' | 'overlay')[]): void {
    for (const l of layers) this.dirty[l] = true;
    if (this.frame) return;
    this.frame = requestAnimationFrame(() => this.drawNow());
  }

  destroy(): void {
    cancelAnimationFrame(this.frame);
    if (this.settleTimer) clearTimeout(this.settleTimer);
    this.tiles.destroy();
    this.shapes.destroy();
    this.overlay.destroy();
    this.stage.destroy();
  }

  private drawNow(): void {
    this.frame = 0;
    const { tiles, shapes, overlay } = this.dirty;
    this.dirty = { tiles: false, shapes: false, overlay: false };
    if (tiles) {
      this.tiles.update(this.view, window.devicePixelRatio || 1);
      this.tiles.layer.draw();
    }
    if (shapes) {
      this.shapes.layer.draw();
      this.shapes.layer.getNativeCanvasElement().style.transform = '';
      this.shapesView = this.view;
      this.shapesDrawnAt = performance.now();
    }
    if (overlay) this.overlay.layer.draw();
  }

  /**
   * Shows the shape layer's last picture where the new view puts it (scale k = new / drawn,
   * shifted by the drawn origin's new screen position), and schedules a real draw.
   */
  private moveShapesPicture(v: Viewport): void {
    const drawn = this.shapesView;
    const sameSize = drawn && drawn.width === v.width && drawn.height === v.height;
    if (!drawn || !sameSize || performance.now() - this.shapesDrawnAt > SHAPES_MAX_STALE_MS) {
      this.invalidate('shapes');
      return;
    }
    const k = v.scale / drawn.scale;
    const tx = (drawn.x - v.x) * v.scale;
    const ty = (drawn.y - v.y) * v.scale;
    const canvas = this.shapes.layer.getNativeCanvasElement();
    canvas.style.transformOrigin = '0 0';
    canvas.style.transform = `translate(${tx}px, ${ty}px) scale(${k})`;
    if (this.settleTimer) clearTimeout(this.settleTimer);
    this.settleTimer = setTimeout(() => {
      this.settleTimer = null;
      this.invalidate('shapes');
    }, SHAPES_SETTLE_MS);
  }
}
