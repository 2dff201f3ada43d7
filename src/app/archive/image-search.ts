import { CalibrationPresets } from './calibration-presets';
import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, effect, inject, input, linkedSignal, signal } from '@angular/core';
import { MatButton } from '@angular/material/button';
import { MatButtonToggle, MatButtonToggleGroup } from '@angular/material/button-toggle';
import { MatDialog } from '@angular/material/dialog';
import { MatFormField, MatLabel } from '@angular/material/form-field';
import { MatIcon } from '@angular/material/icon';
import { MatPaginator, type PageEvent } from '@angular/material/paginator';
import { MatProgressBar } from '@angular/material/progress-bar';
import { MatOption, MatSelect } from '@angular/material/select';
import { MatSort, MatSortHeader, type Sort } from '@angular/material/sort';
import {
  MatCell,
  MatCellDef,
  MatColumnDef,
  MatHeaderCell,
  MatHeaderCellDef,
  MatHeaderRow,
  MatHeaderRowDef,
  MatRow,
  MatRowDef,
  MatTable,
} from '@angular/material/table';
import { Title } from '@angular/platform-browser';
import { RouterLink } from '@angular/router';
import { MODALITY_LABELS, type ImageSortField } from '../../../shared/images';
import { remote } from '../core/remote';
import { ProjectApi } from '../projects/project-api';
import { Breadcrumbs, type Crumb } from './breadcrumbs';
import { ImageApi, type ImageQuery } from './image-api';
import { anyInProgress, formatMagnification, formatPixelSize, processingText } from './image-display';
import { ImageFilters, type ImageFilterValues } from './image-filters';
import { ImageThumbnail } from './image-thumbnail';
import type { UploadDialogData } from './upload-dialog';

type ViewMode = 'grid' | 'table';

const SORT_LABELS: Record<ImageSortField, string> = {
  uploadedAt: 'Uploaded',
  acquiredAt: 'Acquired',
  originalName: 'File name',
  magnification: 'Magnification',
  pixelSizeUm: 'Pixel size',
  specimen: 'Specimen',
};
const VIEW_KEY = 'ef.imageSearch.view';
const POLL_MS = 3000;

/** Every micrograph of a project, filtered, sorted and paged by the server, as a grid or a table. */
@Component({
  selector: 'ef-image-search',
  imports: [CalibrationPresets, 
    Breadcrumbs,
    DatePipe,
    ImageFilters,
    ImageThumbnail,
    MatButton,
    MatButtonToggle,
    MatButtonToggleGroup,
    MatCell,
    MatCellDef,
    MatColumnDef,
    MatFormField,
    MatHeaderCell,
    MatHeaderCellDef,
    MatHeaderRow,
    MatHeaderRowDef,
    MatIcon,
    MatLabel,
    MatOption,
    MatPaginator,
    MatProgressBar,
    MatRow,
    MatRowDef,
    MatSelect,
    MatSort,
    MatSortHeader,
    MatTable,
    RouterLink,
  ],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './image-search.html',
  styleUrl: './image-search.scss',
})
export default class ImageSearch {
  private readonly api = inject(ImageApi);
  private readonly projectApi = inject(ProjectApi);
  private readonly dialog = inject(MatDialog);
  private readonly title = inject(Title);

  /** Route parameter, and filters a link may carry as query parameters. */
  readonly projectId = input.required<string>();
  readonly specimenId = input<string | undefined>(undefined);
  readonly sampleId = input<string | undefined>(undefined);

