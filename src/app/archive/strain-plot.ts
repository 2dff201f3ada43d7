import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import type { RouteState } from '../../../shared/archive/process-route';
import { formatStrain } from './quantities';
import { strainPlot, type PlotBox } from './strain-plot-geometry';

const BOX: PlotBox = { width: 360, height: 210, left: 40, right: 40, top: 26, bottom: 34 };

/** Von Mises strain ε and layer count against the step number: two lines, two axes. */
@Component({
  selector: 'ef-strain-plot',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <svg [attr.viewBox]="viewBox" role="img" [attr.aria-label]="description()">
      @for (tick of plot().strainTicks; track tick.label) {
        <line [attr.x1]="box.left" [attr.x2]="plotRight" [attr.y1]="tick.at" [attr.y2]="tick.at" class="grid" />
        <text [attr.x]="leftLabelX" [attr.y]="tick.at" class="tick strain-ink" text-anchor="end">{{ tick.label }}</text>
      }
      @for (tick of plot().layerTicks; track tick.label) {
        <text [attr.x]="rightLabelX" [attr.y]="tick.at" class="tick layers-ink">{{ tick.label }}</text>
      }
      @for (tick of plot().stepTicks; track tick.at) {
        <text [attr.x]="tick.at" [attr.y]="stepLabelY" class="tick" text-anchor="middle">{{ tick.label }}</text>
      }
      <text [attr.x]="midX" [attr.y]="box.height - 2" class="axis-title" text-anchor="middle">step</text>
      <text [attr.x]="leftLabelX" y="12" class="axis-title strain-ink" text-anchor="end">ε</text>
      <text [attr.x]="box.width - 2" y="12" class="axis-title layers-ink" text-anchor="end">layers</text>
      <path [attr.d]="plot().layersPath" class="layers-line" />
      <path [attr.d]="plot().strainPath" class="strain-line" />
      @for (point of plot().points; track point.index) {
        <circle [attr.cx]="point.x" [attr.cy]="point.strainY" r="2.5" class="strain-dot">
          <title>{{ pointTitle(point.index, point.strain, point.layerCount) }}</title>
        </circle>
      }
    </svg>
    <p class="key">
      <span class="key-strain">— von Mises strain ε (left)</span>
      <span class="key-layers">- - layer count (right{{ plot().logLayers ? ', log scale' : '' }})</span>
    </p>
  `,
  styles: `
    :host {
      display: flex;
      flex-direction: column;
      gap: 4px;
    }
    svg {
      width: 100%;
      max-width: 420px;
      height: auto;
    }
    .grid {
      stroke: var(--mat-sys-outline-variant);
      stroke-width: 0.5;
    }
    .tick {
      font: 10px var(--ef-mono);
      fill: var(--mat-sys-on-surface-variant);
      dominant-baseline: central;
    }
    .axis-title {
      font: 11px var(--ef-mono);
      fill: var(--mat-sys-on-surface-variant);
    }
    .strain-ink {
      fill: var(--mat-sys-primary);
    }
    .layers-ink {
      fill: var(--mat-sys-tertiary);
    }
    .strain-line {
      fill: none;
      stroke: var(--mat-sys-primary);
      stroke-width: 2;
    }
    .layers-line {
      fill: none;
      stroke: var(--mat-sys-tertiary);
      stroke-width: 1.5;
      stroke-dasharray: 4 3;
    }
    .strain-dot {
      fill: var(--mat-sys-primary);
    }
    .key {
      display: flex;
      flex-wrap: wrap;
      gap: 4px 16px;
      margin: 0;
      font: var(--mat-sys-body-small);
    }
    .key-strain {
      color: var(--mat-sys-primary);
    }
    .key-layers {
      color: var(--mat-sys-tertiary);
    }
  `,
})
export class StrainPlot {
  /** `routeStates()` output: the initial stack, then one state per step. */
  readonly states = input.required<readonly RouteState[]>();

  protected readonly box = BOX;
  protected readonly plotRight = BOX.width - BOX.right;
  protected readonly leftLabelX = BOX.left - 6;
  protected readonly rightLabelX = BOX.width - BOX.right + 6;
  protected readonly stepLabelY = BOX.height - BOX.bottom + 14;
  protected readonly midX = (BOX.width + BOX.left - BOX.right) / 2;
  protected readonly viewBox = `0 0 ${BOX.width} ${BOX.height}`;
  protected readonly plot = computed(() => strainPlot(this.states(), BOX));
  protected readonly description = computed(() => {
    const last = this.states().at(-1);
    if (!last) return 'Strain and layer count plot, empty';
    return `Plot of von Mises strain and layer count over ${this.states().length - 1} steps; ends at ε ${formatStrain(last.vonMisesStrain)} with ${last.layerCount} layers`;
  });

  protected pointTitle(index: number, strain: number, layers: number): string {
    return `${index === 0 ? 'As stacked' : `After step ${index}`}: ε ${formatStrain(strain)}, ${layers} layers`;
  }
}
