import { ChangeDetectionStrategy, Component, inject, input, output, signal, viewChild } from '@angular/core';
import { MatButton } from '@angular/material/button';
import { apiErrorMessage } from '../core/api-error-message';
import { CommentBox, type Mentionable } from '../reviews/comment-box';
import { describeAnchor } from '../reviews/review-text';
import { ReviewPinBoard } from './review-pin-board';
import type { PinAnchor } from './review-pins';

/** Beside a freshly drawn pin: the first comment of its thread, with @mentions; Start thread or Cancel. */
@Component({
  selector: 'ef-pin-card',
  imports: [CommentBox, MatButton],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <section class="card" role="region" aria-label="New comment thread">
      <h2>Comment on the {{ anchorText() }}</h2>
      <ef-comment-box #box label="First comment" [members]="members()" />
      @if (error()) {
        <p class="form-error" role="alert">{{ error() }}</p>
      }
      <div class="actions">
        <button mat-button type="button" (click)="cancelled.emit()">Cancel</button>
        <button mat-flat-button type="button" [disabled]="busy()" (click)="send()">Start thread</button>
      </div>
    </section>
  `,
  styles: `
    .card {
      width: 340px;
      padding: 12px 16px;
      border-radius: 12px;
      background: var(--mat-sys-surface-container-high);
      box-shadow: var(--mat-sys-level3);
    }
    h2 {
      margin: 0 0 8px;
      font: var(--mat-sys-title-small);
    }
    .actions {
      display: flex;
      justify-content: flex-end;
      gap: 8px;
      margin-top: 8px;
    }
    .form-error {
      color: var(--mat-sys-error);
      font: var(--mat-sys-body-small);
    }
  `,
})
export class PinCard {
  private readonly board = inject(ReviewPinBoard);

  readonly anchor = input.required<PinAnchor>();
  readonly members = input<readonly Mentionable[]>([]);
  readonly started = output<string>();
  readonly cancelled = output<void>();

  private readonly box = viewChild.required<CommentBox>('box');
  protected readonly busy = signal(false);
  protected readonly error = signal('');

  protected anchorText(): string {
    return describeAnchor(this.anchor());
  }

  protected send(): void {
    const draft = this.box().draft();
    if (!draft || this.busy()) return;
    this.busy.set(true);
    this.error.set('');
    this.board.start(this.anchor(), draft).subscribe({
      next: (thread) => {
        this.busy.set(false);
        this.started.emit(thread.id);
      },
      error: (e) => {
        this.busy.set(false);
        const failure = apiErrorMessage(e);
        const bodyProblem = failure.fieldErrors['body'] ?? failure.fieldErrors['mentions'];
        if (bodyProblem) this.box().showError(bodyProblem);
        else this.error.set(failure.message);
      },
    });
  }
}
