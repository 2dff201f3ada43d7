import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { FormControl, NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButton, MatIconButton } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogActions, MatDialogContent, MatDialogRef, MatDialogTitle } from '@angular/material/dialog';
import { MatError, MatFormField, MatHint, MatLabel, MatSuffix } from '@angular/material/form-field';
import { MatIcon } from '@angular/material/icon';
import { MatInput } from '@angular/material/input';
import { MatProgressBar } from '@angular/material/progress-bar';
import { MatOption, MatSelect } from '@angular/material/select';
import { map } from 'rxjs';
import { MODALITIES, MODALITY_LABELS, type Modality } from '../../../shared/images';
import { remote } from '../core/remote';
import { ValidationMessagePipe } from '../core/validation-message-pipe';
import { ArchiveApi } from './archive-api';
import { numberWithin } from './field-validators';
import { formatBytes } from './image-display';
import { UploadQueue, type UploadItem } from './upload-queue';
import { effectiveModality, NO_LOCATION, uploadStateLabel, type BatchFields } from './upload-plan';

export interface UploadDialogData {
  projectId: string;
  /** Preselected when uploading from a specimen's page. */
  specimenId?: string;
  locationId?: string;
}

const ACCEPT = '.tif,.tiff,.png,.jpg,.jpeg,.webp,image/tiff,image/png,image/jpeg,image/webp';

/** Files micrographs: drop or pick files, give the batch its specimen, location and modality, and send them one by one. */
@Component({
  selector: 'ef-upload-dialog',
  imports: [
    MatButton,
    MatDialogActions,
    MatDialogContent,
    MatDialogTitle,
    MatError,
    MatFormField,
    MatHint,
    MatIcon,
    MatIconButton,
    MatInput,
    MatLabel,
    MatOption,
    MatProgressBar,
    MatSelect,
    MatSuffix,
    ReactiveFormsModule,
    ValidationMessagePipe,
  ],
  providers: [UploadQueue],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './upload-dialog.html',
  styleUrl: './upload-dialog.scss',
})
export class UploadDialog {
  private readonly archiveApi = inject(ArchiveApi);
  private readonly dialogRef = inject<MatDialogRef<UploadDialog, number>>(MatDialogRef);
  private readonly fb = inject(NonNullableFormBuilder);
  protected readonly queue = inject(UploadQueue);

  protected readonly data = inject<UploadDialogData>(MAT_DIALOG_DATA);
  protected readonly accept = ACCEPT;
  protected readonly noLocation = NO_LOCATION;
  protected readonly modalities = MODALITIES.map((value) => ({ value, label: MODALITY_LABELS[value] }));
  protected readonly specimens = remote(
    () => this.data.projectId,
    (id) => this.archiveApi.listSpecimens(id),
  );
  protected readonly form = this.fb.group({
    specimenId: [this.data.specimenId ?? '', Validators.required],
    locationId: [this.data.locationId ?? ''],
    modality: ['' as Modality | ''],
    element: ['', Validators.maxLength(3)],
    magnification: new FormControl<number | null>(null, numberWithin({ above: 0, max: 10_000_000 }, 'A magnification must be above 0.')),
    pixelSizeUm: new FormControl<number | null>(null, numberWithin({ above: 0, max: 1_000_000 }, 'A pixel size must be above 0 µm/px.')),
    instrument: ['', Validators.maxLength(120)],
    acquiredAt: [''],
    tags: ['', Validators.maxLength(1000)],
    notes: ['', Validators.maxLength(4000)],
  });
  private readonly batch = toSignal(this.form.valueChanges.pipe(map(() => this.form.getRawValue() as BatchFields)), {
    initialValue: this.form.getRawValue() as BatchFields,
  });
  protected readonly specimenOptions = computed(() =>
    (this.specimens.value() ?? []).map((s) => ({ id: s.id, label: `${s.sampleCode} › ${s.code}` })),
  );
  protected readonly locations = computed(() => (this.specimens.value() ?? []).find((s) => s.id === this.batch().specimenId)?.locations ?? []);
  protected readonly batchIsEds = computed(() => this.batch().modality === 'eds_element');
  protected readonly rows = computed(() =>
    this.queue.items().map((item) => ({
      item,
      size: formatBytes(item.file.size),
      stateLabel: uploadStateLabel(item.state),
      percent: this.queue.percent(item),
      isEds: effectiveModality(this.batch(), item.overrides) === 'eds_element',
      editable: item.state === 'waiting' || item.state === 'failed' || item.state === 'cancelled',
    })),
  );
  protected readonly dragging = signal(false);
  protected readonly startError = signal('');

  protected pickFiles(input: HTMLInputElement): void {
    if (input.files) this.queue.add(input.files);
    // Let the same file be chosen again after removing it.
    input.value = '';
  }

  protected dragOver(event: DragEvent): void {
    event.preventDefault();
    this.dragging.set(true);
  }

  protected dragLeave(): void {
    this.dragging.set(false);
  }

  protected dropFiles(event: DragEvent): void {
    event.preventDefault();
    this.dragging.set(false);
    if (event.dataTransfer?.files) this.queue.add(event.dataTransfer.files);
  }

  protected overrideLocation(item: UploadItem, locationId: string): void {
    this.queue.override(item.id, { locationId });
  }

  protected overrideModality(item: UploadItem, modality: Modality | ''): void {
    this.queue.override(item.id, { modality });
  }

  protected overrideElement(item: UploadItem, element: string): void {
    this.queue.override(item.id, { element });
  }

  protected startUpload(): void {
    this.form.markAllAsTouched();
    const batch = this.form.getRawValue() as BatchFields;
    const waiting = this.queue.items().filter((i) => i.state === 'waiting');
    const problem = this.problemWith(batch, waiting);
    this.startError.set(problem);
    if (problem || this.form.controls.specimenId.invalid || this.form.controls.magnification.invalid || this.form.controls.pixelSizeUm.invalid) return;
    this.queue.start(this.data.projectId, batch);
  }

  protected close(): void {
    this.dialogRef.close(this.queue.storedCount());
  }

  /** What keeps the batch from starting, in one sentence; '' when it can go. */
  private problemWith(batch: BatchFields, waiting: readonly UploadItem[]): string {
    if (waiting.length === 0) return 'Add image files first.';
    if (!batch.specimenId) return 'Choose the specimen the images show.';
    if (waiting.some((i) => !effectiveModality(batch, i.overrides))) return 'Choose a modality for the batch, or for each file.';
    const edsWithout = waiting.find((i) => effectiveModality(batch, i.overrides) === 'eds_element' && !(i.overrides.element || batch.element).trim());
    return edsWithout ? `Name the element of the EDS map ${edsWithout.file.name}.` : '';
  }
}
