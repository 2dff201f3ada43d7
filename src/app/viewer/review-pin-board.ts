import { computed, inject, Injectable, signal } from '@angular/core';
import { Observable, of, tap } from 'rxjs';
import type { CommentThread } from '../../../shared/reviews';
import { remote } from '../core/remote';
import type { CommentDraft } from '../reviews/comment-box';
import { ReviewApi } from '../reviews/review-api';
import type { Point } from '../../../shared/annotations/geometry';
import { pinsFromThreads, pinUnder, type PinAnchor } from './review-pins';

/**
 * The comment threads of the image in the viewer, as pins: loaded once the image is known, the
 * one in focus (from a notification link or a click), and new threads pinned on the canvas.
 * One per viewer page.
 */
@Injectable()
export class ReviewPinBoard {
  private readonly api = inject(ReviewApi);
  private readonly subject = signal<{ projectId: string; imageId: string } | null>(null);

  readonly threads = remote(this.subject, (s) => (s ? this.api.threads(s.projectId, s.imageId, 'all') : of<CommentThread[]>([])));
  readonly pins = computed(() => pinsFromThreads(this.threads.value() ?? []));
  readonly openCount = computed(() => this.pins().filter((p) => p.open).length);
  /** The thread shown in the side list and ringed on the canvas. */
  readonly focused = signal<string | null>(null);
  /** Bumped when the side list's own copy of the threads must load again. */
  readonly listVersion = signal(0);
  /** A pin just drawn, waiting for the first comment of its thread. */
  readonly draft = signal<PinAnchor | null>(null);
  /** The side panel's tab title, with the open threads counted. */
  readonly tabLabel = computed(() => (this.openCount() > 0 ? `Comments (${this.openCount()})` : 'Comments'));

  show(projectId: string, imageId: string): void {
    const current = this.subject();
    if (current?.projectId !== projectId || current.imageId !== imageId) this.subject.set({ projectId, imageId });
  }

  /** Focuses the pin under `p` (`unit`: image px per screen px); false when there is none. */
  focusAt(p: Point, unit: number): boolean {
    const id = pinUnder(this.pins(), p, unit);
    if (id) this.focused.set(id);
    return id !== null;
  }

  /** Threads changed in the side list (resolved, reopened, replied): reload the pins. */
  changed(): void {
    this.threads.reload();
  }

  /** A new thread at a drawn pin; focused once the server has it. */
  start(anchor: PinAnchor, draft: CommentDraft): Observable<CommentThread> {
    const s = this.subject();
    if (!s) throw new Error('No image to pin on yet.');
    return this.api.openThread(s.projectId, s.imageId, { anchor, ...draft }).pipe(
      tap((thread) => {
        this.focused.set(thread.id);
        this.threads.reload();
        this.listVersion.update((n) => n + 1);
      }),
    );
  }
}
