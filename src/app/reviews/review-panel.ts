import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, input, output, signal } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButton } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatError, MatFormField, MatHint, MatLabel } from '@angular/material/form-field';
import { MatIcon } from '@angular/material/icon';
import { MatInput } from '@angular/material/input';
import { MatProgressBar } from '@angular/material/progress-bar';
import { of } from 'rxjs';
import type { FigureClearance, ReviewSnapshot, ReviewStatus, ReviewTransition } from '../../../shared/reviews';
import { apiErrorMessage } from '../core/api-error-message';
import { askToConfirm } from '../core/confirm-dialog';
import { remote } from '../core/remote';
import { applyServerErrors } from '../core/server-errors';
import { ValidationMessagePipe } from '../core/validation-message-pipe';
import { formatPixelSizeXY } from '../archive/image-display';
import { ReviewApi, type ReviewTarget } from './review-api';
import { clearedFileLine, clearingBlocker, countOf, historyLine, moveLabel, reviewStateHint, reviewStateLabel, snapshotCounts } from './review-text';

const NOTE_MAX = 2000;

/**
 * The review of an image or a figure: where it stands, the moves the caller may make, its history and
 * what was cleared (an image's snapshots; a figure's kept export files, to download).
 */
@Component({
  selector: 'ef-review-panel',
  imports: [DatePipe, MatButton, MatError, MatFormField, MatHint, MatIcon, MatInput, MatLabel, MatProgressBar, ReactiveFormsModule, ValidationMessagePipe],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './review-panel.html',
  styleUrl: './review-panel.scss',
})
export class ReviewPanel {
  private readonly api = inject(ReviewApi);
  private readonly dialog = inject(MatDialog);

  readonly projectId = input.required<string>();
  /** Give one of imageId and figureId. */
  readonly imageId = input<string | null>(null);
  readonly figureId = input<string | null>(null);
  /** Why no move may be made now (e.g. unsaved edits of a figure), shown instead of the buttons; '' for none. */
  readonly holdMoves = input('');
  /** A move was made and the state changed. */
  readonly stateChanged = output<ReviewStatus>();

  private readonly target = computed<ReviewTarget>(() => {
    const figureId = this.figureId();
    return figureId ? { type: 'figure', id: figureId } : { type: 'image', id: this.imageId() ?? '' };
  });
  private readonly ids = computed(() => ({ projectId: this.projectId(), target: this.target() }));
  protected readonly subject = computed(() => this.target().type);
  protected readonly status = remote(this.ids, ({ projectId, target }) => this.api.status(projectId, target));
  protected readonly snapshots = remote(this.ids, ({ projectId, target }) =>
    target.type === 'image' ? this.api.snapshots(projectId, target.id) : of<ReviewSnapshot[]>([]),
  );
  protected readonly clearances = remote(this.ids, ({ projectId, target }) =>
    target.type === 'figure' ? this.api.clearances(projectId, target.id) : of<FigureClearance[]>([]),
  );
  protected readonly form = new FormGroup({
    note: new FormControl('', { nonNullable: true, validators: [Validators.maxLength(NOTE_MAX)] }),
  });
  protected readonly noteMax = NOTE_MAX;
  protected readonly view = computed(() => {
    const s = this.status.value();
    if (!s) return null;
    return {
      state: s.state,
      label: reviewStateLabel(s.state),
      hint: reviewStateHint(s.state, this.subject()),
      submittedBy: s.submittedBy?.name ?? null,
      submittedAt: s.submittedAt,
      threadsText: countOf(s.openThreads, 'open thread'),
      moves: s.transitions.map((move) => ({ move, label: moveLabel(move) })),
      blocker: s.transitions.includes('clear') ? clearingBlocker(s.openThreads, this.subject()) : '',
      history: [...s.history].reverse().map((e) => ({ ...e, line: historyLine(e) })),
    };
  });
  protected readonly snapshotRows = computed(() =>
    (this.snapshots.value() ?? []).map((s) => ({
      id: s.id,
      clearedAt: s.clearedAt,
      clearedBy: s.clearedBy.name,
      pixelSize: s.pixelSize.xUm === null ? 'not calibrated' : formatPixelSizeXY(s.pixelSize.xUm, s.pixelSize.yUm),
      counts: snapshotCounts(s),
    })),
  );
  protected readonly clearanceRows = computed(() =>
    (this.clearances.value() ?? []).map((c) => ({
      id: c.id,
      clearedAt: c.clearedAt,
      clearedBy: c.clearedBy.name,
      version: c.figureVersion,
      files: c.files.map((f) => ({
        format: f.format,
        line: clearedFileLine(f),
        sha256: f.sha256,
        url: this.api.clearedFileUrl(this.projectId(), c.figureId, c.id, f.format),
      })),
    })),
  );
  protected readonly busy = signal(false);
  protected readonly moveError = signal('');
  protected readonly moved = signal('');

  /** Loads again, e.g. after a thread was resolved (the open count decides whether clearing can work). */
  refresh(): void {
    this.status.reload();
  }

  protected chooseMove(move: ReviewTransition): void {
    if (move !== 'reopen') {
      this.makeMove(move);
      return;
    }
    // Reopening withdraws a clearance others may rely on: ask first.
    askToConfirm(this.dialog, {
      title: `Reopen this ${this.subject()}?`,
      message: 'It goes back to draft and is no longer cleared for publication. The cleared version stays on record below.',
      confirmLabel: 'Reopen',
    }).subscribe((confirmed) => {
      if (confirmed) this.makeMove(move);
    });
  }

  private makeMove(move: ReviewTransition): void {
    if (this.busy() || this.form.invalid || this.holdMoves()) return;
    this.busy.set(true);
    this.moveError.set('');
    this.moved.set('');
    this.api.move(this.projectId(), this.target(), move, this.form.controls.note.value).subscribe({
      next: (next: ReviewStatus) => {
        this.status.set(next);
        if (move === 'clear') {
          this.snapshots.reload();
          this.clearances.reload();
        }
        this.stateChanged.emit(next);
        this.form.reset();
        this.moved.set(`Done: now ${reviewStateLabel(next.state).toLowerCase()}.`);
        this.busy.set(false);
      },
      error: (error) => {
        this.moveError.set(applyServerErrors(this.form, apiErrorMessage(error)));
        // The state may have moved under us (409): show where it stands now.
        if (error?.status === 409) this.status.reload();
        this.busy.set(false);
      },
    });
  }
}
