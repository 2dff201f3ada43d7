import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { MatIcon } from '@angular/material/icon';
import { RouterLink } from '@angular/router';

/** One step of the trail; the last one is the current page and carries no link. */
export interface Crumb {
  label: string;
  link?: readonly string[];
}

/** Projects › project code › sample code › specimen code. */
@Component({
  selector: 'ef-breadcrumbs',
  imports: [MatIcon, RouterLink],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <nav aria-label="Breadcrumbs">
      <ol>
        @for (crumb of crumbs(); track $index; let last = $last) {
          <li>
            @if (crumb.link && !last) {
              <a [routerLink]="crumb.link">{{ crumb.label }}</a>
              <mat-icon aria-hidden="true">chevron_right</mat-icon>
            } @else {
              <span aria-current="page">{{ crumb.label }}</span>
            }
          </li>
        }
      </ol>
    </nav>
  `,
  styles: `
    ol {
      display: flex;
      flex-wrap: wrap;
      align-items: center;
      gap: 2px;
      margin: 0;
      padding: 0;
      list-style: none;
      font: var(--mat-sys-label-large);
    }
    li {
      display: inline-flex;
      align-items: center;
      gap: 2px;
    }
    a {
      color: var(--mat-sys-primary);
      text-decoration: none;
    }
    a:hover,
    a:focus-visible {
      text-decoration: underline;
    }
    span {
      color: var(--mat-sys-on-surface-variant);
    }
    mat-icon {
      font-size: 18px;
      width: 18px;
      height: 18px;
      color: var(--mat-sys-outline);
    }
  `,
})
export class Breadcrumbs {
  readonly crumbs = input.required<readonly Crumb[]>();
}
