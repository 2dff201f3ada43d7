import type { Coordinates } from '../../../shared/annotations/annotations';
import type { Point } from '../../../shared/annotations/geometry';
import { panBy, screenToImage, zoomAround, type ImageSize, type Viewport } from '../../../shared/viewer/viewport';
import { nearestVertex, topmostHit } from './hit-test';
import { CLICK_SLOP_PX, DRAG_TOOLS, ShapeDraft, type DrawTool, type FinishedDraft } from './shape-draft';
import { canReshape, edgeMidpoints, insertVertex, moveVertex, removeVertex, samePoints, translateShape } from './shape-edits';
import type { ViewerTool } from './shortcuts';
import { keepInView, pinch, wheelZoomFactor } from './view-maths';
import type { ViewShape } from './view-shapes';

/** What the pointer handling needs from the page. */
export interface InteractionHost {
  readonly image: ImageSize;
  view(): Viewport;
  setView(v: Viewport): void;
  tool(): ViewerTool;
  /** Whether the person may draw and edit (the select tool only selects otherwise). */
  canEdit(): boolean;
  /** Shapes that can be hit, in drawing order. */
  shapes(): readonly ViewShape[];
  selected(): string | null;
  select(key: string | null): void;
  /** The draft changed (null when none): draw it. */
  draftChanged(draft: ShapeDraft | null): void;
  finished(result: FinishedDraft): void;
  /** A selected shape is being dragged: show these points instead (null when the drag ends). */
  editPreview(key: string, points: Coordinates | null): void;
  commitEdit(key: string, points: Coordinates): void;
  /** The select tool pressed here: true when a comment pin is under it (the page shows its thread). */
  pressPin?(p: Point, unit: number): boolean;
  /** An edit the select tool cannot make (for example removing an outline's third vertex), with the reason. */
  editRefused?(reason: string): void;
  cursorMoved(p: Point | null): void;
}

type Mode =
  | { type: 'idle' }
  | { type: 'pan'; last: { x: number; y: number } }
  /** A press of a click tool, or on empty image with the select tool: a click unless it moves, then a pan. */
  | { type: 'press'; last: { x: number; y: number }; clears: boolean }
  | { type: 'draw' }
  /** Dragging a vertex; `inserted` when it was just pulled out of an edge (a click alone keeps it). */
  | { type: 'vertex'; key: string; index: number; original: Coordinates; start: Coordinates; kind: ViewShape['kind']; points: Coordinates; inserted: boolean }
  | { type: 'move'; key: string; from: Point; original: Coordinates; points: Coordinates }
  | { type: 'pinch'; touches: [{ x: number; y: number }, { x: number; y: number }] };

/**
 * Pointer, wheel and touch handling on the canvas container: pan, zoom, pinch, drawing with the
 * current tool, and selecting, moving and reshaping with the select tool. Plain DOM events; the
 * page supplies state and receives results.
 */
export class ViewerInteraction {
  private draft: ShapeDraft | null = null;
  private mode: Mode = { type: 'idle' };
  private down: { x: number; y: number } | null = null;
  private moved = false;
  private readonly pointers = new Map<number, { x: number; y: number }>();
  private spaceHeld = false;
  private readonly listeners: [string, EventListener, AddEventListenerOptions?][] = [];

  constructor(
    private readonly el: HTMLElement,
    /** Takes the keyboard when the canvas is pressed (the element with the viewer's shortcuts). */
    private readonly focusTarget: HTMLElement,
    private readonly host: InteractionHost,
  ) {
    this.listen('pointerdown', (e) => this.pointerDown(e as PointerEvent));
    this.listen('pointermove', (e) => this.pointerMove(e as PointerEvent));
    this.listen('pointerup', (e) => this.pointerUp(e as PointerEvent));
    this.listen('pointercancel', (e) => this.pointerCancel(e as PointerEvent));
    this.listen('pointerleave', () => this.host.cursorMoved(null));
    this.listen('wheel', (e) => this.wheel(e as WheelEvent), { passive: false });
    this.listen('dblclick', () => this.finishDraft());
    this.listen('contextmenu', (e) => e.preventDefault());
  }

  /** Space held down: any drag pans, whatever the tool. */
  setSpaceHeld(held: boolean): void {
    this.spaceHeld = held;
    this.el.classList.toggle('panning', held);
  }

  /** The tool changed: a half-drawn shape of the old tool is dropped. */
  toolChanged(): void {
    this.cancelDraft();
  }

