import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { MatButton } from '@angular/material/button';
import { MatIcon } from '@angular/material/icon';
import { MAX_PAGE_SIZE } from '../../../shared/paging';
import { remote } from '../core/remote';
import { ActivityApi } from './activity-api';
import { activityIcon } from './activity-icons';

const STEP = 20;

/** Who did what and when, newest first; read-only, as the history itself is. */
@Component({
  selector: 'ef-activity-timeline',
  imports: [DatePipe, MatButton, MatIcon],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <section class="timeline" aria-label="History">
      <h3>History</h3>
      @if (history.error(); as error) {
        <p class="error">{{ error }} <button mat-button (click)="history.reload()">Try again</button></p>
      } @else if (history.value(); as page) {
        @if (page.items.length === 0) {
          <p class="empty">Nothing has happened here yet.</p>
        } @else {
          <ol>
            @for (event of page.items; track event.id) {
              <li>
                <mat-icon aria-hidden="true">{{ icon(event.action) }}</mat-icon>
                <span class="what"><strong>{{ event.actorName }}</strong> {{ event.summary }}</span>
                <time class="ef-number" [attr.datetime]="event.at">{{ event.at | date: 'd MMM y, HH:mm' }}</time>
              </li>
            }
          </ol>
          @if (hasMore()) {
            <button mat-button (click)="showMore()">Show older entries</button>
          }
        }
      } @else {
        <p class="empty">Loading the history…</p>
      }
    </section>
  `,
  styles: `
    :host { display: block; }
    h3 { margin: 0 0 8px; font: var(--mat-sys-title-medium); }
    ol { list-style: none; margin: 0; padding: 0; }
    li {
      display: grid;
      grid-template-columns: 24px 1fr auto;
      gap: 8px;
      align-items: baseline;
      padding: 6px 0;
      border-bottom: 1px solid var(--mat-sys-outline-variant);
    }
    mat-icon { font-size: 18px; width: 18px; height: 18px; color: var(--mat-sys-on-surface-variant); }
    time { color: var(--mat-sys-on-surface-variant); font: var(--mat-sys-body-small); white-space: nowrap; }
    .empty, .error { color: var(--mat-sys-on-surface-variant); }
  `,
})
export class ActivityTimeline {
  private readonly api = inject(ActivityApi);

  readonly projectId = input.required<string>();
  readonly imageId = input<string | null>(null);

  private readonly pageSize = signal(STEP);
  protected readonly history = remote(
    () => ({ projectId: this.projectId(), imageId: this.imageId(), size: this.pageSize() }),
    ({ projectId, imageId, size }) => this.api.history(projectId, imageId, size),
  );
  protected readonly hasMore = computed(() => {
    const page = this.history.value();
    // One request holds at most MAX_PAGE_SIZE entries; the newest ones are what people look for.
    return !!page && page.items.length < page.total && this.pageSize() < MAX_PAGE_SIZE;
  });
  protected readonly icon = activityIcon;

  protected showMore(): void {
    this.pageSize.update((n) => Math.min(MAX_PAGE_SIZE, n + STEP));
  }
}
