import type { Annotation } from '../../../shared/annotations/annotations';
import { enqueue, isRetryable, resolveIds, retryDelayMs, type NewChange, type PendingChange } from './save-queue';

/** Why a request failed: HTTP status (0 without an answer) and the server's sentence. */
export interface SendFailure {
  status: number;
  message: string;
}

/** Where the runner sends changes and whom it tells. */
export interface SaveTarget {
  /** Sends one change; resolves with the stored annotation (null after a delete), rejects with a SendFailure. */
  send(change: PendingChange): Promise<Annotation | null>;
  /** The server took the change. */
  saved(change: PendingChange, stored: Annotation | null): void;
  /** The server refused the change for good (conflict, invalid, forbidden); it is dropped. */
  refused(change: PendingChange, failure: SendFailure): void;
  /** What is still to send, to keep across a reload. */
  persist(queue: PendingChange[]): void;
  /** Counts for the status line. */
  status(s: SaveStatus): void;
}

export interface SaveStatus {
  /** Changes not yet saved (queued or in flight). */
  waiting: number;
  /** The last try failed for want of a server; it will be tried again. */
  retrying: boolean;
  /** When the next try starts (ms since the epoch), while retrying. */
  nextTryAt: number | null;
}

export interface Clock {
  now(): number;
  setTimeout(fn: () => void, ms: number): unknown;
  clearTimeout(handle: unknown): void;
  random(): number;
}

const realClock: Clock = {
  now: () => Date.now(),
  setTimeout: (fn, ms) => setTimeout(fn, ms),
  clearTimeout: (h) => clearTimeout(h as ReturnType<typeof setTimeout>),
  random: () => Math.random(),
};

/**
 * Sends queued changes one at a time, in order. A change that fails for want of a server stays
 * at the head and is tried again after a growing wait; a refusal drops it (and anything queued
 * after it for the same shape) and says why. No Angular: the store gives it a target.
 */
export class SaveRunner {
  private queue: PendingChange[];
  private inFlight: PendingChange | null = null;
  private timer: unknown = null;
  private nextTryAt: number | null = null;
  private stopped = false;

  constructor(
    private readonly target: SaveTarget,
    restored: PendingChange[] = [],
    private readonly clock: Clock = realClock,
  ) {
    this.queue = restored;
    this.report();
    this.pump();
  }

  get waiting(): number {
    return this.queue.length + (this.inFlight ? 1 : 0);
  }

  add(change: NewChange): void {
    this.queue = enqueue(this.queue, change);
    this.target.persist(this.snapshot());
    this.report();
    if (this.nextTryAt === null) this.pump();
  }

  /** Tries now instead of waiting out the back-off (the browser is online again, or a person asked). */
  retryNow(): void {
    if (this.timer !== null) this.clock.clearTimeout(this.timer);
    this.timer = null;
    this.nextTryAt = null;
    this.pump();
  }

  /** Whether a change to the shape is still queued or on its way. */
  isPending(key: string): boolean {
    return this.inFlight?.key === key || this.queue.some((c) => c.key === key);
  }

  stop(): void {
    this.stopped = true;
    if (this.timer !== null) this.clock.clearTimeout(this.timer);
  }

  private pump(): void {
    if (this.stopped || this.inFlight || this.queue.length === 0) return;
    const change = this.queue[0]!;
    this.queue = this.queue.slice(1);
    this.inFlight = change;
    this.target.send(change).then(
      (stored) => this.succeeded(change, stored),
      (failure: SendFailure) => this.failed(change, failure),
    );
  }

  private succeeded(change: PendingChange, stored: Annotation | null): void {
    this.inFlight = null;
    this.nextTryAt = null;
    if (stored) this.queue = resolveIds(this.queue, change.key, stored.id, stored.version);
    this.target.persist(this.snapshot());
    this.target.saved(change, stored);
    this.report();
    this.pump();
  }

  private failed(change: PendingChange, failure: SendFailure): void {
    this.inFlight = null;
    if (this.stopped) return;
    if (isRetryable(failure.status)) {
      const again = { ...change, attempts: change.attempts + 1 };
      this.queue = [again, ...this.queue];
      const wait = retryDelayMs(again.attempts, this.clock.random());
      this.nextTryAt = this.clock.now() + wait;
      this.timer = this.clock.setTimeout(() => this.retryNow(), wait);
      this.target.persist(this.snapshot());
      this.report();
      return;
    }
    this.queue = this.queue.filter((c) => c.key !== change.key);
    this.target.persist(this.snapshot());
    this.target.refused(change, failure);
    this.report();
    this.pump();
  }

  /** In-flight first, so a reload mid-request sends it again rather than losing it. */
  private snapshot(): PendingChange[] {
    return this.inFlight ? [this.inFlight, ...this.queue] : [...this.queue];
  }

  private report(): void {
    this.target.status({ waiting: this.waiting, retrying: this.nextTryAt !== null, nextTryAt: this.nextTryAt });
  }
}
