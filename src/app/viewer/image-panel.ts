import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { MatProgressBar } from '@angular/material/progress-bar';
import { MODALITY_LABELS, type ImageRecord } from '../../../shared/images';
import { PIXEL_SIZE_SOURCE_LABELS, type PixelSizeSource } from '../../../shared/pixel-size';
import { remote } from '../core/remote';
import { formatPixelSize } from './calibration-input';
import { ViewerApi } from './viewer-api';

/** What the image is and how its scale is known: pixel size with its source and note, and every change of it. */
@Component({
  selector: 'ef-image-panel',
  imports: [DatePipe, MatProgressBar],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <dl class="facts">
      <dt>File</dt>
      <dd>{{ image().originalName }}</dd>
      <dt>Size</dt>
      <dd class="num">{{ image().width }} × {{ image().height }} px</dd>
      <dt>Made by</dt>
      <dd>{{ modality() }}</dd>
      @if (image().magnification) {
        <dt>Magnification</dt>
        <dd class="num">{{ image().magnification }}×</dd>
      }
      <dt>Specimen</dt>
      <dd>{{ image().specimenCode }}@if (image().locationName) {, {{ image().locationName }}}</dd>
    </dl>

    <section aria-labelledby="pixel-size-heading">
      <h3 id="pixel-size-heading">Pixel size</h3>
      @if (pixelSize(); as ps) {
        <p class="value num">{{ ps }}</p>
      } @else {
        <p class="uncalibrated">Uncalibrated: lengths and areas are shown in pixels.</p>
      }
      <p class="source">Source: {{ sourceLabel() }}@if (!image().pixelSize.confirmed && image().pixelSize.xUm) { (not yet confirmed by a person)}</p>
      @if (image().pixelSize.note) {
        <p class="note">{{ image().pixelSize.note }}</p>
      }
    </section>

    <section aria-labelledby="history-heading">
      <h3 id="history-heading">Calibration history</h3>
      @if (history.loading()) {
        <mat-progress-bar mode="indeterminate" aria-label="Loading the calibration history" />
      } @else if (history.error()) {
        <p class="error" role="alert">{{ history.error() }}</p>
      } @else if (history.value()?.length === 0) {
        <p class="empty">No change of the pixel size has been recorded.</p>
      } @else {
        <ol class="history">
          @for (c of history.value(); track c.id) {
            <li>
              <span class="when">{{ c.at | date: 'yyyy-MM-dd HH:mm' }} · {{ c.byName }}</span>
              <span class="num">{{ size(c.oldUmPerPx) }} → {{ size(c.newUmPerPx) }}</span>
              <span class="note">{{ c.note }}</span>
            </li>
          }
        </ol>
      }
    </section>
  `,
  styles: `
    :host {
      display: flex;
      flex-direction: column;
      gap: 16px;
      padding: 12px 16px;
      font: var(--mat-sys-body-small);
    }
    .facts {
      display: grid;
      grid-template-columns: max-content 1fr;
      gap: 4px 12px;
      margin: 0;
    }
    dt {
      color: var(--mat-sys-on-surface-variant);
    }
    dd {
      margin: 0;
      overflow-wrap: anywhere;
    }
    h3 {
      margin: 0 0 4px;
      font: var(--mat-sys-title-small);
    }
    p {
      margin: 0 0 4px;
    }
    .num {
      font-family: var(--ef-mono);
    }
    .value {
      font-size: 15px;
    }
    .uncalibrated {
      padding: 6px 8px;
      border-radius: var(--mat-sys-corner-small);
      background: var(--mat-sys-tertiary-container);
      color: var(--mat-sys-on-tertiary-container);
    }
    .source,
    .note,
    .empty,
    .when {
      color: var(--mat-sys-on-surface-variant);
    }
    .error {
      color: var(--mat-sys-error);
    }
    .history {
      display: flex;
      flex-direction: column;
      gap: 8px;
      margin: 0;
      padding: 0;
      list-style: none;
    }
    .history li {
      display: flex;
      flex-direction: column;
      gap: 2px;
      padding-left: 8px;
      border-left: 2px solid var(--mat-sys-outline-variant);
    }
  `,
})
export class ImagePanel {
  private readonly api = inject(ViewerApi);

  readonly projectId = input.required<string>();
  readonly image = input.required<ImageRecord>();

  /** Reloads whenever the record changes (a new calibration bumps updatedAt). */
  protected readonly history = remote(
    () => ({ projectId: this.projectId(), imageId: this.image().id, at: this.image().updatedAt }),
    (p) => this.api.calibrationHistory(p.projectId, p.imageId),
  );
  protected readonly modality = computed(() => MODALITY_LABELS[this.image().modality] ?? this.image().modality);
  protected readonly pixelSize = computed(() => {
    const { xUm, yUm } = this.image().pixelSize;
    if (!xUm) return null;
    return yUm && Math.abs(yUm - xUm) > 1e-12 ? `x ${formatPixelSize(xUm)}, y ${formatPixelSize(yUm)}` : formatPixelSize(xUm);
  });
  protected readonly sourceLabel = computed(() => {
    const source = this.image().pixelSize.source;
    return PIXEL_SIZE_SOURCE_LABELS[source as PixelSizeSource] ?? source;
  });

  protected size(um: number | null): string {
    return um ? formatPixelSize(um) : 'none';
  }
}
