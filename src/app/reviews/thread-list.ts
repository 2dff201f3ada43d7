import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, DOCUMENT, effect, inject, input, linkedSignal, output, signal, viewChild } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule } from '@angular/forms';
import { MatButton } from '@angular/material/button';
import { MatButtonToggle, MatButtonToggleGroup } from '@angular/material/button-toggle';
import { MatError, MatFormField, MatLabel, MatSuffix } from '@angular/material/form-field';
import { MatIcon } from '@angular/material/icon';
import { MatInput } from '@angular/material/input';
import { MatProgressBar } from '@angular/material/progress-bar';
import { MatRadioButton, MatRadioGroup } from '@angular/material/radio';
import type { CommentThread, PersonRef, ThreadAnchor, ThreadStatus } from '../../../shared/reviews';
import { apiErrorMessage, type ApiErrorMessage } from '../core/api-error-message';
import { remote } from '../core/remote';
import { ValidationMessagePipe } from '../core/validation-message-pipe';
import { CommentBox, type Mentionable } from './comment-box';
import { ReviewApi, type ReviewTarget } from './review-api';
import { centreAnchor, countOf, describeAnchor, typedPoint } from './review-text';

type Filter = ThreadStatus | 'all';

/**
 * Comment threads on one image or one figure: filter, read, reply with @mentions, resolve or reopen,
 * start a new one (on an image pinned to its centre or a typed point; on a figure to the whole or a panel).
 */
@Component({
  selector: 'ef-thread-list',
  imports: [
    CommentBox,
    DatePipe,
    MatButton,
    MatButtonToggle,
    MatButtonToggleGroup,
    MatError,
    MatFormField,
    MatIcon,
    MatInput,
    MatLabel,
    MatProgressBar,
    MatRadioButton,
    MatRadioGroup,
    MatSuffix,
    ReactiveFormsModule,
    ValidationMessagePipe,
  ],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './thread-list.html',
  styleUrl: './thread-list.scss',
})
export class ThreadList {
  private readonly api = inject(ReviewApi);
  private readonly document = inject(DOCUMENT);

  readonly projectId = input.required<string>();
  /** Give one of imageId and figureId. */
  readonly imageId = input<string | null>(null);
  readonly figureId = input<string | null>(null);
  readonly imageWidth = input(0);
  readonly imageHeight = input(0);
  /** A figure's panel letters in panel order, to pin a thread to one panel and to name it. */
  readonly panelLetters = input<readonly string[]>([]);
  readonly members = input<readonly Mentionable[]>([]);
  readonly canComment = input(false);
  /** The typed-point "New thread" form; off where threads are pinned by clicking (the viewer). */
  readonly offerNewThread = input(true);
  /** A thread to bring into view once loaded (from a notification link, ?thread=…). */
  readonly focusThread = input<string | null>(null);
  /** A thread was opened, resolved or reopened: the open count of the review changed. */
  readonly changed = output<void>();

  private readonly newBox = viewChild<CommentBox>('newBox');

  /** Open threads first; all of them when a link points at one, which may be resolved by now. */
  protected readonly filter = linkedSignal<Filter>(() => (this.focusThread() ? 'all' : 'open'));
  private readonly target = computed<ReviewTarget>(() => {
    const figureId = this.figureId();
    return figureId ? { type: 'figure', id: figureId } : { type: 'image', id: this.imageId() ?? '' };
  });
  protected readonly onFigure = computed(() => this.target().type === 'figure');
  protected readonly panelChoices = computed(() => this.panelLetters().map((_, index) => ({ index, label: describeAnchor({ kind: 'panel', panel: index }, true, this.panelLetters()) })));
  private readonly query = computed(() => ({ projectId: this.projectId(), target: this.target(), status: this.filter() }));
  protected readonly threads = remote(this.query, ({ projectId, target, status }) => this.api.threads(projectId, target, status));
  protected readonly rows = computed(() =>
    (this.threads.value() ?? []).map((t) => ({
      thread: t,
      anchorText: describeAnchor(t.anchor, t.anchorPresent, this.panelLetters()),
      opening: t.comments[0] ?? null,
      replies: t.comments.slice(1),
      replyCount: countOf(t.comments.length - 1, 'reply', 'replies'),
    })),
  );
  protected readonly emptyText = computed(() => {
    switch (this.filter()) {
      case 'open':
        return `No open threads on this ${this.target().type}.`;
      case 'resolved':
        return 'No resolved threads yet.';
      default:
        return `Nobody has commented on this ${this.target().type} yet.`;
    }
  });

  protected readonly composing = signal(false);
  protected readonly anchorForm = new FormGroup({
    pin: new FormControl<'centre' | 'point' | 'figure' | 'panel'>('centre', { nonNullable: true }),
    panel: new FormControl<number>(0, { nonNullable: true }),
    x: new FormControl<number | null>(null),
    y: new FormControl<number | null>(null),
  });
  protected readonly busyThread = signal<string | null>(null);
  protected readonly threadErrors = signal<Record<string, string>>({});
  protected readonly newError = signal('');

