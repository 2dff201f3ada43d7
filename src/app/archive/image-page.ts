import { ActivityTimeline } from '../activity/activity-timeline';
import { CalibrationPresets } from './calibration-presets';
import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, effect, inject, input, signal, viewChild } from '@angular/core';
import { MatAnchor, MatButton } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIcon } from '@angular/material/icon';
import { MatProgressBar } from '@angular/material/progress-bar';
import { Title } from '@angular/platform-browser';
import { Router, RouterLink } from '@angular/router';
import { MODALITY_LABELS, type ImageRecord } from '../../../shared/images';
import { apiErrorMessage } from '../core/api-error-message';
import { askToConfirm } from '../core/confirm-dialog';
import { remote } from '../core/remote';
import { ProjectApi } from '../projects/project-api';
import type { Mentionable } from '../reviews/comment-box';
import { ReviewPanel } from '../reviews/review-panel';
import { ThreadList } from '../reviews/thread-list';
import { Breadcrumbs, type Crumb } from './breadcrumbs';
import { ImageApi } from './image-api';
import { anyInProgress, formatBytes, formatMagnification, processingText } from './image-display';
import { PixelSizePanel } from './pixel-size-panel';

const POLL_MS = 2500;

/** One micrograph: its preview, where it is filed, how it was made, and its scale. */
@Component({
  selector: 'ef-image-page',
  imports: [CalibrationPresets, ActivityTimeline, Breadcrumbs, DatePipe, MatAnchor, MatButton, MatIcon, MatProgressBar, PixelSizePanel, ReviewPanel, RouterLink, ThreadList],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './image-page.html',
  styleUrl: './image-page.scss',
})
export default class ImagePage {
  private readonly api = inject(ImageApi);
  private readonly projectApi = inject(ProjectApi);
  private readonly dialog = inject(MatDialog);
  private readonly router = inject(Router);
  private readonly title = inject(Title);

  /** Route parameters. */
  readonly projectId = input.required<string>();
  readonly imageId = input.required<string>();
  /** Query parameter: a thread to show (notification links carry it). */
  readonly thread = input<string | undefined>();

  private readonly reviewPanel = viewChild(ReviewPanel);

  private readonly ids = computed(() => ({ projectId: this.projectId(), imageId: this.imageId() }));
  protected readonly project = remote(this.projectId, (id) => this.projectApi.get(id));
  protected readonly image = remote(this.ids, ({ projectId, imageId }) => this.api.get(projectId, imageId));
  protected readonly canEdit = computed(() => this.project.value()?.allowed.includes('editMetadata') ?? false);
  protected readonly canUpload = computed(() => this.project.value()?.allowed.includes('upload') ?? false);
  protected readonly canDelete = computed(() => this.project.value()?.allowed.includes('delete') ?? false);
  protected readonly canComment = computed(() => this.project.value()?.allowed.includes('comment') ?? false);
  protected readonly members = computed<Mentionable[]>(() =>
    (this.project.value()?.members ?? []).map((m) => ({ id: m.userId, name: m.displayName, email: m.email })),
  );
  protected readonly crumbs = computed<Crumb[]>(() => {
    const i = this.image.value();
    const p = this.projectId();
    return [
      { label: 'Projects', link: ['/projects'] },
      { label: this.project.value()?.code ?? 'Project', link: ['/projects', p] },
      ...(i
        ? [
            { label: i.sampleCode, link: ['/projects', p, 'samples', i.sampleId] },
            { label: i.specimenCode, link: ['/projects', p, 'specimens', i.specimenId] },
          ]
        : []),
      { label: i?.originalName ?? 'Image' },
    ];
  });
  protected readonly previewUrl = computed(() => this.api.previewUrl(this.projectId(), this.imageId()));
  protected readonly originalUrl = computed(() => this.api.originalUrl(this.projectId(), this.imageId()));
  protected readonly facts = computed(() => {
    const i = this.image.value();
    return i ? imageFacts(i) : [];
  });
  protected readonly stateText = computed(() => {
    const i = this.image.value();
    return i ? processingText(i.processing) : '';
  });
  protected readonly busy = signal(false);
  protected readonly actionError = signal('');

  private readonly pageTitle = effect(() => {
    const i = this.image.value();
    if (i) this.title.setTitle(`${i.originalName} · ${i.specimenCode} · Etchfile`);
  });
  private readonly polling = effect((onCleanup) => {
    const i = this.image.value();
    if (!i || !anyInProgress([i])) return;
    const timer = setTimeout(() => this.image.reload(), POLL_MS);
    onCleanup(() => clearTimeout(timer));
  });

  protected showSaved(saved: ImageRecord): void {
    this.image.set(saved);
    // A new pixel size returns a cleared image to draft.
    this.reviewPanel()?.refresh();
  }

  protected retry(image: ImageRecord): void {
    this.actionError.set('');
    this.api.retry(image.projectId, image.id).subscribe({
      next: (queued) => this.image.set(queued),
      error: (error) => this.actionError.set(apiErrorMessage(error).message),
    });
  }

  protected deleteImage(image: ImageRecord): void {
    askToConfirm(this.dialog, {
      title: `Delete ${image.originalName}?`,
      message: 'The original file, its views and its record are removed from the archive. This cannot be undone.',
      confirmLabel: 'Delete',
    }).subscribe((confirmed) => {
      if (confirmed) this.sendDeletion(image);
    });
  }

  private sendDeletion(image: ImageRecord): void {
    this.busy.set(true);
    this.actionError.set('');
    this.api.remove(image.projectId, image.id).subscribe({
      next: () => void this.router.navigate(['/projects', image.projectId, 'specimens', image.specimenId]),
      error: (error) => {
        this.actionError.set(apiErrorMessage(error).message);
        this.busy.set(false);
      },
    });
  }
}

/** The record as label/value pairs, with units, leaving out what was not recorded. */
function imageFacts(i: ImageRecord): { label: string; value: string }[] {
  const rows: [string, string][] = [
    ['Modality', MODALITY_LABELS[i.modality] + (i.element ? `, ${i.element}` : '')],
    ['Location', i.locationName ?? 'none given'],
    ['Magnification', formatMagnification(i.magnification)],
    ['Instrument', i.instrument],
    ['Detector', i.detector],
    ['Accelerating voltage', i.acceleratingVoltageKv === null ? '' : `${i.acceleratingVoltageKv} kV`],
    ['Working distance', i.workingDistanceMm === null ? '' : `${i.workingDistanceMm} mm`],
    ['Size', `${i.width} × ${i.height} px, ${i.bitDepth}-bit, ${i.channels} ${i.channels === 1 ? 'channel' : 'channels'}`],
    ['File', `${i.format.toUpperCase()}, ${formatBytes(i.byteSize)}${i.pageCount > 1 ? `, ${i.pageCount} pages (first shown)` : ''}`],
    ['SHA-256', `${i.sha256.slice(0, 16)}…`],
    ['Uploaded by', i.uploaderName],
    ['Tags', i.tags.join(', ')],
  ];
  return rows.filter(([, value]) => value !== '').map(([label, value]) => ({ label, value }));
}