  cancelDraft(): boolean {
    const had = this.draft !== null && !this.draft.isEmpty;
    this.draft = null;
    this.host.draftChanged(null);
    return had;
  }

  finishDraft(): void {
    const result = this.draft?.finish();
    if (result) this.deliver(result);
  }

  removeLastPoint(): boolean {
    const removed = this.draft?.removeLast() ?? false;
    if (removed) this.host.draftChanged(this.draft);
    return removed;
  }

  destroy(): void {
    for (const [type, fn, opts] of this.listeners) this.el.removeEventListener(type, fn, opts);
  }

  private listen(type: string, fn: EventListener, opts?: AddEventListenerOptions): void {
    this.el.addEventListener(type, fn, opts);
    this.listeners.push([type, fn, opts]);
  }

  private local(e: { clientX: number; clientY: number }): { x: number; y: number } {
    const r = this.el.getBoundingClientRect();
    return { x: e.clientX - r.left, y: e.clientY - r.top };
  }

  private imagePoint(s: { x: number; y: number }): [number, number] {
    const p = screenToImage(this.host.view(), s.x, s.y);
    return [p.x, p.y];
  }

  private get unit(): number {
    return 1 / this.host.view().scale;
  }

  private pointerDown(e: PointerEvent): void {
    const s = this.local(e);
    this.pointers.set(e.pointerId, s);
    this.el.setPointerCapture?.(e.pointerId);
    this.focusTarget.focus({ preventScroll: true });
    if (this.pointers.size === 2) {
      // A second finger: whatever the first started becomes a pinch.
      const [a, b] = [...this.pointers.values()] as [{ x: number; y: number }, { x: number; y: number }];
      this.endEditPreview();
      this.mode = { type: 'pinch', touches: [a, b] };
      return;
    }
    if (this.pointers.size > 2) return;
    this.down = s;
    this.moved = false;
    const p = this.imagePoint(s);
    const tool = this.host.tool();
    if (e.button === 1 || e.button === 2 || this.spaceHeld) {
      this.mode = { type: 'pan', last: s };
      return;
    }
    if (e.button !== 0) return;
    if (tool === 'select') return this.pressSelect(p, s, e.altKey);
    const draft = this.draftFor(tool);
    if (DRAG_TOOLS.has(tool)) {
      draft.press(p);
      this.mode = { type: 'draw' };
      this.host.draftChanged(draft);
    } else {
      this.mode = { type: 'press', last: s, clears: false };
    }
  }

  /**
   * The select tool pressed: on a handle of the selected shape it reshapes (drag a vertex, pull a
   * new one out of an edge's middle, Alt+click a vertex to remove it), on a shape it selects and
   * moves, elsewhere it clears the selection or pans.
   */
  private pressSelect(p: Point, s: { x: number; y: number }, alt: boolean): void {
    const selected = this.host.selected();
    const shapes = this.host.shapes();
    const current = selected && this.host.canEdit() ? shapes.find((x) => x.key === selected) : undefined;
    if (current && current.kind !== 'point' && current.kind !== 'text' && this.pressHandle(current, p, alt)) return;
    if (this.host.pressPin?.(p, this.unit)) {
      this.mode = { type: 'press', last: s, clears: false };
      return;
    }
    const hit = topmostHit(shapes, p, this.unit);
    if (!hit) {
      this.mode = { type: 'press', last: s, clears: true };
      return;
    }
    if (hit !== selected) this.host.select(hit);
    const shape = shapes.find((x) => x.key === hit)!;
    this.mode = this.host.canEdit() ? { type: 'move', key: hit, from: p, original: shape.points, points: shape.points } : { type: 'press', last: s, clears: false };
  }

  /** Whether the press landed on one of the selected shape's handles (and was handled). */
  private pressHandle(shape: ViewShape, p: Point, alt: boolean): boolean {
    const index = nearestVertex(shape.points, p, this.unit);
    if (index >= 0 && alt && canReshape(shape.kind)) {
      const result = removeVertex(shape.kind, shape.points, index);
      if (typeof result === 'string') this.host.editRefused?.(result);
      else this.host.commitEdit(shape.key, result);
      this.mode = { type: 'idle' };
      this.down = null;
      return true;
    }
    if (index >= 0) {
      this.mode = { type: 'vertex', key: shape.key, index, original: shape.points, start: shape.points, kind: shape.kind, points: shape.points, inserted: false };
      return true;
    }
    const edge = nearestVertex(edgeMidpoints(shape.kind, shape.points), p, this.unit);
    if (edge < 0) return false;
    const start = insertVertex(shape.points, edge, p, this.host.image);
    this.mode = { type: 'vertex', key: shape.key, index: edge + 1, original: shape.points, start, kind: shape.kind, points: start, inserted: true };
    this.host.editPreview(shape.key, start);
    return true;
  }

