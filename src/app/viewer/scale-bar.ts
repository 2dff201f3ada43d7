import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { chooseScaleBar, niceLengthAtMost } from '../../../shared/viewer/scale-bar';
import type { Viewport } from '../../../shared/viewer/viewport';

/**
 * The live scale bar, lower right: a 1-2-5 length near a fifth of the view's width, in µm/nm/mm
 * when the image is calibrated, in image pixels (and saying so) when it is not. A dark bar with a
 * light rim and a plate behind the label, so it reads on bright and on dark micrographs alike.
 */
@Component({
  selector: 'ef-scale-bar',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    @if (bar(); as b) {
      <div class="bar-frame" role="img" [attr.aria-label]="'Scale bar: ' + b.label">
        <span class="label">{{ b.label }}</span>
        <span class="bar" [style.width.px]="b.lengthPx"></span>
      </div>
    }
  `,
  styles: `
    :host {
      display: block;
      pointer-events: none;
    }
    .bar-frame {
      display: flex;
      flex-direction: column;
      align-items: center;
      gap: 4px;
      padding: 6px 8px 8px;
      border-radius: 6px;
      background: rgb(245 247 250 / 0.78);
    }
    .label {
      font: 600 13px/1 'IBM Plex Sans', system-ui, sans-serif;
      color: #101418;
      white-space: nowrap;
    }
    .bar {
      display: block;
      height: 6px;
      background: #101418;
      box-shadow: 0 0 0 1.5px #f5f7fa;
    }
  `,
})
export class ScaleBar {
  readonly viewport = input.required<Viewport>();
  /** µm per image pixel; null when the image is uncalibrated. */
  readonly umPerPx = input.required<number | null>();

  protected readonly bar = computed(() => {
    const v = this.viewport();
    const um = this.umPerPx();
    if (!(v.width > 0) || !(v.scale > 0)) return null;
    if (um) return chooseScaleBar(v.width, um / v.scale);
    const px = niceLengthAtMost((v.width / v.scale) * 0.2);
    return { lengthPx: px * v.scale, label: `${px} px` };
  });
}
