import type { ShapeState } from './command-stack';

/**
 * Changes waiting to reach the server. At most one entry per shape: a later change folds into
 * the earlier one, so a shape drawn, moved and deleted while offline costs no request at all.
 * The queue survives a reload (localStorage, keyed by image) and is sent in order. Pure.
 */

export type PendingOp = 'create' | 'update' | 'delete';

export interface PendingChange {
  /** The shape's client key. */
  key: string;
  op: PendingOp;
  /** Server id and version when known; null while its creation has not been answered. */
  id: string | null;
  version: number | null;
  /** The shape to store (create, update); null for delete. */
  shape: ShapeState | null;
  /** Failed sends so far, for the back-off. */
  attempts: number;
}

export type NewChange = Omit<PendingChange, 'attempts'>;

/** The queue with `change` folded in. */
export function enqueue(queue: readonly PendingChange[], change: NewChange): PendingChange[] {
  const i = queue.findIndex((c) => c.key === change.key);
  if (i < 0) return [...queue, { ...change, attempts: 0 }];
  const earlier = queue[i]!;
  const merged = fold(earlier, change);
  const rest = queue.filter((_, j) => j !== i);
  if (!merged) return rest;
  const next = [...rest];
  next.splice(i, 0, merged);
  return next;
}

function fold(earlier: PendingChange, later: NewChange): PendingChange | null {
  const id = earlier.id ?? later.id;
  const version = earlier.version ?? later.version;
  switch (earlier.op) {
    case 'create':
      // Never stored: a deletion cancels it, an edit changes what will be created.
      if (later.op === 'delete') return id ? { ...earlier, op: 'delete', id, version, shape: null } : null;
      return { ...earlier, shape: later.shape };
    case 'update':
      if (later.op === 'delete') return { ...earlier, op: 'delete', shape: null, id, version };
      return { ...earlier, shape: later.shape, id, version };
    case 'delete':
      // Undone before it was sent: the stored row still exists, so it only needs its old state back.
      if (later.op === 'create' || later.op === 'update') return { ...earlier, op: id ? 'update' : 'create', shape: later.shape, id, version };
      return earlier;
  }
}

/** Fills in the server id and version of a shape once its creation or last change was answered. */
export function resolveIds(queue: readonly PendingChange[], key: string, id: string, version: number): PendingChange[] {
  return queue.map((c) => (c.key === key ? { ...c, id, version } : c));
}

/** The shape's own entry, if it has one. */
export function pendingFor(queue: readonly PendingChange[], key: string): PendingChange | undefined {
  return queue.find((c) => c.key === key);
}

/** Wait before the next try: 1 s, 2 s, 4 s … capped at a minute, spread ±25 % so clients do not retry in step. */
export function retryDelayMs(attempt: number, random = 0.5): number {
  const base = Math.min(60_000, 1000 * 2 ** Math.max(0, attempt - 1));
  return Math.round(base * (0.75 + 0.5 * random));
}

/** Whether a failed request may succeed later unchanged (network, server busy or down), as opposed to a refusal. */
export function isRetryable(status: number): boolean {
  return status === 0 || status === 408 || status === 429 || status >= 500;
}

/** What the saved queue holds; anything else in storage is ignored. */
export function parseStoredQueue(text: string | null): PendingChange[] {
  if (!text) return [];
  try {
    const parsed: unknown = JSON.parse(text);
    if (!Array.isArray(parsed)) return [];
    return parsed.filter(isPendingChange);
  } catch {
    // Storage written by an older or broken page: start empty rather than fail to open the image.
    return [];
  }
}

function isPendingChange(v: unknown): v is PendingChange {
  const c = v as Partial<PendingChange> | null;
  return (
    !!c &&
    typeof c.key === 'string' &&
    (c.op === 'create' || c.op === 'update' || c.op === 'delete') &&
    (c.id === null || typeof c.id === 'string') &&
    (c.version === null || typeof c.version === 'number') &&
    (c.op === 'delete' || (typeof c.shape === 'object' && c.shape !== null && Array.isArray(c.shape.points))) &&
    typeof c.attempts === 'number'
  );
}

export function storageKey(imageId: string): string {
  return `etchfile.viewer.pending.${imageId}`;
}