  protected readonly project = remote(this.projectId, (id) => this.projectApi.get(id));
  protected readonly sortFields = (Object.keys(SORT_LABELS) as ImageSortField[]).map((value) => ({ value, label: SORT_LABELS[value] }));
  protected readonly pageSizes = [24, 48, 96];
  protected readonly columns = ['thumbnail', 'originalName', 'specimen', 'location', 'modality', 'magnification', 'pixelSizeUm', 'acquiredAt', 'uploadedAt', 'state'];
  protected readonly view = signal<ViewMode>(localStorage.getItem(VIEW_KEY) === 'table' ? 'table' : 'grid');
  /** Starts from the link's filters; the filter form replaces it as people type. */
  protected readonly filters = linkedSignal<ImageFilterValues>(() => ({ specimenId: this.specimenId() ?? '', sampleId: this.sampleId() ?? '' }));
  protected readonly sort = signal<{ active: ImageSortField; direction: 'asc' | 'desc' }>({ active: 'uploadedAt', direction: 'desc' });
  protected readonly pageSize = signal(24);
  protected readonly pageIndex = linkedSignal({ source: () => ({ f: this.filters(), s: this.sort() }), computation: () => 0 });
  private readonly query = computed<ImageQuery & { projectId: string }>(() => ({
    projectId: this.projectId(),
    ...this.filters(),
    page: this.pageIndex(),
    pageSize: this.pageSize(),
    sort: this.sort().active,
    dir: this.sort().direction,
  }));
  protected readonly images = remote(this.query, ({ projectId, ...query }) => this.api.search(projectId, query));
  protected readonly rows = computed(() =>
    (this.images.value()?.items ?? []).map((i) => ({
      ...i,
      modalityLabel: MODALITY_LABELS[i.modality],
      magnificationText: formatMagnification(i.magnification),
      pixelSizeText: formatPixelSize(i.pixelSize.xUm),
      stateText: processingText(i.processing),
      thumbnailUrl: i.processing.state === 'ready' ? this.api.thumbnailUrl(i.projectId, i.id) : null,
    })),
  );
  protected readonly total = computed(() => this.images.value()?.total ?? 0);
  protected readonly isEmpty = computed(() => !this.images.loading() && !this.images.error() && this.total() === 0);
  protected readonly canUpload = computed(() => this.project.value()?.allowed.includes('upload') ?? false);
  protected readonly canEditMetadata = computed(() => this.project.value()?.allowed.includes('editMetadata') ?? false);
  /** The images on this page of results: a preset applies to exactly what the person sees. */
  protected readonly listedIds = computed(() => (this.images.value()?.items ?? []).map((i) => i.id));
  protected readonly crumbs = computed<Crumb[]>(() => [
    { label: 'Projects', link: ['/projects'] },
    { label: this.project.value()?.code ?? 'Project', link: ['/projects', this.projectId()] },
    { label: 'Images' },
  ]);

  private readonly pageTitle = effect(() => {
    const p = this.project.value();
    if (p) this.title.setTitle(`Images · ${p.code} · Etchfile`);
  });
  private readonly polling = effect((onCleanup) => {
    if (!anyInProgress(this.images.value()?.items ?? [])) return;
    const timer = setTimeout(() => this.images.reload(), POLL_MS);
    onCleanup(() => clearTimeout(timer));
  });

  protected applyFilters(values: ImageFilterValues): void {
    this.filters.set(values);
  }

  protected showAs(mode: ViewMode): void {
    this.view.set(mode);
    localStorage.setItem(VIEW_KEY, mode);
  }

  protected sortBy(sort: Sort): void {
    this.sort.set({ active: sort.active as ImageSortField, direction: sort.direction === 'asc' ? 'asc' : 'desc' });
  }

  protected sortField(active: ImageSortField): void {
    this.sort.update((s) => ({ ...s, active }));
  }

  protected sortDirection(direction: 'asc' | 'desc'): void {
    this.sort.update((s) => ({ ...s, direction }));
  }

  protected turnPage(event: PageEvent): void {
    this.pageSize.set(event.pageSize);
    this.pageIndex.set(event.pageIndex);
  }

  protected async openUpload(): Promise<void> {
    const { UploadDialog } = await import('./upload-dialog');
    const data: UploadDialogData = { projectId: this.projectId(), specimenId: this.filters().specimenId || undefined };
    this.dialog
      .open<InstanceType<typeof UploadDialog>, UploadDialogData, number>(UploadDialog, { data, width: '760px', maxHeight: '92vh', disableClose: true })
      .afterClosed()
      .subscribe(() => this.images.reload());
  }
}