  private scrolledTo: string | null = null;
  private readonly bringFocusedIntoView = effect(() => {
    const id = this.focusThread();
    if (!id || id === this.scrolledTo || !this.rows().some((r) => r.thread.id === id)) return;
    this.scrolledTo = id;
    // After this render, when the thread's element exists.
    setTimeout(() => {
      const el = this.document.getElementById(`thread-${id}`);
      el?.scrollIntoView({ block: 'center' });
      el?.focus({ preventScroll: true });
    });
  });

  protected mentionNames(people: readonly PersonRef[]): string {
    return people.map((p) => p.name).join(', ');
  }

  protected setFilter(value: Filter): void {
    this.filter.set(value);
  }

  protected startThread(): void {
    if (!this.composing()) this.anchorForm.controls.pin.setValue(this.onFigure() ? 'figure' : 'centre');
    this.composing.set(true);
    this.newError.set('');
  }

  protected cancelThread(): void {
    this.composing.set(false);
    this.newBox()?.clear();
    this.anchorForm.reset();
  }

  protected sendThread(): void {
    const box = this.newBox();
    const anchor = this.chosenAnchor();
    const draft = box?.draft() ?? null;
    if (!box || !draft || !anchor || this.busyThread()) return;
    this.busyThread.set('new');
    this.newError.set('');
    this.api.openThread(this.projectId(), this.target(), { anchor, ...draft }).subscribe({
      next: () => {
        this.busyThread.set(null);
        this.cancelThread();
        if (this.filter() === 'resolved') this.filter.set('open');
        else this.threads.reload();
        this.changed.emit();
      },
      error: (error) => {
        this.busyThread.set(null);
        this.newError.set(this.placeErrors(apiErrorMessage(error), box));
      },
    });
  }

  protected sendReply(thread: CommentThread, box: CommentBox): void {
    const draft = box.draft();
    if (!draft || this.busyThread()) return;
    this.busyThread.set(thread.id);
    this.setThreadError(thread.id, '');
    this.api.reply(this.projectId(), this.target(), thread.id, draft).subscribe({
      next: (saved) => {
        this.busyThread.set(null);
        box.clear();
        this.replaceThread(saved);
      },
      error: (error) => {
        this.busyThread.set(null);
        this.setThreadError(thread.id, this.placeErrors(apiErrorMessage(error), box));
      },
    });
  }

  protected setThreadStatus(thread: CommentThread, to: ThreadStatus): void {
    if (this.busyThread()) return;
    this.busyThread.set(thread.id);
    this.setThreadError(thread.id, '');
    const call = to === 'resolved' ? this.api.resolve : this.api.reopenThread;
    call.call(this.api, this.projectId(), this.target(), thread.id).subscribe({
      next: () => {
        this.busyThread.set(null);
        // It leaves the filtered list (open ↔ resolved), so load the list again.
        this.threads.reload();
        this.changed.emit();
      },
      error: (error) => {
        this.busyThread.set(null);
        this.setThreadError(thread.id, apiErrorMessage(error).message);
      },
    });
  }

  /** The anchor from the form, or null with the problem shown beside the coordinates. */
  private chosenAnchor(): ThreadAnchor | null {
    const { pin, x, y, panel } = this.anchorForm.getRawValue();
    if (pin === 'figure') return { kind: 'figure' };
    if (pin === 'panel') return { kind: 'panel', panel };
    if (pin === 'centre') return centreAnchor(this.imageWidth(), this.imageHeight());
    const result = typedPoint(x, y, this.imageWidth(), this.imageHeight());
    if ('kind' in result) return result;
    const c = this.anchorForm.controls;
    for (const [control, problem] of [[c.x, result.x], [c.y, result.y]] as const) {
      if (problem) {
        control.setErrors({ server: problem });
        control.markAsTouched();
      }
    }
    return null;
  }

  /** Body problems go under the comment, anchor problems beside the coordinates; the rest is returned. */
  private placeErrors(failure: ApiErrorMessage, box: CommentBox): string {
    const unplaced: string[] = [];
    for (const [key, message] of Object.entries(failure.fieldErrors)) {
      if (key === 'body' || key === 'mentions') {
        box.showError(message);
      } else if (key === 'anchor' || key === 'at' || key === 'kind' || key === 'panel') {
        this.anchorForm.controls.x.setErrors({ server: message });
        this.anchorForm.controls.x.markAsTouched();
      } else {
        unplaced.push(message);
      }
    }
    const placedAll = Object.keys(failure.fieldErrors).length > 0 && unplaced.length === 0;
    return placedAll ? '' : [failure.message, ...unplaced].join(' ');
  }

  private replaceThread(saved: CommentThread): void {
    const list = this.threads.value();
    if (list) this.threads.set(list.map((t) => (t.id === saved.id ? saved : t)));
  }

  private setThreadError(id: string, message: string): void {
    this.threadErrors.update((all) => ({ ...all, [id]: message }));
  }
}