  private pointerMove(e: PointerEvent): void {
    const s = this.local(e);
    const p = this.imagePoint(s);
    this.host.cursorMoved(p);
    if (this.pointers.has(e.pointerId)) this.pointers.set(e.pointerId, s);
    if (this.down && Math.hypot(s.x - this.down.x, s.y - this.down.y) > CLICK_SLOP_PX) this.moved = true;
    const m = this.mode;
    switch (m.type) {
      case 'idle':
        if (this.draft) {
          this.draft.hover(p);
          this.host.draftChanged(this.draft);
        }
        return;
      case 'pinch': {
        const [a, b] = [...this.pointers.values()] as [{ x: number; y: number }, { x: number; y: number }];
        if (!a || !b) return;
        this.setView(pinch(this.host.view(), this.host.image, m.touches, [a, b]));
        m.touches = [a, b];
        return;
      }
      case 'pan':
      case 'press':
        if (m.type === 'press' && !this.moved) {
          if (this.draft) {
            this.draft.hover(p);
            this.host.draftChanged(this.draft);
          }
          return;
        }
        this.setView(panBy(this.host.view(), s.x - m.last.x, s.y - m.last.y));
        this.mode = { type: 'pan', last: s };
        return;
      case 'draw':
        this.draft?.drag(p, this.unit);
        this.host.draftChanged(this.draft);
        return;
      case 'vertex':
        m.points = moveVertex(m.kind, m.start, m.index, p, this.host.image);
        this.host.editPreview(m.key, m.points);
        return;
      case 'move':
        if (!this.moved) return;
        m.points = translateShape(m.original, p[0] - m.from[0], p[1] - m.from[1], this.host.image);
        this.host.editPreview(m.key, m.points);
        return;
    }
  }

  private pointerUp(e: PointerEvent): void {
    this.pointers.delete(e.pointerId);
    const m = this.mode;
    if (m.type === 'pinch') {
      // One finger left: wait for all to lift before anything else starts.
      if (this.pointers.size === 0) this.mode = { type: 'idle' };
      return;
    }
    const s = this.local(e);
    const p = this.imagePoint(s);
    this.mode = { type: 'idle' };
    this.down = null;
    switch (m.type) {
      case 'press': {
        if (this.moved) return;
        if (m.clears) return this.host.select(null);
        const tool = this.host.tool();
        if (tool === 'select') return;
        const result = this.draftFor(tool).click(p, this.unit);
        if (result) this.deliver(result);
        else this.host.draftChanged(this.draft);
        return;
      }
      case 'draw': {
        const result = this.draft?.release(p, this.moved, this.unit);
        if (result) this.deliver(result);
        else this.host.draftChanged(this.draft);
        return;
      }
      case 'vertex':
      case 'move': {
        this.host.editPreview(m.key, null);
        const changed = (this.moved || (m.type === 'vertex' && m.inserted)) && !samePoints(m.points, m.original);
        if (changed) this.host.commitEdit(m.key, m.points);
        return;
      }
    }
  }

  private pointerCancel(e: PointerEvent): void {
    this.pointers.delete(e.pointerId);
    this.endEditPreview();
    this.mode = { type: 'idle' };
    this.down = null;
  }

  private endEditPreview(): void {
    const m = this.mode;
    if (m.type === 'vertex' || m.type === 'move') this.host.editPreview(m.key, null);
  }

  private wheel(e: WheelEvent): void {
    e.preventDefault();
    const s = this.local(e);
    this.setView(zoomAround(this.host.view(), this.host.image, wheelZoomFactor(e.deltaY, e.deltaMode), s.x, s.y));
  }

  private setView(v: Viewport): void {
    this.host.setView(keepInView(v, this.host.image));
  }

  private draftFor(tool: DrawTool): ShapeDraft {
    if (!this.draft || this.draft.tool !== tool) this.draft = new ShapeDraft(tool);
    return this.draft;
  }

  private deliver(result: FinishedDraft): void {
    this.host.draftChanged(null);
    this.host.finished(result);
  }
}
