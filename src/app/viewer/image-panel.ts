import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, input, output } from '@angular/core';
import { MatButton } from '@angular/material/button';
import { MatProgressBar } from '@angular/material/progress-bar';
import { of } from 'rxjs';
import type { ImageRecord, ImageSummary } from '../../../shared/images';
import { MODALITY_LABELS } from '../../../shared/modalities';
import { PIXEL_SIZE_SOURCE_LABELS, type PixelSizeSource } from '../../../shared/pixel-size';
import { remote } from '../core/remote';
import { formatPixelSize } from './calibration-input';
import { ViewerApi } from './viewer-api';

/** What the image is and how its scale is known: pixel size with its source and note, and every change of it. */
@Component({
  selector: 'ef-image-panel',
  imports: [DatePipe, MatButton, MatProgressBar],
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

    <section aria-labelledby="colocated-heading">
      <h3 id="colocated-heading">Same location</h3>
      @if (!image().locationId) {
        <p class="empty">This image is not filed at a location, so there is nothing to compare it with.</p>
      } @else if (colocated.loading()) {
        <mat-progress-bar mode="indeterminate" aria-label="Loading images of the same location" />
      } @else if (colocated.error()) {
        <p class="error" role="alert">{{ colocated.error() }}</p>
      } @else if (others().length === 0) {
        <p class="empty">No other image of {{ image().locationName }} is ready to view.</p>
      } @else {
        <ul class="others">
          @for (o of others(); track o.id) {
            <li>
              <span class="other-name">{{ o.originalName }}<span class="when"> · {{ modalityOf(o) }}</span></span>
              <button mat-stroked-button type="button" [attr.aria-label]="'Compare side by side with ' + o.originalName" [disabled]="o.id === comparedId()" (click)="compare.emit(o)">
                {{ o.id === comparedId() ? 'Shown' : 'Compare' }}
              </button>
            </li>
          }
        </ul>
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
.others {
      display: flex;
      flex-direction: column;
      gap: 6px;
      margin: 0;
      padding: 0;
      list-style: none;
    }
    .others li {
      display: flex;
      align-items: center;
      justify-content: space-between;
      gap: 8px;
    }
    .other-name {
      min-width: 0;
      overflow-wrap: anywhere;
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
  /** The image shown beside this one, if any. */
  readonly comparedId = input<string | null>(null);
  readonly compare = output<ImageSummary>();

  /** Reloads whenever the record changes (a new calibration bumps updatedAt). */
  protected readonly history = remote(
    () => ({ projectId: this.projectId(), imageId: this.image().id, at: this.image().updatedAt }),
    (p) => this.api.calibrationHistory(p.projectId, p.imageId),
  );
  protected readonly colocated = remote(
    () => ({ projectId: this.projectId(), locationId: this.image().locationId }),
    (p) => (p.locationId ? this.api.imagesAtLocation(p.projectId, p.locationId) : of({ items: [], total: 0, page: 1, pageSize: 0 })),
  );
  protected readonly others = computed(() => (this.colocated.value()?.items ?? []).filter((o) => o.id !== this.image().id && o.processing.state === 'ready'));
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

  protected modalityOf(o: ImageSummary): string {
    return MODALITY_LABELS[o.modality] ?? o.modality;
  }

  protected size(um: number | null): string {
    return um ? formatPixelSize(um) : 'none';
  }
}
