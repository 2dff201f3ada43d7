import type Konva from 'konva';
import type { Viewport } from '../../../shared/viewer/viewport';
import { linkedViewport, type LinkedImage } from './linked-view';
import type { MicrographStage } from './micrograph-stage';
import type { ViewerInteraction } from './viewer-interaction';

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

/**
 * A second image of the same location beside the main one: its own tile stage, showing what the
 * main view shows (linked-view.ts). Dragging or zooming in it moves the main view, which moves
 * both. Tiles only: its annotations stay on its own page. No Angular here.
 */
export class ComparePane {
  private readonly stage: MicrographStage;
  private readonly interaction: ViewerInteraction;
  private readonly observer: ResizeObserver;
  private view: Viewport;

  constructor(
    m: StageModules,
    private readonly host: HTMLDivElement,
    stageHost: HTMLDivElement,
    readonly image: ComparedImage,
    private readonly main: { image: ComparedImage; view: () => Viewport | null; setView: (v: Viewport) => void; viewChanged: (v: Viewport) => void },
    urls: { tile: (level: number, col: number, row: number) => string; preview: string },
  ) {
    const mainView = main.view()!;
    this.view = linkedViewport(mainView, frameOf(main.image), frameOf(image), this.size(mainView));
    this.stage = new m.MicrographStage(m.Konva, stageHost, image, this.view, urls);
    this.interaction = new m.ViewerInteraction(stageHost, host, {
      image,
      view: () => this.view,
      setView: (v) => {
        const current = main.view();
        if (current) main.setView(linkedViewport(v, frameOf(image), frameOf(main.image), { width: current.width, height: current.height }));
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
    this.observer = new ResizeObserver(() => {
      const current = main.view();
      if (current) this.follow(current);
    });
    this.observer.observe(host);
    main.viewChanged(this.view);
  }

  /** Shows what main view `v` shows. */
  follow(v: Viewport): void {
    this.view = linkedViewport(v, frameOf(this.main.image), frameOf(this.image), this.size(v));
    this.stage.setViewport(this.view);
    this.main.viewChanged(this.view);
  }

  /** The same display-only tone filter as the main pane. */
  setFilter(filter: string): void {
    this.stage.tileCanvas.style.filter = filter;
  }

  destroy(): void {
    this.observer.disconnect();
    this.interaction.destroy();
    this.stage.destroy();
  }

  private size(fallback: Viewport): { width: number; height: number } {
    return { width: Math.max(1, this.host.clientWidth || fallback.width), height: Math.max(1, this.host.clientHeight || fallback.height) };
  }
}
