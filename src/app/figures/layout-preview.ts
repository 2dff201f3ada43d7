import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { layoutPanels, scaleLabel, type FigureSpec } from '../../../shared/figures';
import type { ImageSummary } from '../../../shared/images';
import { ANNOTATION_COLOURS, type AnnotationClass } from '../../../shared/annotations/annotations';
import { ImageApi } from '../archive/image-api';
import { legendCorner } from './figure-geometry';

interface PreviewBox {
  key: number;
  n: number;
  letter: string;
  box: { left: number; top: number; width: number; height: number };
  picture: { url: string; left: number; top: number; width: number; height: number } | null;
  bar: { width: number; label: string; position: string; colour: string } | null;
  legend: { corner: string; entries: { id: string; name: string; colour: string }[] } | null;
}

/**
 * The figure as laid out by the shared `layoutPanels()`, drawn as scaled boxes holding the
 * previews cropped to their regions, with letters and bars. The server renders the real file
 * (annotations and legends included) from the originals.
 */
@Component({
  selector: 'ef-layout-preview',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    @if (layout(); as l) {
      <div class="sheet" role="img" [attr.aria-label]="description()" [style.aspect-ratio]="l.width + ' / ' + l.height" [style.width]="sheetWidth()">
        @for (p of boxes(); track p.key) {
          <div class="box" [style.left.%]="p.box.left" [style.top.%]="p.box.top" [style.width.%]="p.box.width" [style.height.%]="p.box.height">
            @if (p.picture; as pic) {
              <img [src]="pic.url" alt="" [style.left.%]="pic.left" [style.top.%]="pic.top" [style.width.%]="pic.width" [style.height.%]="pic.height" />
            } @else {
              <span class="no-image">Panel {{ p.n }}: no image yet</span>
            }
            @if (p.letter) {
              <span class="letter">{{ p.letter }}</span>
            }
            @if (p.legend; as legend) {
              <span class="legend {{ legend.corner }}">
                @for (e of legend.entries; track e.id) {
                  <span class="entry"><span class="swatch" [style.background]="e.colour"></span>{{ e.name }}</span>
                }
              </span>
            }
            @if (p.bar; as bar) {
              <span class="bar {{ bar.position }}" [class.dark]="bar.colour === 'black'" [style.width.%]="bar.width">
                <span class="bar-label">{{ bar.label }}</span>
              </span>
            }
          </div>
        }
      </div>
    } @else {
      <p class="empty">Add a panel to see the layout.</p>
    }
  `,
  styles: `
    :host {
      display: block;
    }
    .sheet {
      position: relative;
      margin: 0 auto;
      background: #fff;
      outline: 1px solid var(--mat-sys-outline-variant);
      box-shadow: 0 2px 10px rgb(0 0 0 / 12%);
      container-type: inline-size;
    }
    .box {
      position: absolute;
      overflow: hidden;
      background: #d9dde3;
    }
    img {
      position: absolute;
      max-width: none;
    }
    .no-image {
      position: absolute;
      inset: 0;
      display: grid;
      place-items: center;
      padding: 4px;
      text-align: center;
      font-size: 11px;
      color: #3d4450;
    }
    .letter {
      position: absolute;
      left: 0;
      top: 0;
      padding: 0.1em 0.35em;
      background: #fff;
      color: #000;
      font-weight: 700;
      font-size: clamp(8px, 2.4cqi, 18px);
      line-height: 1.2;
    }
    .bar {
      position: absolute;
      height: 3px;
      background: #fff;
      box-shadow: 0 0 0 1px rgb(0 0 0 / 45%);
    }
    .bar.dark {
      background: #000;
      box-shadow: 0 0 0 1px rgb(255 255 255 / 45%);
    }
    .bar-label {
      position: absolute;
      bottom: 5px;
      left: 50%;
      transform: translateX(-50%);
      white-space: nowrap;
      font-size: clamp(7px, 1.6cqi, 13px);
      color: #fff;
      text-shadow: 0 0 2px #000;
    }
    .bar.dark .bar-label {
      color: #000;
      text-shadow: 0 0 2px #fff;
    }
    .bottom-right {
      right: 5%;
      bottom: 7%;
    }
    .bottom-left {
      left: 5%;
      bottom: 7%;
    }
    .top-right {
      right: 5%;
      top: 14%;
    }
    .top-left {
      left: 5%;
      top: 14%;
    }
    .legend {
      position: absolute;
      display: flex;
      flex-direction: column;
      gap: 1px;
      padding: 2px 4px;
      background: rgb(255 255 255 / 80%);
      color: #000;
      font-size: clamp(6px, 1.3cqi, 11px);
      line-height: 1.2;
    }
    .legend.top-right {
      right: 3%;
      top: 3%;
    }
    .legend.bottom-left {
      left: 3%;
      bottom: 3%;
    }
    .legend.bottom-right {
      right: 3%;
      bottom: 3%;
    }
    .entry {
      display: flex;
      align-items: center;
      gap: 3px;
      white-space: nowrap;
    }
    .swatch {
      width: 0.9em;
      height: 0.7em;
    }
    .empty {
      margin: 0;
      padding: 24px;
      border: 1px dashed var(--mat-sys-outline-variant);
      color: var(--mat-sys-on-surface-variant);
    }
  `,
})
export class LayoutPreview {
  private readonly images = inject(ImageApi);

  readonly projectId = input.required<string>();
  readonly spec = input.required<Pick<FigureSpec, 'columns' | 'gapMm' | 'panels'>>();
  /** Stable keys per panel, in panel order (for tracking). */
  readonly keys = input.required<readonly number[]>();
  readonly imagesById = input.required<Readonly<Record<string, ImageSummary>>>();
  readonly classes = input<readonly AnnotationClass[]>([]);
  readonly barLengthsUm = input.required<readonly (number | null)[]>();
  readonly widthMm = input.required<number>();
  readonly dpi = input.required<number>();

  protected readonly layout = computed(() => {
    const spec = this.spec();
    if (spec.panels.length === 0) return null;
    return layoutPanels(spec, this.widthMm(), this.dpi());
  });

  /** Full width, but never taller than about half the window: tall one-column figures shrink. */
  protected readonly sheetWidth = computed(() => {
    const l = this.layout();
    return l ? `min(100%, calc(55vh * ${(l.width / l.height).toFixed(4)}))` : '100%';
  });

  protected readonly boxes = computed<PreviewBox[]>(() => {
    const l = this.layout();
    if (!l) return [];
    const panels = this.spec().panels;
    const classes = new Map(this.classes().map((c) => [c.id, c]));
    return l.boxes.map((b, i) => {
      const panel = panels[i]!;
      const image = this.imagesById()[panel.imageId];
      const r = panel.region;
      const length = this.barLengthsUm()[i] ?? null;
      const xUm = image?.pixelSize.xUm ?? null;
      return {
        key: this.keys()[i] ?? i,
        n: i + 1,
        letter: panel.letter,
        box: { left: (b.left / l.width) * 100, top: (b.top / l.height) * 100, width: (b.width / l.width) * 100, height: (b.height / l.height) * 100 },
        picture: image
          ? {
              url: this.images.previewUrl(this.projectId(), image.id),
              left: (-r.x / r.width) * 100,
              top: (-r.y / r.height) * 100,
              width: (image.width / r.width) * 100,
              height: (image.height / r.height) * 100,
            }
          : null,
        bar:
          length !== null && xUm
            ? { width: (length / (r.width * xUm)) * 100, label: scaleLabel(length), position: panel.scaleBar.position, colour: panel.scaleBar.colour }
            : null,
        legend: panel.legend && panel.classIds.some((id) => classes.has(id))
          ? {
              corner: legendCorner(panel.scaleBar.position),
              entries: panel.classIds.flatMap((id) => {
                const c = classes.get(id);
                return c ? [{ id, name: c.name, colour: ANNOTATION_COLOURS[c.colour] }] : [];
              }),
            }
          : null,
      };
    });
  });

  protected readonly description = computed(() => {
    const l = this.layout();
    const n = this.spec().panels.length;
    return l ? `Layout preview: ${n} panel${n === 1 ? '' : 's'}, up to ${Math.min(this.spec().columns, n)} per row, ${l.width} × ${l.height} px` : 'Layout preview';
  });
}
