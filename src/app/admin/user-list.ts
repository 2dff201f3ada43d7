import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, linkedSignal, signal } from '@angular/core';
import { FormControl, ReactiveFormsModule } from '@angular/forms';
import { MatButton, MatIconButton } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatFormField, MatLabel, MatPrefix } from '@angular/material/form-field';
import { MatIcon } from '@angular/material/icon';
import { MatInput } from '@angular/material/input';
import { MatMenu, MatMenuContent, MatMenuItem, MatMenuTrigger } from '@angular/material/menu';
import { MatPaginator, PageEvent } from '@angular/material/paginator';
import { MatProgressBar } from '@angular/material/progress-bar';
import { MatSnackBar } from '@angular/material/snack-bar';
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
import type { ListUsersQuery, UpdateUserBody, UserSummary } from '../../../shared/admin';
import { apiErrorMessage, type FailedResponse } from '../core/api-error-message';
import { askToConfirm } from '../core/confirm-dialog';
import { remote } from '../core/remote';
import { typedSearch } from '../core/typed-search';
import { SessionStore } from '../core/session-store';
import { AdminApi } from './admin-api';
import { userChanges, type UserChange } from './user-changes';

type SortField = ListUsersQuery['sort'];

@Component({
  selector: 'ef-user-list',
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
    MatIconButton,
    MatInput,
    MatLabel,
    MatMenu,
    MatMenuContent,
    MatMenuItem,
    MatMenuTrigger,
    MatPaginator,
    MatPrefix,
    MatProgressBar,
    MatRow,
    MatRowDef,
    MatSort,
    MatSortHeader,
    MatTable,
    ReactiveFormsModule,
  ],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './user-list.html',
  styleUrl: './user-list.scss',
})
export default class UserList {
  private readonly api = inject(AdminApi);
  private readonly dialog = inject(MatDialog);
  private readonly snackBar = inject(MatSnackBar);
  private readonly session = inject(SessionStore);

  protected readonly columns = ['email', 'displayName', 'siteRole', 'active', 'hasPassword', 'lastSignInAt', 'actions'];
  protected readonly pageSizes = [10, 20, 50, 100];
  protected readonly filter = new FormControl('', { nonNullable: true });
  protected readonly sort = signal<{ active: SortField; direction: 'asc' | 'desc' }>({ active: 'email', direction: 'asc' });
  protected readonly pageSize = signal(20);
  private readonly q = typedSearch(this.filter.valueChanges);
  protected readonly pageIndex = linkedSignal({
    source: () => ({ q: this.q(), sort: this.sort() }),
    computation: () => 0,
  });
  private readonly query = computed<ListUsersQuery>(() => ({
    page: this.pageIndex(),
    pageSize: this.pageSize(),
    sort: this.sort().active,
    dir: this.sort().direction,
    q: this.q(),
  }));
  protected readonly users = remote(this.query, (query) => this.api.listUsers(query));
  protected readonly myUserId = computed(() => this.session.user()?.id ?? null);
  /** Each account with the changes its menu offers. */
  protected readonly rows = computed(() =>
    (this.users.value()?.items ?? []).map((user) => ({ user, changes: userChanges(user, this.myUserId()) })),
  );
  protected readonly total = computed(() => this.users.value()?.total ?? 0);
  protected readonly isEmpty = computed(() => !this.users.loading() && !this.users.error() && this.users.value()?.total === 0);
  /** The row whose change is on its way to the server. */
  protected readonly busyUserId = signal<string | null>(null);

  protected sortBy(sort: Sort): void {
    this.sort.set({ active: sort.active as SortField, direction: sort.direction === 'desc' ? 'desc' : 'asc' });
  }

  protected turnPage(event: PageEvent): void {
    this.pageSize.set(event.pageSize);
    this.pageIndex.set(event.pageIndex);
  }

  protected async openInvite(): Promise<void> {
    // The dialog checks fields with the shared zod schemas: load them only when asked.
    const { InviteUserDialog } = await import('./invite-user-dialog');
    this.dialog
      .open<InstanceType<typeof InviteUserDialog>, void, UserSummary>(InviteUserDialog, { width: '520px' })
      .afterClosed()
      .subscribe((invited) => {
        if (!invited) return;
        this.snackBar.open(`Invitation sent to ${invited.email}.`, 'OK', { duration: 5000 });
        this.users.reload();
      });
  }

  protected applyChange(user: UserSummary, change: UserChange): void {
    if (!change.confirmation) {
      this.sendChange(user, change.body, change.done);
      return;
    }
    askToConfirm(this.dialog, change.confirmation).subscribe((confirmed) => {
      if (confirmed) this.sendChange(user, change.body, change.done);
    });
  }

  protected sendResetLink(user: UserSummary): void {
    this.busyUserId.set(user.id);
    this.api.sendResetLink(user.id).subscribe({
      next: () => {
        this.busyUserId.set(null);
        this.snackBar.open(`A link to set a password was sent to ${user.email}.`, 'OK', { duration: 5000 });
      },
      error: (error) => this.reportFailure(error),
    });
  }

  private sendChange(user: UserSummary, body: UpdateUserBody, done: string): void {
    this.busyUserId.set(user.id);
    this.api.updateUser(user.id, body).subscribe({
      next: () => {
        this.busyUserId.set(null);
        this.snackBar.open(done, 'OK', { duration: 5000 });
        this.users.reload();
      },
      error: (error) => this.reportFailure(error),
    });
  }

  private reportFailure(error: FailedResponse): void {
    this.busyUserId.set(null);
    const failure = apiErrorMessage(error);
    // Server and network failures already raised a snack bar in the error interceptor.
    if (failure.status > 0 && failure.status < 500) this.snackBar.open(failure.message, 'Dismiss', { duration: 8000 });
  }
}
