import type Konva from 'konva';
import { invert, type Affine } from '../../../shared/viewer/alignment';
import type { Viewport } from '../../../shared/viewer/viewport';
import { AlignmentLayer, type AlignmentMark } from './alignment-layer';
import { alignedViewport, linkedViewport, type LinkedImage } from './linked-view';
import type { MicrographStage } from './micrograph-stage';
import type { ViewerInteraction } from './viewer-interaction';
import type { ViewShape } from './view-shapes';

/** konva and the stage classes, loaded with the first image and reused for a compared one. */
export interface StageModules {
  Konva: typeof Konva;
  MicrographStage: typeof import('./micrograph-stage').MicrographStage;
  ViewerInteraction: typeof import('./viewer-interaction').ViewerInteraction;
}

/** An image as the link between panes needs it. */
export interface ComparedImage {
  id: string;
  width: number;
  height: number;
  pixelSize: { xUm: number | null };
}

export function frameOf(i: ComparedImage): LinkedImage {
  return { width: i.width, height: i.height, umPerPx: i.pixelSize.xUm };
}

/** The main pane as the compared one needs it. */
export interface MainPane {
  image: ComparedImage;
  /** The main pane's stage element: the overlay is laid right after it, and clicks on it are picked points. */
  stageEl: HTMLDivElement;
  /** The main pane's tile canvas: the overlaid image is drawn just above it, under the annotations. */
  tileCanvas: HTMLCanvasElement;
  view: () => Viewport | null;
  setView: (v: Viewport) => void;
  viewChanged: (v: Viewport) => void;
}

/** Which pane a picked point was clicked on. */
export type PaneSide = 'main' | 'other';

/**
 * A second image of the same location beside the main one: its own tile stage with its own
 * annotations (read-only), showing what the main view shows (linked-view.ts). Dragging or zooming
 * in it moves the main view, which moves both. Once the two are aligned (alignment.ts), the link
 * follows the alignment and the image can be laid over the main one at an opacity. No Angular here.
 */
export class ComparePane {
  private readonly stage: MicrographStage;
  private readonly interaction: ViewerInteraction;
  private readonly observer: ResizeObserver;
  private readonly mainLayer: AlignmentLayer;
  private readonly otherLayer: AlignmentLayer;
  private view: Viewport;
  /** Other px → main px, once aligned. */
  private alignment: Affine | null = null;
  private overlay = { shown: false, opacity: 0.5 };
  private picked: ((side: PaneSide, p: [number, number]) => void) | null = null;

  constructor(
    m: StageModules,
    private readonly host: HTMLDivElement,
    private readonly stageHost: HTMLDivElement,
    readonly image: ComparedImage,
    private readonly main: MainPane,
    private readonly urls: { tile: (level: number, col: number, row: number) => string; preview: string },
  ) {
    const mainView = main.view()!;
    this.view = linkedViewport(mainView, frameOf(main.image), frameOf(image), this.size(mainView));
    this.stage = new m.MicrographStage(m.Konva, stageHost, image, this.view, urls);
    this.interaction = new m.ViewerInteraction(stageHost, host, {
      image,
      view: () => this.view,
      setView: (v) => {
        const current = main.view();
        if (current) main.setView(this.mainViewFor(v, { width: current.width, height: current.height }));
      },
      tool: () => 'select',
      canEdit: () => false,
      shapes: () => [],
      selected: () => null,
      select: () => undefined,
      draftChanged: () => undefined,
      finished: () => undefined,
      editPreview: () => undefined,
      commitEdit: () => undefined,
      cursorMoved: () => undefined,
    });
    this.mainLayer = new AlignmentLayer(m.Konva, main.stageEl, main.stageEl, mainView, (p) => this.picked?.('main', p), main.tileCanvas);
    this.otherLayer = new AlignmentLayer(m.Konva, stageHost, stageHost, this.view, (p) => this.picked?.('other', p));
    this.observer = new ResizeObserver(() => {
      const current = main.view();
      if (current) this.follow(current);
    });
    this.observer.observe(host);
    main.viewChanged(this.view);
  }

  /** Shows what main view `v` shows. */
  follow(v: Viewport): void {
    const size = this.size(v);
    this.view = this.alignment ? alignedViewport(v, invert(this.alignment), size) : linkedViewport(v, frameOf(this.main.image), frameOf(this.image), size);
    this.stage.setViewport(this.view);
    this.mainLayer.setViewport(v);
    this.otherLayer.setViewport(this.view);
    this.main.viewChanged(this.view);
  }

  /** The same display-only tone filter as the main pane. */
  setFilter(filter: string): void {
    this.stage.tileCanvas.style.filter = filter;
  }

  /** The compared image's own annotations, drawn read-only in their class colours. */
  setShapes(shapes: readonly ViewShape[], colourOf: (s: ViewShape) => string, shown: (s: ViewShape) => boolean): void {
    this.stage.shapes.setCalibration(this.image.pixelSize.xUm);
    this.stage.shapes.sync(shapes, colourOf, shown, null);
    this.stage.invalidate('shapes');
  }

  /** Other px → main px; null unlinks it to positions in µm or image fractions again. */
  setAlignment(t: Affine | null): void {
    this.alignment = t;
    this.showOverlay();
    const v = this.main.view();
    if (v) this.follow(v);
  }

  /** The aligned image over the main one (only once aligned), `opacity` from 0 to 1. */
  setOverlay(shown: boolean, opacity: number): void {
    this.overlay = { shown, opacity };
    this.showOverlay();
  }

  /** While set, clicks on either pane (not drags) report the image point clicked. */
  setPicking(handler: ((side: PaneSide, p: [number, number]) => void) | null): void {
    this.picked = handler;
    this.main.stageEl.classList.toggle('picking-points', !!handler);
    this.stageHost.classList.toggle('picking-points', !!handler);
  }

  /** Numbered marks of picked points on each pane. */
  setMarks(main: readonly AlignmentMark[], other: readonly AlignmentMark[]): void {
    this.mainLayer.setMarks(main);
    this.otherLayer.setMarks(other);
  }

  destroy(): void {
    this.setPicking(null);
    this.observer.disconnect();
    this.interaction.destroy();
    this.mainLayer.destroy();
    this.otherLayer.destroy();
    this.stage.destroy();
  }

  private showOverlay(): void {
    const t = this.overlay.shown ? this.alignment : null;
    this.mainLayer.showImage({ width: this.image.width, height: this.image.height, ...this.urls }, t);
    this.mainLayer.setOpacity(this.overlay.opacity);
  }

  private mainViewFor(v: Viewport, size: { width: number; height: number }): Viewport {
    return this.alignment ? alignedViewport(v, this.alignment, size) : linkedViewport(v, frameOf(this.image), frameOf(this.main.image), size);
  }

  private size(fallback: Viewport): { width: number; height: number } {
    return { width: Math.max(1, this.host.clientWidth || fallback.width), height: Math.max(1, this.host.clientHeight || fallback.height) };
  }
}
