import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, effect, inject, input, signal } from '@angular/core';
import { MatButton } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIcon } from '@angular/material/icon';
import { MatProgressBar } from '@angular/material/progress-bar';
import { Title } from '@angular/platform-browser';
import { Router, RouterLink } from '@angular/router';
import type { ProjectDetail, ProjectStatus } from '../../../shared/projects';
import { ProjectArchive } from '../archive/project-archive';
import { apiErrorMessage } from '../core/api-error-message';
import { askToConfirm } from '../core/confirm-dialog';
import { remote } from '../core/remote';
import { SessionStore } from '../core/session-store';
import { ProjectApi } from './project-api';
import { ProjectMembers } from './project-members';
import { RolePermissions } from './role-permissions';

/** One project: what it is, who is in it, and what the viewer may do there. */
@Component({
  selector: 'ef-project-page',
  imports: [DatePipe, MatButton, MatIcon, MatProgressBar, ProjectArchive, ProjectMembers, RolePermissions, RouterLink],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './project-page.html',
  styleUrl: './project-page.scss',
})
export default class ProjectPage {
  private readonly api = inject(ProjectApi);
  private readonly dialog = inject(MatDialog);
  private readonly router = inject(Router);
  private readonly session = inject(SessionStore);
  private readonly title = inject(Title);

  /** Route parameter. */
  readonly projectId = input.required<string>();

  protected readonly project = remote(this.projectId, (id) => this.api.get(id));
  protected readonly siteRole = computed(() => this.session.user()?.siteRole ?? 'member');
  protected readonly canEdit = computed(() => this.project.value()?.allowed.includes('editProject') ?? false);
  protected readonly statusBusy = signal(false);
  protected readonly actionError = signal('');

  /** Tabs and history show which project this is. */
  private readonly nameInTitle = effect(() => {
    const project = this.project.value();
    if (project) this.title.setTitle(`${project.code} · ${project.name} · Etchfile`);
  });

  protected async editProject(project: ProjectDetail): Promise<void> {
    // The dialog checks fields with the shared zod schemas: load them only when asked.
    const { EditProjectDialog } = await import('./edit-project-dialog');
    this.dialog
      .open<InstanceType<typeof EditProjectDialog>, ProjectDetail, ProjectDetail>(EditProjectDialog, {
        data: project,
        width: '560px',
      })
      .afterClosed()
      .subscribe((saved) => {
        if (saved) this.project.set(saved);
      });
  }

  protected archiveProject(project: ProjectDetail): void {
    askToConfirm(this.dialog, {
      title: `Archive ${project.code}?`,
      message:
        'The project leaves the list of active projects. Nothing is deleted: members can still open it, and a lead can restore it.',
      confirmLabel: 'Archive',
    }).subscribe((confirmed) => {
      if (confirmed) this.setStatus(project, 'archived');
    });
  }

  protected restoreProject(project: ProjectDetail): void {
    this.setStatus(project, 'active');
  }

  protected returnToList(): void {
    void this.router.navigate(['/projects']);
  }

  private setStatus(project: ProjectDetail, status: ProjectStatus): void {
    this.statusBusy.set(true);
    this.actionError.set('');
    this.api.update(project.id, { status }).subscribe({
      next: (saved) => {
        this.project.set(saved);
        this.statusBusy.set(false);
      },
      error: (error) => {
        this.actionError.set(apiErrorMessage(error).message);
        this.statusBusy.set(false);
      },
    });
  }
}
