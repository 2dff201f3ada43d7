import { ChangeDetectionStrategy, Component, computed, input, output } from '@angular/core';
import type { ImageSize, Viewport } from '../../../shared/viewer/viewport';
import { overviewRect, overviewToImage } from './view-maths';

/** Edge of the overview box, px. */
const BOX = 180;

/**
 * The whole image small, with the part on screen outlined. A click (or a drag) on it moves the
 * view there.
 */
@Component({
  selector: 'ef-overview-map',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <div
      class="box"
      role="button"
      tabindex="-1"
      aria-label="Overview: click to move the view"
      [style.width.px]="size().width"
      [style.height.px]="size().height"
      (pointerdown)="start($event)"
      (pointermove)="drag($event)"
      (pointerup)="stop($event)"
    >
      <img [src]="src()" alt="" draggable="false" [style.width.px]="size().width" [style.height.px]="size().height" />
      <span class="view" [style.left.px]="rect().x" [style.top.px]="rect().y" [style.width.px]="rect().width" [style.height.px]="rect().height"></span>
    </div>
  `,
  styles: `
    :host {
      display: block;
    }
    .box {
      position: relative;
      overflow: hidden;
      border-radius: 4px;
      background: #1b1f24;
      box-shadow: 0 1px 4px rgb(0 0 0 / 0.45), 0 0 0 1px rgb(255 255 255 / 0.35);
      cursor: crosshair;
      touch-action: none;
    }
    img {
      display: block;
      user-select: none;
    }
    .view {
      position: absolute;
      box-sizing: border-box;
      min-width: 4px;
      min-height: 4px;
      border: 2px solid #ffd23f;
      box-shadow: 0 0 0 1px rgb(0 0 0 / 0.7);
      pointer-events: none;
    }
  `,
})
export class OverviewMap {
  readonly src = input.required<string>();
  readonly image = input.required<ImageSize>();
  readonly viewport = input.required<Viewport>();
  /** The image point to centre the view on. */
  readonly moveTo = output<{ x: number; y: number }>();

  protected readonly size = computed(() => {
    const { width, height } = this.image();
    const k = Math.min(BOX / width, BOX / height);
    return { width: Math.round(width * k), height: Math.round(height * k) };
  });
  protected readonly rect = computed(() => overviewRect(this.viewport(), this.image(), this.size().width, this.size().height));
  private dragging = false;

  protected start(e: PointerEvent): void {
    this.dragging = true;
    (e.currentTarget as HTMLElement).setPointerCapture?.(e.pointerId);
    this.goTo(e);
  }

  protected drag(e: PointerEvent): void {
    if (this.dragging) this.goTo(e);
  }

  protected stop(e: PointerEvent): void {
    this.dragging = false;
    (e.currentTarget as HTMLElement).releasePointerCapture?.(e.pointerId);
  }

  private goTo(e: PointerEvent): void {
    const r = (e.currentTarget as HTMLElement).getBoundingClientRect();
    this.moveTo.emit(overviewToImage(this.image(), this.size().width, this.size().height, e.clientX - r.left, e.clientY - r.top));
  }
}
