import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { MatButton } from '@angular/material/button';
import { MatOption } from '@angular/material/core';
import { MatFormField, MatLabel } from '@angular/material/form-field';
import { MatIcon } from '@angular/material/icon';
import { MatPaginator, type PageEvent } from '@angular/material/paginator';
import { MatProgressBar } from '@angular/material/progress-bar';
import { MatSelect } from '@angular/material/select';
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
import { RouterLink } from '@angular/router';
import { MODALITIES, MODALITY_LABELS, type Modality } from '../../../shared/images';
import type { ReviewSubjectType } from '../../../shared/reviews';
import { remote } from '../core/remote';
import { ProjectApi } from '../projects/project-api';
import { ReviewApi } from './review-api';
import { countOf } from './review-text';

const PAGE_SIZES = [20, 50, 100];

/** Images and figures waiting for the signed-in reviewer, oldest submission first, across their projects. */
@Component({
  selector: 'ef-review-queue',
  imports: [
    DatePipe,
    MatButton,
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
    MatTable,
    RouterLink,
  ],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './review-queue.html',
  styleUrl: './review-queue.scss',
})
export default class ReviewQueue {
  private readonly api = inject(ReviewApi);
  private readonly projectApi = inject(ProjectApi);

  protected readonly columns = ['submittedAt', 'item', 'project', 'modality', 'submittedBy', 'openThreads'];
  protected readonly pageSizes = PAGE_SIZES;
  protected readonly modalities = MODALITIES.map((m) => ({ value: m, label: MODALITY_LABELS[m] }));
  protected readonly projectId = signal('');
  protected readonly modality = signal<Modality | ''>('');
  protected readonly subjectType = signal<ReviewSubjectType | ''>('');
  protected readonly pageIndex = signal(0);
  protected readonly pageSize = signal(PAGE_SIZES[0]);

  private readonly query = computed(() => ({
    page: this.pageIndex(),
    pageSize: this.pageSize(),
    projectId: this.projectId() || undefined,
    modality: this.modality() || undefined,
    subjectType: this.subjectType() || undefined,
  }));
  protected readonly queue = remote(this.query, (q) => this.api.queue(q));
  /** Only projects where the caller reviews can be chosen (the server refuses the others). */
  private readonly projects = remote(
    () => null,
    () => this.projectApi.list({ page: 0, pageSize: 100, sort: 'code', dir: 'asc', q: '', status: 'all' }),
  );
  protected readonly reviewedProjects = computed(() => (this.projects.value()?.items ?? []).filter((p) => p.myRole === 'reviewer'));
  protected readonly rows = computed(() =>
    (this.queue.value()?.items ?? []).map((item) => ({
      ...item,
      link: ['/projects', item.projectId, item.subjectType === 'image' ? 'images' : 'figures', item.subjectId],
      kindLabel: item.subjectType === 'image' ? 'Image' : 'Figure',
      sub: item.subjectType === 'image' ? (item.specimenCode ?? '') : countOf(item.panelCount ?? 0, 'panel'),
      modalityLabel: item.modality ? MODALITY_LABELS[item.modality] : '—',
      threadsText: countOf(item.openThreads, 'open thread'),
    })),
  );
  protected readonly total = computed(() => this.queue.value()?.total ?? 0);
  protected readonly isEmpty = computed(() => !this.queue.loading() && !this.queue.error() && this.rows().length === 0);
  protected readonly filtered = computed(() => this.projectId() !== '' || this.modality() !== '' || this.subjectType() !== '');

  protected chooseProject(id: string): void {
    this.projectId.set(id);
    this.pageIndex.set(0);
  }

  protected chooseModality(modality: Modality | ''): void {
    this.modality.set(modality);
    this.pageIndex.set(0);
  }

  protected chooseSubjectType(type: ReviewSubjectType | ''): void {
    this.subjectType.set(type);
    this.pageIndex.set(0);
  }

  protected clearFilters(): void {
    this.projectId.set('');
    this.modality.set('');
    this.subjectType.set('');
    this.pageIndex.set(0);
  }

  protected turnPage(event: PageEvent): void {
    this.pageIndex.set(event.pageIndex);
    this.pageSize.set(event.pageSize);
  }
}
