import { HttpEventType } from '@angular/common/http';
import { computed, DestroyRef, inject, Injectable, signal } from '@angular/core';
import type { Subscription } from 'rxjs';
import type { UploadResult } from '../../../shared/images';
import { ImageApi } from './image-api';
import { fileProgress, NO_OVERRIDES, overallProgress, uploadFailure, uploadFields, uploadSummary, type BatchFields, type FileOverrides, type UploadState } from './upload-plan';

/** One file of the batch and where it stands. */
export interface UploadItem {
  id: number;
  file: File;
  /** Bytes, for the progress bars. */
  size: number;
  overrides: FileOverrides;
  state: UploadState;
  loaded: number;
  /** The refusal, or the server's notices (pages left out, no pixel size) once stored. */
  message: string;
  result: UploadResult | null;
}

/** Files sent at once: two keep the line busy without starving the server's other users. */
const PARALLEL = 2;

/**
 * The files of one upload dialog: added, given per-file choices, sent one
 * request each (two at a time) with progress, cancelled one by one. A failed
 * or duplicate file gets its message and the others carry on. Provided by the
 * dialog, so it ends with it.
 */
@Injectable()
export class UploadQueue {
  private readonly api = inject(ImageApi);

  private readonly list = signal<UploadItem[]>([]);
  private readonly running = new Map<number, Subscription>();
  private nextId = 1;
  private target: { projectId: string; batch: BatchFields } | null = null;

  readonly items = this.list.asReadonly();
  readonly progress = computed(() => overallProgress(this.list()));
  readonly summary = computed(() => uploadSummary(this.list()));
  readonly busy = computed(() => this.list().some((i) => i.state === 'queued' || i.state === 'uploading'));
  readonly pending = computed(() => this.list().filter((i) => i.state === 'waiting').length);
  readonly storedCount = computed(() => this.list().filter((i) => i.state === 'done').length);

  constructor() {
    // Closing the dialog mid-upload aborts the requests still running.
    inject(DestroyRef).onDestroy(() => this.running.forEach((s) => s.unsubscribe()));
  }

  add(files: FileList | readonly File[]): void {
    const added = Array.from(files, (file): UploadItem => ({ id: this.nextId++, file, size: file.size, overrides: NO_OVERRIDES, state: 'waiting', loaded: 0, message: '', result: null }));
    this.list.update((items) => [...items, ...added]);
  }

  /** Takes a file off the list before it was sent. */
  remove(id: number): void {
    this.list.update((items) => items.filter((i) => i.id !== id || i.state === 'uploading'));
  }

  override(id: number, change: Partial<FileOverrides>): void {
    this.patch(id, (i) => ({ overrides: { ...i.overrides, ...change } }));
  }

  /** Sends every waiting file with the batch's fields (and its own overrides). */
  start(projectId: string, batch: BatchFields): void {
    this.target = { projectId, batch };
    this.list.update((items) => items.map((i) => (i.state === 'waiting' ? { ...i, state: 'queued', message: '' } : i)));
    this.pump();
  }

  /** Stops one file: aborts its request if running, or keeps it from starting. */
  cancel(id: number): void {
    this.running.get(id)?.unsubscribe();
    this.running.delete(id);
    this.patch(id, (i) => (i.state === 'queued' || i.state === 'uploading' ? { state: 'cancelled', loaded: 0, message: 'Cancelled; nothing was stored.' } : {}));
    this.pump();
  }

  /** Puts refused or cancelled files back in the list to send again (e.g. after choosing another modality). */
  again(id: number): void {
    this.patch(id, (i) => (i.state === 'failed' || i.state === 'cancelled' ? { state: 'waiting', loaded: 0, message: '' } : {}));
  }

  percent(item: UploadItem): number {
    return fileProgress(item);
  }

  private pump(): void {
    const target = this.target;
    if (!target) return;
    while (this.running.size < PARALLEL) {
      const next = this.list().find((i) => i.state === 'queued');
      if (!next) return;
      this.send(next, target.projectId, target.batch);
    }
  }

  private send(item: UploadItem, projectId: string, batch: BatchFields): void {
    this.patch(item.id, () => ({ state: 'uploading', loaded: 0 }));
    const subscription = this.api.upload(projectId, item.file, uploadFields(batch, item.overrides)).subscribe({
      next: (event) => {
        if (event.type === HttpEventType.UploadProgress) this.patch(item.id, () => ({ loaded: event.loaded }));
        if (event.type === HttpEventType.Response && event.body) {
          const result = event.body;
          this.patch(item.id, () => ({ state: 'done', loaded: item.file.size, result, message: result.notices.join(' ') }));
        }
      },
      error: (error: { status: number; error: unknown }) => {
        const { state, message } = uploadFailure(error);
        this.patch(item.id, () => ({ state, message }));
        this.finish(item.id);
      },
      complete: () => this.finish(item.id),
    });
    // A synchronous failure may already have finished it.
    if (this.list().find((i) => i.id === item.id)?.state === 'uploading') this.running.set(item.id, subscription);
  }

  private finish(id: number): void {
    this.running.delete(id);
    this.pump();
  }

  private patch(id: number, change: (item: UploadItem) => Partial<UploadItem>): void {
    this.list.update((items) => items.map((i) => (i.id === id ? { ...i, ...change(i) } : i)));
  }
}
