import type Konva from 'konva';
import type { Affine } from '../../../shared/viewer/alignment';
import { imageToScreen, screenToImage, type ImageSize, type Viewport } from '../../../shared/viewer/viewport';
import { overlayMatrix, overlayTileView } from './linked-view';
import { TileLayer } from './tile-layer';

type KonvaModule = typeof Konva;

/** A clicked alignment point, numbered as its pair. */
export interface AlignmentMark {
  n: number;
  at: readonly [number, number];
}

/** What the overlaid image needs: its size and where its tiles and preview are. */
export interface OverlaidImage extends ImageSize {
  tile: (level: number, col: number, row: number) => string;
  preview: string;
}

/** A press that moves less than this (screen px) before release is a click, not a pan. */
const CLICK_SLOP_PX = 4;
const MARK_FILL = '#f2b705';

/**
 * A transparent konva stage laid over one pane's stage: numbered marks of clicked alignment
 * points and, on the main pane, the other image drawn through its alignment at an opacity. It
 * never takes pointer events; clicks are watched on the pane's element without stopping them, so
 * panning and zooming keep working while points are picked. No Angular here.
 */
export class AlignmentLayer {
  private readonly el: HTMLDivElement;
  private readonly stage: Konva.Stage;
  private readonly marksLayer: Konva.Layer;
  private overlay: { tiles: TileLayer; transform: Affine } | null = null;
  private view: Viewport;
  private marks: readonly AlignmentMark[] = [];
  private opacity = 1;
  private frame = 0;
  private readonly unlisten: () => void;

  constructor(
    private readonly K: KonvaModule,
    /** The pane's stage element; the layer is inserted right after it, so later siblings (scale bar, read-out) stay on top. */
    stageEl: HTMLElement,
    /** The pane's element that receives pointer events. */
    pointerEl: HTMLElement,
    view: Viewport,
    /** Called with the image point of a click while picking is on. */
    private readonly clicked: (p: [number, number]) => void,
    /** The main pane's tile canvas: the overlaid image goes right above it, below the annotations. */
    private readonly underShapes: HTMLElement | null = null,
  ) {
    this.view = view;
    this.el = document.createElement('div');
    this.el.className = 'alignment-layer';
    Object.assign(this.el.style, { position: 'absolute', inset: '0', pointerEvents: 'none' });
    stageEl.after(this.el);
    this.stage = new K.Stage({ container: this.el, width: view.width, height: view.height, listening: false });
    this.marksLayer = new K.Layer({ listening: false });
    this.stage.add(this.marksLayer);
    this.unlisten = watchClicks(pointerEl, (sx, sy) => {
      const p = screenToImage(this.view, sx, sy);
      this.clicked([p.x, p.y]);
    });
  }

  setViewport(v: Viewport): void {
    if (v.width !== this.view.width || v.height !== this.view.height) this.stage.size({ width: v.width, height: v.height });
    this.view = v;
    this.redraw();
  }

  /** Draws `image` over the pane through `transform` (its px → the pane image's px); null removes it. */
  showImage(image: OverlaidImage, transform: Affine | null): void {
    if (!transform) return this.hideImage();
    if (!this.overlay) {
      const tiles = new TileLayer(this.K, image, image.tile, image.preview, () => this.redraw());
      this.stage.add(tiles.layer);
      tiles.layer.moveToBottom();
      const canvas = tiles.layer.getNativeCanvasElement();
      canvas.classList.add('alignment-overlay');
      // Between the micrograph and its shapes, so the annotations stay readable over the other image.
      this.underShapes?.after(canvas);
      this.overlay = { tiles, transform };
      this.setOpacity(this.opacity);
    }
    this.overlay.transform = transform;
    this.redraw();
  }

  hideImage(): void {
    this.overlay?.tiles.destroy();
    this.overlay = null;
    this.redraw();
  }

  /** 0 (invisible) to 1 (opaque); only the overlaid image fades, the marks stay. A CSS opacity: no redraw. */
  setOpacity(opacity: number): void {
    this.opacity = opacity;
    this.overlay?.tiles.layer.getNativeCanvasElement().style.setProperty('opacity', String(opacity));
  }

  setMarks(marks: readonly AlignmentMark[]): void {
    this.marks = marks;
    this.redraw();
  }

  destroy(): void {
    cancelAnimationFrame(this.frame);
    this.unlisten();
    this.overlay?.tiles.destroy();
    this.stage.destroy();
    this.el.remove();
  }

  private redraw(): void {
    if (this.frame) return;
    this.frame = requestAnimationFrame(() => {
      this.frame = 0;
      this.drawOverlay();
      this.drawMarks();
    });
  }

  private drawOverlay(): void {
    if (!this.overlay) return;
    const { tiles, transform } = this.overlay;
    tiles.layer.setAttrs(new this.K.Transform(asArray(overlayMatrix(this.view, transform))).decompose());
    tiles.update(overlayTileView(this.view, transform), window.devicePixelRatio || 1);
    tiles.layer.draw();
  }

  private drawMarks(): void {
    this.marksLayer.destroyChildren();
    for (const m of this.marks) {
      const s = imageToScreen(this.view, m.at[0], m.at[1]);
      const group = new this.K.Group({ x: s.x, y: s.y, listening: false });
      group.add(new this.K.Circle({ radius: 9, fill: 'rgba(12, 14, 18, 0.75)', stroke: MARK_FILL, strokeWidth: 2 }));
      group.add(new this.K.Line({ points: [-14, 0, -10, 0, 10, 0, 14, 0], stroke: MARK_FILL, strokeWidth: 1.5 }));
      group.add(new this.K.Text({ text: String(m.n), x: -9, y: -6, width: 18, align: 'center', fontSize: 12, fontStyle: 'bold', fill: '#ffffff' }));
      this.marksLayer.add(group);
    }
    this.marksLayer.draw();
  }
}

function asArray(t: Affine): [number, number, number, number, number, number] {
  return [t.a, t.b, t.c, t.d, t.e, t.f];
}

/**
 * Calls `fn` with element-local coordinates for each primary-button click that did not move
 * further than CLICK_SLOP_PX; listens in the capture phase and never stops the event, so the
 * pane's own pointer handling (pan, select) carries on as usual.
 */
function watchClicks(el: HTMLElement, fn: (x: number, y: number) => void): () => void {
  let down: { x: number; y: number; id: number } | null = null;
  const onDown = (e: PointerEvent) => {
    down = e.button === 0 && e.isPrimary ? { x: e.clientX, y: e.clientY, id: e.pointerId } : null;
  };
  const onUp = (e: PointerEvent) => {
    if (!down || e.pointerId !== down.id) return;
    const moved = Math.hypot(e.clientX - down.x, e.clientY - down.y);
    down = null;
    if (moved > CLICK_SLOP_PX) return;
    const r = el.getBoundingClientRect();
    fn(e.clientX - r.left, e.clientY - r.top);
  };
  el.addEventListener('pointerdown', onDown, true);
  el.addEventListener('pointerup', onUp, true);
  return () => {
    el.removeEventListener('pointerdown', onDown, true);
    el.removeEventListener('pointerup', onUp, true);
  };
}
