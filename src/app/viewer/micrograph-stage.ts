import type Konva from 'konva';
import type { ImageSize, Viewport } from '../../../shared/viewer/viewport';
import { OverlayLayer } from './overlay-layer';
import { ShapeLayer } from './shape-layer';
import { TileLayer } from './tile-layer';

type KonvaModule = typeof Konva;

/**
 * The konva stage of one image: tiles, the shape layer and the overlay, stacked. A view change
 * only moves and scales the three layers; drawing happens once per animation frame, whatever
 * number of changes arrived in between. No Angular here: the page feeds it.
 */
export class MicrographStage {
  readonly tiles: TileLayer;
  readonly shapes: ShapeLayer;
  readonly overlay: OverlayLayer;
  private readonly stage: Konva.Stage;
  private view: Viewport;
  private frame = 0;
  private dirty = { tiles: false, shapes: false, overlay: false };

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
    this.invalidate('tiles', 'shapes', 'overlay');
  }

  /** Draws the named layers at the next frame. */
  invalidate(...layers: ('tiles' | 'shapes' | 'overlay')[]): void {
    for (const l of layers) this.dirty[l] = true;
    if (this.frame) return;
    this.frame = requestAnimationFrame(() => this.drawNow());
  }

  destroy(): void {
    cancelAnimationFrame(this.frame);
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
    if (shapes) this.shapes.layer.draw();
    if (overlay) this.overlay.layer.draw();
  }
}
