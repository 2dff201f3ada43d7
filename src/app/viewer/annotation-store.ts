import { HttpErrorResponse } from '@angular/common/http';
import { computed, inject, Injectable, OnDestroy, signal } from '@angular/core';
import { firstValueFrom } from 'rxjs';
import type { Annotation } from '../../../shared/annotations/annotations';
import { apiErrorMessage } from '../core/api-error-message';
import { CommandStack, invert, type ShapeCommand, type ShapeState } from './command-stack';
import { SaveRunner, type SaveStatus, type SendFailure } from './save-runner';
import { parseStoredQueue, storageKey, type PendingChange } from './save-queue';
import { fromAnnotation, localShape, overlayPending, stateOf, withState, type ViewShape } from './view-shapes';
import { ViewerApi } from './viewer-api';

let localCounter = 0;
/** A key for a shape the server has not named yet (randomUUID needs a secure context; this does not). */
function newLocalKey(): string {
  localCounter += 1;
  return `local-${Date.now().toString(36)}-${localCounter}-${Math.random().toString(36).slice(2, 8)}`;
}

/**
 * The shapes of the image on screen: loaded from the server, changed here at once, saved in the
 * background (a queue that survives going offline and reloading), with undo and redo.
 * Provided by the viewer page, so each opened image has its own.
 */
@Injectable()
export class AnnotationStore implements OnDestroy {
  private readonly api = inject(ViewerApi);

  private readonly list = signal<ViewShape[]>([]);
  private readonly history = new CommandStack<ShapeCommand>();
  private readonly historyVersion = signal(0);
  private runner: SaveRunner | null = null;
  private target: { projectId: string; imageId: string } | null = null;
  private me = { id: '', name: '' };
  /** Deleted shapes by key, so an undo brings back key and author. */
  private readonly deleted = new Map<string, ViewShape>();

  readonly shapes = this.list.asReadonly();
  readonly loading = signal(true);
  readonly loadError = signal<string | null>(null);
  readonly saveStatus = signal<SaveStatus>({ waiting: 0, retrying: false, nextTryAt: null });
  /** The last thing the server refused or changed under us, for the status line. */
  readonly notice = signal('');
  readonly canUndo = computed(() => (this.historyVersion(), this.history.canUndo));
  readonly canRedo = computed(() => (this.historyVersion(), this.history.canRedo));
  readonly byKey = computed(() => new Map(this.list().map((s) => [s.key, s])));

  private readonly online = () => this.runner?.retryNow();

  /** Loads the image's shapes, lays unsaved local changes over them and starts sending those. */
  async open(projectId: string, imageId: string, me: { id: string; name: string }): Promise<void> {
    // Opening the same image again would start a second sender over the same queue.
    if (this.target?.projectId === projectId && this.target.imageId === imageId) return;
    this.runner?.stop();
    this.history.clear();
    this.target = { projectId, imageId };
    this.me = me;
    this.loading.set(true);
    this.loadError.set(null);
    const restored = parseStoredQueue(localStorage.getItem(storageKey(imageId)));
    try {
      const annotations = await firstValueFrom(this.api.annotations(projectId, imageId));
      this.list.set(overlayPending(annotations, restored, me, new Date().toISOString()));
    } catch (err) {
      // Shown in place of the list; the viewer still shows the image.
      this.loadError.set(failureOf(err).message);
    } finally {
      this.loading.set(false);
    }
    this.runner = new SaveRunner(
      {
        send: (c) => this.send(c),
        saved: (c, stored) => this.saved(c, stored),
        refused: (c, f) => void this.refused(c, f),
        persist: (q) => this.persist(imageId, q),
        status: (s) => this.saveStatus.set(s),
      },
      restored,
    );
    window.removeEventListener('online', this.online);
    window.addEventListener('online', this.online);
  }

  ngOnDestroy(): void {
    this.runner?.stop();
    window.removeEventListener('online', this.online);
  }

  /** A shape just drawn: shown at once, saved in the background. Returns its key. */
  add(state: ShapeState): string {
    const key = newLocalKey();
    this.execute({ type: 'create', key, shape: state });
    return key;
  }

  update(key: string, after: ShapeState): void {
    const current = this.byKey().get(key);
    if (!current) return;
    this.execute({ type: 'update', key, before: stateOf(current), after });
  }

  remove(key: string): void {
    const current = this.byKey().get(key);
    if (current) this.execute({ type: 'delete', key, shape: stateOf(current) });
  }

  /** Takes back the last change; returns the key it touched. */
  undo(): string | null {
    const c = this.history.undo();
    if (c) this.apply(invert(c));
    this.historyVersion.update((n) => n + 1);
    return c?.key ?? null;
  }

  redo(): string | null {
    const c = this.history.redo();
    if (c) this.apply(c);
    this.historyVersion.update((n) => n + 1);
    return c?.key ?? null;
  }

  retryNow(): void {
    this.runner?.retryNow();
  }

