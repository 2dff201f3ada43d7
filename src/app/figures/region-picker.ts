import { ChangeDetectionStrategy, Component, computed, ElementRef, input, output, signal, viewChild } from '@angular/core';
import { imageToPreview, previewToImage, regionBetween, type Point, type Region } from './figure-geometry';

/**
 * The image's preview with the panel's region drawn on it; dragging a new rectangle chooses a new
 * region (converted to full-resolution image px). Number fields beside it serve the keyboard.
 */
@Component({
  selector: 'ef-region-picker',
  host: { '(window:resize)': 'measure()' },
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <div
      #surface
      class="surface"
      [class.dragging]="dragStart() !== null"
      (pointerdown)="startDrag($event)"
      (pointermove)="continueDrag($event)"
      (pointerup)="finishDrag($event)"
      (pointercancel)="cancelDrag()"
    >
      <img [src]="previewUrl()" [alt]="label() + ': preview of ' + imageName()" draggable="false" (load)="measure()" />
      @if (frame(); as f) {
        <div class="veil" aria-hidden="true"
          [style.left.px]="f.x" [style.top.px]="f.y" [style.width.px]="f.width" [style.height.px]="f.height"></div>
      }
    </div>
  `,
  styles: `
    :host {
      display: block;
    }
    .surface {
      position: relative;
      cursor: crosshair;
      touch-action: none;
      user-select: none;
      line-height: 0;
      background: var(--mat-sys-surface-container-highest);
    }
    img {
      width: 100%;
      height: auto;
      display: block;
    }
    .veil {
      position: absolute;
      box-sizing: border-box;
      border: 2px solid #ffd23f;
      outline: 1px solid #1b1b1b;
      box-shadow: 0 0 0 9999px rgb(10 12 16 / 45%);
      pointer-events: none;
    }
    .surface {
      overflow: hidden;
    }
  `,
})
export class RegionPicker {
  readonly previewUrl = input.required<string>();
  readonly imageName = input.required<string>();
  readonly label = input.required<string>();
  readonly imageWidth = input.required<number>();
  readonly imageHeight = input.required<number>();
  readonly region = input.required<Region>();
  readonly regionChange = output<Region>();
  private readonly surface = viewChild.required<ElementRef<HTMLElement>>('surface');

  /** Shown size of the preview in CSS px, measured once the picture has loaded. */
  private readonly shown = signal<{ width: number; height: number } | null>(null);
  protected readonly dragStart = signal<Point | null>(null);
  private readonly dragRegion = signal<Region | null>(null);

  protected readonly frame = computed(() => {
    const size = this.shown();
    if (!size) return null;
    return imageToPreview(this.dragRegion() ?? this.region(), size.width, size.height, this.imageWidth(), this.imageHeight());
  });

  protected measure(): void {
    const box = this.surface().nativeElement.getBoundingClientRect();
    if (box.width > 0) this.shown.set({ width: box.width, height: box.height });
  }

  protected startDrag(event: PointerEvent): void {
    if (event.button !== 0) return;
    this.measure();
    const point = this.imagePoint(event);
    if (!point) return;
    (event.currentTarget as HTMLElement).setPointerCapture(event.pointerId);
    this.dragStart.set(point);
    this.dragRegion.set(regionBetween(point, point, this.imageWidth(), this.imageHeight()));
  }

  protected continueDrag(event: PointerEvent): void {
    const start = this.dragStart();
    const point = this.imagePoint(event);
    if (start && point) this.dragRegion.set(regionBetween(start, point, this.imageWidth(), this.imageHeight()));
  }

  protected finishDrag(event: PointerEvent): void {
    const start = this.dragStart();
    const point = this.imagePoint(event);
    this.dragStart.set(null);
    this.dragRegion.set(null);
    if (start && point) this.regionChange.emit(regionBetween(start, point, this.imageWidth(), this.imageHeight()));
  }

  protected cancelDrag(): void {
    this.dragStart.set(null);
    this.dragRegion.set(null);
  }

  private imagePoint(event: PointerEvent): Point | null {
    const box = this.surface().nativeElement.getBoundingClientRect();
    if (box.width <= 0 || box.height <= 0) return null;
    return previewToImage({ x: event.clientX - box.left, y: event.clientY - box.top }, box.width, box.height, this.imageWidth(), this.imageHeight());
  }
}
