import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, input, output, signal } from '@angular/core';
import { FormGroupDirective, NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButton, MatIconButton } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatError, MatFormField, MatLabel } from '@angular/material/form-field';
import { MatIcon } from '@angular/material/icon';
import { MatInput } from '@angular/material/input';
import { MatOption, MatSelect, MatSelectChange } from '@angular/material/select';
import {
  MatCell,
  MatCellDef,
  MatColumnDef,
  MatHeaderCell,
  MatHeaderCellDef,
  MatHeaderRow,
  MatHeaderRowDef,
  MatNoDataRow,
  MatRow,
  MatRowDef,
  MatTable,
} from '@angular/material/table';
import { MatTooltip } from '@angular/material/tooltip';
import type { ProjectDetail, ProjectMember } from '../../../shared/projects';
import { PROJECT_ROLES, type ProjectRole } from '../../../shared/roles';
import { apiErrorMessage } from '../core/api-error-message';
import { askToConfirm } from '../core/confirm-dialog';
import { applyServerErrors } from '../core/server-errors';
import { SessionStore } from '../core/session-store';
import { ValidationMessagePipe } from '../core/validation-message-pipe';
import { ProjectApi } from './project-api';

/** The member list of a project, editable by those allowed to manage members. */
@Component({
  selector: 'ef-project-members',
  imports: [
    DatePipe,
    MatButton,
    MatCell,
    MatCellDef,
    MatColumnDef,
    MatError,
    MatFormField,
    MatHeaderCell,
    MatHeaderCellDef,
    MatHeaderRow,
    MatHeaderRowDef,
    MatIcon,
    MatIconButton,
    MatInput,
    MatLabel,
    MatNoDataRow,
    MatOption,
    MatRow,
    MatRowDef,
    MatSelect,
    MatTable,
    MatTooltip,
    ReactiveFormsModule,
    ValidationMessagePipe,
  ],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './project-members.html',
  styleUrl: './project-members.scss',
})
export class ProjectMembers {
  private readonly api = inject(ProjectApi);
  private readonly dialog = inject(MatDialog);
  private readonly session = inject(SessionStore);
  private readonly fb = inject(NonNullableFormBuilder);

  readonly project = input.required<ProjectDetail>();
  /** After any successful change: the page reloads the project (counts, `allowed`). */
  readonly changed = output<void>();
  /** The user removed their own membership and may no longer see the project. */
  readonly leftProject = output<void>();

  protected readonly roles = PROJECT_ROLES;
  protected readonly canManage = computed(() => this.project().allowed.includes('manageMembers'));
  protected readonly members = computed(() => this.project().members);
  protected readonly columns = computed(() =>
    this.canManage() ? ['member', 'role', 'addedAt', 'actions'] : ['member', 'role', 'addedAt'],
  );
  protected readonly myUserId = computed(() => this.session.user()?.id ?? null);
  protected readonly addForm = this.fb.group({
    email: ['', [Validators.required, Validators.email]],
    role: ['researcher' as ProjectRole, Validators.required],
  });
  protected readonly adding = signal(false);
  protected readonly addError = signal('');
  /** The member whose row is waiting for the server. */
  protected readonly busyUserId = signal<string | null>(null);
  protected readonly listError = signal('');

  protected addMember(formDirective: FormGroupDirective): void {
    if (this.addForm.invalid || this.adding()) return;
    const { email, role } = this.addForm.getRawValue();
    this.adding.set(true);
    this.addError.set('');
    this.api.addMember(this.project().id, { email: email.trim().toLowerCase(), role }).subscribe({
      next: () => {
        formDirective.resetForm({ email: '', role: 'researcher' });
        this.adding.set(false);
        this.changed.emit();
      },
      error: (error) => {
        const failure = apiErrorMessage(error);
        // "No such user" (404) and "already a member" (409) are about the address typed.
        if ((failure.code === 'not_found' || failure.code === 'conflict') && !failure.fieldErrors['email']) {
          failure.fieldErrors = { ...failure.fieldErrors, email: failure.message };
        }
        this.addError.set(applyServerErrors(this.addForm, failure));
        this.adding.set(false);
      },
    });
  }

  protected changeRole(member: ProjectMember, change: MatSelectChange<ProjectRole>): void {
    this.busyUserId.set(member.userId);
    this.listError.set('');
    this.api.changeMember(this.project().id, member.userId, { role: change.value }).subscribe({
      next: () => {
        this.busyUserId.set(null);
        this.changed.emit();
      },
      error: (error) => {
        // Put the select back: the binding still holds the old role, so it will not redraw by itself.
        change.source.value = member.role;
        this.listError.set(apiErrorMessage(error).message);
        this.busyUserId.set(null);
      },
    });
  }

  protected removeMember(member: ProjectMember): void {
    const isMe = member.userId === this.myUserId();
    askToConfirm(this.dialog, {
      title: isMe ? 'Leave this project?' : `Remove ${member.displayName}?`,
      message: isMe
        ? 'You will lose access to this project unless someone adds you again.'
        : `${member.displayName} will lose access to this project. Their images and measurements stay in it.`,
      confirmLabel: isMe ? 'Leave' : 'Remove',
    }).subscribe((confirmed) => {
      if (confirmed) this.sendRemoval(member, isMe);
    });
  }

  private sendRemoval(member: ProjectMember, isMe: boolean): void {
    this.busyUserId.set(member.userId);
    this.listError.set('');
    this.api.removeMember(this.project().id, member.userId).subscribe({
      next: () => {
        this.busyUserId.set(null);
        if (isMe) this.leftProject.emit();
        else this.changed.emit();
      },
      error: (error) => {
        this.listError.set(apiErrorMessage(error).message);
        this.busyUserId.set(null);
      },
    });
  }
}