  /** Reloads everything from the server (after an import). Unsaved local changes stay on top. */
  async reloadAll(): Promise<void> {
    if (!this.target) return;
    const annotations = await firstValueFrom(this.api.annotations(this.target.projectId, this.target.imageId));
    const queue = parseStoredQueue(localStorage.getItem(storageKey(this.target.imageId)));
    this.list.set(overlayPending(annotations, queue, this.me, new Date().toISOString()));
  }

  private execute(c: ShapeCommand): void {
    this.history.push(c);
    this.historyVersion.update((n) => n + 1);
    this.apply(c);
  }

  /** Shows the change at once and queues it for the server. */
  private apply(c: ShapeCommand): void {
    const current = this.byKey().get(c.key);
    if (c.type === 'create') {
      // Undoing a deletion brings the shape back under its old key, with its old author.
      const before = current ?? this.deleted.get(c.key);
      const shape = before ? withState(before, c.shape, true) : localShape(c.key, c.shape, this.me, new Date().toISOString());
      this.list.update((l) => (current ? l.map((s) => (s.key === c.key ? shape : s)) : [...l, shape]));
      this.runner?.add({ key: c.key, op: 'create', id: null, version: null, shape: c.shape });
      return;
    }
    if (!current) return;
    if (c.type === 'delete') {
      this.list.update((l) => l.filter((s) => s.key !== c.key));
      this.deleted.set(c.key, current);
      this.runner?.add({ key: c.key, op: 'delete', id: current.id, version: current.version, shape: null });
      return;
    }
    this.list.update((l) => l.map((s) => (s.key === c.key ? withState(s, c.after, true) : s)));
    this.runner?.add({ key: c.key, op: 'update', id: current.id, version: current.version, shape: c.after });
  }

  private async send(c: PendingChange): Promise<Annotation | null> {
    const { projectId, imageId } = this.target!;
    try {
      if (c.op === 'create') return await firstValueFrom(this.api.createAnnotation(projectId, imageId, c.shape!));
      if (!c.id || c.version === null) throw { status: 409, message: 'This shape was never saved; it was drawn again.' } satisfies SendFailure;
      if (c.op === 'update') return await firstValueFrom(this.api.updateAnnotation(projectId, imageId, c.id, { version: c.version, ...c.shape! }));
      await firstValueFrom(this.api.deleteAnnotation(projectId, imageId, c.id, c.version));
      return null;
    } catch (err) {
      const failure = failureOf(err);
      // Already gone is what a deletion wanted.
      if (c.op === 'delete' && failure.status === 404) return null;
      throw failure;
    }
  }

  private saved(c: PendingChange, stored: Annotation | null): void {
    if (!stored) {
      // The row is gone on the server: an undo must create it anew.
      const gone = this.deleted.get(c.key);
      if (gone) this.deleted.set(c.key, { ...gone, id: null, version: null });
      return;
    }
    const waiting = this.runner?.isPending(c.key) ?? false;
    this.list.update((l) =>
      l.map((s) => (s.key === c.key ? { ...s, id: stored.id, version: stored.version, authorId: stored.authorId, authorName: stored.authorName, updatedAt: stored.updatedAt, pending: waiting } : s)),
    );
  }

  /** A refusal: say why, and show the server's version of the shape again (or drop one it never took). */
  private async refused(c: PendingChange, failure: SendFailure): Promise<void> {
    this.notice.set(failure.status === 409 ? `${failure.message}` : `Not saved: ${failure.message}`);
    this.history.dropWhere((h) => h.key === c.key);
    this.historyVersion.update((n) => n + 1);
    if (!this.target) return;
    if (c.op === 'create') {
      this.list.update((l) => l.filter((s) => s.key !== c.key));
      return;
    }
    await this.reloadShape(c.key, c.id);
  }

  /** Replaces one shape with the server's current version (gone if it was deleted there). */
  private async reloadShape(key: string, id: string | null): Promise<void> {
    const { projectId, imageId } = this.target!;
    let fresh: Annotation[];
    try {
      fresh = await firstValueFrom(this.api.annotations(projectId, imageId));
    } catch {
      // Cannot reach the server now: keep what is shown; the notice already says it was not saved.
      return;
    }
    const server = fresh.find((a) => a.id === id);
    this.list.update((l) => {
      const without = l.filter((s) => s.key !== key);
      if (!server) return without;
      const i = l.findIndex((s) => s.key === key);
      const next = [...without];
      next.splice(i < 0 ? next.length : i, 0, fromAnnotation(server, key));
      return next;
    });
  }

  private persist(imageId: string, queue: PendingChange[]): void {
    try {
      if (queue.length === 0) localStorage.removeItem(storageKey(imageId));
      else localStorage.setItem(storageKey(imageId), JSON.stringify(queue));
    } catch {
      // Storage full or blocked (private mode): the queue still lives in memory for this visit.
    }
  }
}

/** Any failed request as status and sentence. */
export function failureOf(err: unknown): SendFailure {
  if (err instanceof HttpErrorResponse) {
    const m = apiErrorMessage(err);
    return { status: m.status, message: m.message };
  }
  if (typeof err === 'object' && err !== null && 'status' in err && 'message' in err) return err as SendFailure;
  return { status: 0, message: 'The server cannot be reached.' };
}
