import { ChangeDetectionStrategy, Component, computed, effect, inject, input, output, signal } from '@angular/core';
import { MatButton } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIcon } from '@angular/material/icon';
import { MatProgressBar } from '@angular/material/progress-bar';
import { RouterLink } from '@angular/router';
import { MODALITIES, MODALITY_LABELS } from '../../../shared/images';
import type { Specimen } from '../../../shared/archive/specimens';
import { apiErrorMessage } from '../core/api-error-message';
import { remote } from '../core/remote';
import { ImageApi } from './image-api';
import { anyInProgress } from './image-display';
import { groupImages } from './image-groups';
import { ImageThumbnail } from './image-thumbnail';
import type { UploadDialogData } from './upload-dialog';

/** Looks again this often while images are queued or processing. */
const POLL_MS = 2500;
/** The specimen page shows this many; the search page has the rest. */
const SHOWN = 100;

/** A specimen's micrographs as thumbnails, grouped by location and modality, with processing state and retry. */
@Component({
  selector: 'ef-specimen-images',
  imports: [ImageThumbnail, MatButton, MatIcon, MatProgressBar, RouterLink],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './specimen-images.html',
  styleUrl: './specimen-images.scss',
})
export class SpecimenImages {
  private readonly api = inject(ImageApi);
  private readonly dialog = inject(MatDialog);

  readonly projectId = input.required<string>();
  readonly specimen = input.required<Specimen>();
  readonly canUpload = input(false);
  /** Image counts per location change on the page too: it reloads the specimen after an upload. */
  readonly uploaded = output<void>();

  private readonly query = computed(() => ({ projectId: this.projectId(), specimenId: this.specimen().id }));
  protected readonly images = remote(this.query, ({ projectId, specimenId }) =>
    this.api.search(projectId, { specimenId, page: 0, pageSize: SHOWN, sort: 'uploadedAt', dir: 'desc' }),
  );
  protected readonly total = computed(() => this.images.value()?.total ?? 0);
  protected readonly more = computed(() => Math.max(0, this.total() - SHOWN));
  protected readonly groups = computed(() =>
    groupImages(this.images.value()?.items ?? [], this.specimen().locations, MODALITIES).map((g) => ({
      ...g,
      modalities: g.modalities.map((m) => ({ ...m, label: MODALITY_LABELS[m.modality] })),
    })),
  );
  protected readonly retryError = signal('');
  private readonly inProgress = computed(() => anyInProgress(this.images.value()?.items ?? []));

  /** While anything is on its way, look again shortly; stops by itself once all are ready or failed. */
  private readonly polling = effect((onCleanup) => {
    if (!this.inProgress()) return;
    const timer = setTimeout(() => this.images.reload(), POLL_MS);
    onCleanup(() => clearTimeout(timer));
  });

  protected async openUpload(locationId?: string): Promise<void> {
    const { UploadDialog } = await import('./upload-dialog');
    const data: UploadDialogData = { projectId: this.projectId(), specimenId: this.specimen().id, locationId };
    this.dialog
      .open<InstanceType<typeof UploadDialog>, UploadDialogData, number>(UploadDialog, { data, width: '760px', maxHeight: '92vh', disableClose: true })
      .afterClosed()
      .subscribe((stored) => {
        this.images.reload();
        if (stored) this.uploaded.emit();
      });
  }

  protected retry(imageId: string): void {
    this.retryError.set('');
    this.api.retry(this.projectId(), imageId).subscribe({
      next: () => this.images.reload(),
      error: (error) => this.retryError.set(apiErrorMessage(error).message),
    });
  }
}
