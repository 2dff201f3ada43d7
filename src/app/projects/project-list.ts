import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, linkedSignal, signal } from '@angular/core';
import { FormControl, ReactiveFormsModule } from '@angular/forms';
import { MatButton } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatFormField, MatLabel, MatPrefix } from '@angular/material/form-field';
import { MatIcon } from '@angular/material/icon';
import { MatInput } from '@angular/material/input';
import { MatPaginator, PageEvent } from '@angular/material/paginator';
import { MatProgressBar } from '@angular/material/progress-bar';
import { MatOption, MatSelect } from '@angular/material/select';
import { MatSort, MatSortHeader, Sort } from '@angular/material/sort';
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
import { Router, RouterLink } from '@angular/router';
import type { ListProjectsQuery, ProjectDetail } from '../../../shared/projects';
import { remote } from '../core/remote';
import { typedSearch } from '../core/typed-search';
import { ProjectApi } from './project-api';

type StatusFilter = ListProjectsQuery['status'];
type SortField = ListProjectsQuery['sort'];

/** Typing pauses this long before the list asks the server again. */
@Component({
  selector: 'ef-project-list',
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
    MatInput,
    MatLabel,
    MatOption,
    MatPaginator,
    MatPrefix,
    MatProgressBar,
    MatRow,
    MatRowDef,
    MatSelect,
    MatSort,
    MatSortHeader,
    MatTable,
    ReactiveFormsModule,
    RouterLink,
  ],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './project-list.html',
  styleUrl: './project-list.scss',
})
export default class ProjectList {
  private readonly api = inject(ProjectApi);
  private readonly dialog = inject(MatDialog);
  private readonly router = inject(Router);

  protected readonly columns = ['code', 'name', 'status', 'memberCount', 'myRole', 'updatedAt'];
  protected readonly pageSizes = [10, 20, 50, 100];
  protected readonly filter = new FormControl('', { nonNullable: true });
  protected readonly status = signal<StatusFilter>('active');
  protected readonly sort = signal<{ active: SortField; direction: 'asc' | 'desc' }>({ active: 'name', direction: 'asc' });
  protected readonly pageSize = signal(20);
  private readonly q = typedSearch(this.filter.valueChanges);
  /** Back to the first page whenever the filter or the order changes. */
  protected readonly pageIndex = linkedSignal({
    source: () => ({ q: this.q(), status: this.status(), sort: this.sort() }),
    computation: () => 0,
  });
  private readonly query = computed<ListProjectsQuery>(() => ({
    page: this.pageIndex(),
    pageSize: this.pageSize(),
    sort: this.sort().active,
    dir: this.sort().direction,
    q: this.q(),
    status: this.status(),
  }));
  protected readonly projects = remote(this.query, (query) => this.api.list(query));
  protected readonly rows = computed(() => this.projects.value()?.items ?? []);
  protected readonly total = computed(() => this.projects.value()?.total ?? 0);
  protected readonly isEmpty = computed(
    () => !this.projects.loading() && !this.projects.error() && this.projects.value()?.total === 0,
  );
  protected readonly emptyText = computed(() =>
    this.q() !== '' || this.status() !== 'active'
      ? 'No projects match this filter.'
      : 'No projects yet. Create one to start filing specimens and micrographs.',
  );

  protected sortBy(sort: Sort): void {
    const direction = sort.direction === 'desc' ? 'desc' : 'asc';
    this.sort.set({ active: sort.active as SortField, direction });
  }

  protected showStatus(status: StatusFilter): void {
    this.status.set(status);
  }

  protected turnPage(event: PageEvent): void {
    this.pageSize.set(event.pageSize);
    this.pageIndex.set(event.pageIndex);
  }

  /** Creates through the dialog, then opens the new project. */
  protected async openNewProject(): Promise<void> {
    // The dialog checks fields with the shared zod schemas: load them only when asked.
    const { NewProjectDialog } = await import('./new-project-dialog');
    this.dialog
      .open<InstanceType<typeof NewProjectDialog>, void, ProjectDetail>(NewProjectDialog, { width: '520px' })
      .afterClosed()
      .subscribe((created) => {
        if (created) void this.router.navigate(['/projects', created.id]);
      });
  }
}
