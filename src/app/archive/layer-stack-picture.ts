import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { materialFill } from './material-fills';
import { stackPicture, type PictureLayer } from './stack-geometry';

const HEIGHT = 220;
const BAND_X = 72;
const BAND_W = 200;

/** A laminate drawn to scale: layers bottom to top, each as thick as recorded, coloured per material. */
@Component({
  selector: 'ef-layer-stack-picture',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    @if (picture().tooMany) {
      <p class="too-many">{{ picture().layerCount }} layers are too many to draw one by one; total {{ picture().totalThickness }}.</p>
    } @else {
      <svg [attr.viewBox]="viewBox" role="img" [attr.aria-label]="description()">
        <defs>
          <pattern id="ef-hatch" width="6" height="6" patternUnits="userSpaceOnUse" patternTransform="rotate(45)">
            <rect width="2" height="6" class="hatch-line" />
          </pattern>
        </defs>
        @for (band of bands(); track band.position) {
          <g>
            <title>{{ band.title }}</title>
            <rect [attr.x]="bandX" [attr.y]="band.y" [attr.width]="bandW" [attr.height]="band.height" [style.fill]="band.fill" class="band" />
            @if (band.hatched) {
              <rect [attr.x]="bandX" [attr.y]="band.y" [attr.width]="bandW" [attr.height]="band.height" fill="url(#ef-hatch)" />
            }
            @if (band.label) {
              <text [attr.x]="bandX + bandW / 2" [attr.y]="band.y + band.height / 2" [style.fill]="band.ink" class="label">
                {{ band.label }}
              </text>
            }
          </g>
        }
        <line [attr.x1]="bandX - 16" [attr.x2]="bandX - 16" y1="1" [attr.y2]="height - 1" class="bracket" />
        <line [attr.x1]="bandX - 22" [attr.x2]="bandX - 10" y1="1" y2="1" class="bracket" />
        <line [attr.x1]="bandX - 22" [attr.x2]="bandX - 10" [attr.y1]="height - 1" [attr.y2]="height - 1" class="bracket" />
        <text [attr.x]="bandX - 24" [attr.y]="height / 2" class="total">{{ picture().totalThickness }}</text>
        <text [attr.x]="bandX + bandW + 8" [attr.y]="height - 4" class="edge">bottom</text>
        <text [attr.x]="bandX + bandW + 8" y="12" class="edge">top</text>
      </svg>
    }
    <ul class="legend" aria-label="Materials in the stack">
      @for (entry of legend(); track entry.materialId) {
        <li>
          <span class="swatch" [style.background-color]="entry.fill" [class.hatched]="entry.hatched" aria-hidden="true"></span>
          <span class="designation">{{ entry.designation }}</span>
          <span class="ef-number">{{ entry.layerCount }} {{ entry.layerCount === 1 ? 'layer' : 'layers' }}, {{ entry.totalThickness }}</span>
        </li>
      }
    </ul>
  `,
  styles: `
    :host {
      display: flex;
      flex-direction: column;
      gap: 12px;
    }
    svg {
      width: 100%;
      max-width: 340px;
      height: auto;
    }
    .band {
      stroke: var(--mat-sys-surface);
      stroke-width: 0.5;
    }
    .hatch-line {
      fill: color-mix(in srgb, var(--mat-sys-surface) 45%, transparent);
    }
    .label {
      font: 500 11px var(--ef-mono);
      text-anchor: middle;
      dominant-baseline: central;
    }
    .bracket {
      stroke: var(--mat-sys-outline);
      stroke-width: 1;
    }
    .total {
      font: 11px var(--ef-mono);
      fill: var(--mat-sys-on-surface);
      text-anchor: end;
      dominant-baseline: central;
    }
    .edge {
      font: 10px var(--mat-sys-body-small-font, sans-serif);
      fill: var(--mat-sys-on-surface-variant);
    }
    .too-many {
      margin: 0;
      padding: 24px 16px;
      color: var(--mat-sys-on-surface-variant);
    }
    .legend {
      display: flex;
      flex-direction: column;
      gap: 4px;
      margin: 0;
      padding: 0;
      list-style: none;
      font: var(--mat-sys-body-small);
    }
    .legend li {
      display: flex;
      align-items: center;
      gap: 8px;
    }
    .swatch {
      width: 14px;
      height: 14px;
      border-radius: 3px;
      border: 1px solid var(--mat-sys-outline-variant);
    }
    .swatch.hatched {
      background-image: repeating-linear-gradient(45deg, transparent 0 3px, color-mix(in srgb, var(--mat-sys-surface) 45%, transparent) 3px 5px);
    }
    .designation {
      font-weight: 500;
    }
  `,
})
export class LayerStackPicture {
  /** Bottom to top. */
  readonly layers = input.required<readonly PictureLayer[]>();
  /** What the picture shows, for its accessible name ("as stacked", "after step 5"). */
  readonly caption = input('as stacked');

  protected readonly height = HEIGHT;
  protected readonly bandX = BAND_X;
  protected readonly bandW = BAND_W;
  protected readonly viewBox = `0 0 ${BAND_X + BAND_W + 48} ${HEIGHT}`;
  protected readonly picture = computed(() => stackPicture(this.layers(), HEIGHT));
  protected readonly bands = computed(() => this.picture().bands.map((band) => ({ ...band, ...materialFill(band.colourIndex) })));
  protected readonly legend = computed(() => this.picture().legend.map((entry) => ({ ...entry, ...materialFill(entry.colourIndex) })));
  protected readonly description = computed(() => {
    const p = this.picture();
    const layers = p.bands.length <= 8 ? `: ${p.bands.map((b) => `${b.designation} ${b.thickness}`).join(', ')}` : '';
    return `Layer stack ${this.caption()}, bottom to top, ${p.layerCount} layers, total ${p.totalThickness}${layers}`;
  });
}
