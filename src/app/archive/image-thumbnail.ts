import { ChangeDetectionStrategy, Component, computed, inject, input, output } from '@angular/core';
import { MatButton } from '@angular/material/button';
import { MatIcon } from '@angular/material/icon';
import { MatProgressBar } from '@angular/material/progress-bar';
import { RouterLink } from '@angular/router';
import type { ImageSummary } from '../../../shared/images';
import { ImageApi } from './image-api';
import { formatMagnification, formatPixelSize, processingText } from './image-display';

/** One micrograph as a card: its thumbnail once ready, else where processing stands (with retry when it failed). */
@Component({
  selector: 'ef-image-thumbnail',
  imports: [MatButton, MatIcon, MatProgressBar, RouterLink],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <a class="picture" [routerLink]="link()" [attr.aria-label]="'Open ' + image().originalName">
      @switch (image().processing.state) {
        @case ('ready') {
          <img [src]="thumbnailUrl()" [alt]="image().originalName" loading="lazy" />
        }
        @case ('failed') {
          <span class="state failed"><mat-icon aria-hidden="true">broken_image</mat-icon>failed</span>
        }
        @case ('processing') {
          <span class="state"><mat-icon aria-hidden="true">hourglass_top</mat-icon>{{ stateText() }}</span>
        }
        @default {
          <span class="state"><mat-icon aria-hidden="true">schedule</mat-icon>queued</span>
        }
      }
    </a>
    @if (image().processing.state === 'processing') {
      <mat-progress-bar mode="determinate" [value]="image().processing.progress" [attr.aria-label]="'Processing ' + image().originalName" />
    }
    <div class="caption">
      <a class="name" [routerLink]="link()">{{ image().originalName }}</a>
      <span class="facts ef-number">{{ facts() }}</span>
      @if (image().processing.state === 'ready') {
        <a class="viewer-link" [routerLink]="viewerLink()" [attr.aria-label]="'Open ' + image().originalName + ' in viewer'">Open in viewer</a>
      }
      @if (image().processing.state === 'failed') {
        <span class="reason" role="alert">{{ stateText() }}</span>
        @if (canRetry()) {
          <button mat-stroked-button type="button" [attr.aria-label]="'Retry ' + image().originalName" (click)="retry.emit(image().id)">
            <mat-icon>refresh</mat-icon>
            Retry
          </button>
        }
      }
    </div>
  `,
  styles: `
    :host {
      display: flex;
      flex-direction: column;
      border-radius: var(--mat-sys-corner-small);
      background: var(--mat-sys-surface-container);
      overflow: hidden;
    }
    .picture {
      display: grid;
      place-items: center;
      aspect-ratio: 4 / 3;
      background: var(--mat-sys-surface-container-highest);
      color: var(--mat-sys-on-surface-variant);
      text-decoration: none;
    }
    img {
      width: 100%;
      height: 100%;
      object-fit: cover;
    }
    .state {
      display: flex;
      flex-direction: column;
      align-items: center;
      gap: 4px;
      font: var(--mat-sys-label-medium);
    }
    .state.failed {
      color: var(--mat-sys-error);
    }
    .caption {
      display: flex;
      flex-direction: column;
      align-items: flex-start;
      gap: 2px;
      padding: 6px 8px 8px;
      min-width: 0;
    }
    .name {
      max-width: 100%;
      overflow: hidden;
      text-overflow: ellipsis;
      white-space: nowrap;
      color: var(--mat-sys-on-surface);
      font: var(--mat-sys-label-large);
      text-decoration: none;
    }
    .name:hover,
    .name:focus-visible {
      text-decoration: underline;
    }
    .viewer-link {
      color: var(--mat-sys-primary);
      font: var(--mat-sys-label-medium);
    }
    .facts,
    .reason {
      font: var(--mat-sys-body-small);
      color: var(--mat-sys-on-surface-variant);
    }
    .reason {
      color: var(--mat-sys-error);
    }
  `,
})
export class ImageThumbnail {
  private readonly api = inject(ImageApi);

  readonly image = input.required<ImageSummary>();
  readonly canRetry = input(false);
  readonly retry = output<string>();

  protected readonly link = computed(() => ['/projects', this.image().projectId, 'images', this.image().id]);
  protected readonly viewerLink = computed(() => [...this.link(), 'view']);
  protected readonly thumbnailUrl = computed(() => this.api.thumbnailUrl(this.image().projectId, this.image().id));
  protected readonly stateText = computed(() => processingText(this.image().processing));
  protected readonly facts = computed(() => {
    const i = this.image();
    return [formatMagnification(i.magnification), formatPixelSize(i.pixelSize.xUm), i.element ?? ''].filter(Boolean).join(' · ');
  });
}
