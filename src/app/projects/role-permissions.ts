import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { MatIcon } from '@angular/material/icon';
import { ACTION_LABELS, can, PROJECT_ACTIONS, type ProjectRole, type SiteRole } from '../../../shared/roles';

/** "What your role can do": the shared permission table, read for one person. */
@Component({
  selector: 'ef-role-permissions',
  imports: [MatIcon],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <h2>What your role can do</h2>
    <p class="who">{{ summary() }}</p>
    <ul>
      @for (row of rows(); track row.action) {
        <li [class.denied]="!row.allowed">
          <mat-icon>{{ row.allowed ? 'check' : 'remove' }}</mat-icon>
          <span>{{ row.label }}</span>
          <span class="ef-visually-hidden">{{ row.allowed ? ': allowed' : ': not allowed' }}</span>
        </li>
      }
    </ul>
  `,
  styles: `
    :host {
      display: block;
      padding: 16px;
      border-radius: var(--mat-sys-corner-medium);
      background: var(--mat-sys-surface-container);
    }
    h2 {
      margin: 0;
      font: var(--mat-sys-title-medium);
    }
    .who {
      margin: 4px 0 12px;
      color: var(--mat-sys-on-surface-variant);
    }
    ul {
      display: flex;
      flex-direction: column;
      gap: 4px;
      margin: 0;
      padding: 0;
      list-style: none;
      font: var(--mat-sys-body-small);
    }
    li {
      display: flex;
      align-items: center;
      gap: 8px;
    }
    mat-icon {
      font-size: 18px;
      width: 18px;
      height: 18px;
      color: var(--mat-sys-primary);
    }
    .denied {
      color: var(--mat-sys-on-surface-variant);
      opacity: 0.72;
    }
    .denied mat-icon {
      color: var(--mat-sys-outline);
    }
  `,
})
export class RolePermissions {
  readonly projectRole = input.required<ProjectRole | null>();
  readonly siteRole = input.required<SiteRole>();

  protected readonly rows = computed(() =>
    PROJECT_ACTIONS.map((action) => ({
      action,
      label: ACTION_LABELS[action],
      allowed: can(this.siteRole(), this.projectRole(), action),
    })),
  );
  protected readonly summary = computed(() => {
    const role = this.projectRole();
    if (role) return `You are a ${role} in this project.`;
    return this.siteRole() === 'admin'
      ? 'You are not a member; as a site administrator you hold a lead’s rights here.'
      : 'You are not a member of this project.';
  });
}
