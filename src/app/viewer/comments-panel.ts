import { ChangeDetectionStrategy, Component, computed, inject, input, output } from '@angular/core';
import { MatIcon } from '@angular/material/icon';
import { MatProgressBar } from '@angular/material/progress-bar';
import type { ImageRecord } from '../../../shared/images';
import type { Mentionable } from '../reviews/comment-box';
import { ThreadList } from '../reviews/thread-list';
import { ReviewPinBoard } from './review-pin-board';

const EXCERPT_CHARS = 70;

/**
 * The viewer's Comments tab: the pins on the canvas as a numbered list (a click flies there),
 * then the threads themselves to read, reply to, resolve or reopen.
 */
@Component({
  selector: 'ef-comments-panel',
  imports: [MatIcon, MatProgressBar, ThreadList],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    @if (board.threads.loading() && !board.threads.value()) {
      <mat-progress-bar mode="indeterminate" aria-label="Loading comment pins" />
    } @else if (board.threads.error(); as error) {
      <p class="panel-error" role="alert">{{ error }}</p>
    } @else if (rows().length === 0) {
      <p class="quiet">
        No pinned comments on this image.
        @if (canComment()) {
          Choose the comment pin (C), then click a point or drag a box on the image.
        }
      </p>
    } @else {
      <ol class="pins" aria-label="Comment pins on this image">
        @for (r of rows(); track r.threadId) {
          <li>
            <button type="button" class="pin" [class.focused]="r.threadId === board.focused()" [class.resolved]="!r.open" [attr.aria-label]="r.label" (click)="choose.emit(r.threadId)">
              <span class="number" aria-hidden="true">{{ r.number }}</span>
              <span class="text">
                <span class="excerpt">{{ r.excerpt }}</span>
                <span class="meta">{{ r.meta }}</span>
              </span>
              <mat-icon aria-hidden="true">{{ r.open ? 'chat_bubble_outline' : 'task_alt' }}</mat-icon>
            </button>
          </li>
        }
      </ol>
    }
    @for (v of [board.listVersion()]; track v) {
      <ef-thread-list
        [projectId]="projectId()"
        [imageId]="image().id"
        [imageWidth]="image().width"
        [imageHeight]="image().height"
        [members]="members()"
        [canComment]="canComment()"
        [offerNewThread]="false"
        [focusThread]="board.focused()"
        (changed)="board.changed()"
      />
    }
  `,
  styles: `
    :host {
      display: flex;
      flex-direction: column;
      gap: 12px;
      padding: 12px 16px;
    }
    .pins {
      list-style: none;
      margin: 0;
      padding: 0;
      display: flex;
      flex-direction: column;
      gap: 4px;
    }
    .pin {
      display: flex;
      align-items: center;
      gap: 10px;
      width: 100%;
      padding: 6px 8px;
      border: 1px solid transparent;
      border-radius: 8px;
      background: none;
      color: inherit;
      text-align: left;
      font: inherit;
      cursor: pointer;
    }
    .pin:hover,
    .pin:focus-visible {
      background: var(--mat-sys-surface-container-high);
    }
    .pin.focused {
      border-color: var(--ef-pin-open, #e0892b);
    }
    .number {
      flex: none;
      display: grid;
      place-items: center;
      width: 22px;
      height: 22px;
      border-radius: 50%;
      background: var(--ef-pin-open, #e0892b);
      color: #1b1208;
      font: 600 12px/1 var(--ef-mono, monospace);
    }
    .resolved .number {
      background: #8d969e;
    }
    .text {
      flex: 1;
      min-width: 0;
      display: flex;
      flex-direction: column;
    }
    .excerpt {
      overflow: hidden;
      white-space: nowrap;
      text-overflow: ellipsis;
    }
    .meta,
    .quiet {
      color: var(--mat-sys-on-surface-variant);
      font: var(--mat-sys-body-small);
    }
    .panel-error {
      color: var(--mat-sys-error);
    }
  `,
})
export class CommentsPanel {
  protected readonly board = inject(ReviewPinBoard);

  readonly projectId = input.required<string>();
  readonly image = input.required<ImageRecord>();
  readonly members = input<readonly Mentionable[]>([]);
  readonly canComment = input(false);
  /** A pin was chosen in the list: the page flies the view to it. */
  readonly choose = output<string>();

  protected readonly rows = computed(() => {
    const byId = new Map((this.board.threads.value() ?? []).map((t) => [t.id, t]));
    return this.board.pins().map((pin) => {
      const t = byId.get(pin.threadId)!;
      const first = t.comments[0];
      const body = first?.body ?? '';
      const excerpt = body.length > EXCERPT_CHARS ? `${body.slice(0, EXCERPT_CHARS - 1)}…` : body;
      const replies = t.comments.length - 1;
      const meta = `${first?.author.name ?? t.createdBy.name} · ${pin.ring ? 'region' : 'point'} · ${replies} ${replies === 1 ? 'reply' : 'replies'} · ${pin.open ? 'open' : 'resolved'}`;
      return { threadId: pin.threadId, number: pin.number, open: pin.open, excerpt, meta, label: `Pin ${pin.number}, ${pin.open ? 'open' : 'resolved'}: ${excerpt}` };
    });
  });
}
