import type { AnnotationKind, Coordinates } from '../../../shared/annotations/annotations';

/**
 * Undo and redo for the viewer: a bounded history of what was done. The stack only keeps
 * commands; the caller applies `invert(command)` to undo and the command itself to redo. Pure.
 */

/** The editable part of an annotation: what a change can touch. */
export interface ShapeState {
  classId: string;
  kind: AnnotationKind;
  points: Coordinates;
  label: string;
}

/** A change to one shape, named by its client key (stable while the server id changes on re-creation). */
export type ShapeCommand =
  | { type: 'create'; key: string; shape: ShapeState }
  | { type: 'delete'; key: string; shape: ShapeState }
  | { type: 'update'; key: string; before: ShapeState; after: ShapeState };

/** The command that takes `c` back. */
export function invert(c: ShapeCommand): ShapeCommand {
  switch (c.type) {
    case 'create':
      return { type: 'delete', key: c.key, shape: c.shape };
    case 'delete':
      return { type: 'create', key: c.key, shape: c.shape };
    case 'update':
      return { type: 'update', key: c.key, before: c.after, after: c.before };
  }
}

export class CommandStack<C> {
  private done: C[] = [];
  private undone: C[] = [];

  constructor(readonly limit = 200) {}

  get canUndo(): boolean {
    return this.done.length > 0;
  }

  get canRedo(): boolean {
    return this.undone.length > 0;
  }

  /** Records a new command; the redo branch is gone after it, and the oldest fall off past the limit. */
  push(c: C): void {
    this.done.push(c);
    if (this.done.length > this.limit) this.done.shift();
    this.undone = [];
  }

  /** The command to take back (apply its inverse), or null when there is none. */
  undo(): C | null {
    const c = this.done.pop();
    if (c === undefined) return null;
    this.undone.push(c);
    return c;
  }

  /** The command to do again, or null. */
  redo(): C | null {
    const c = this.undone.pop();
    if (c === undefined) return null;
    this.done.push(c);
    return c;
  }

  /** Forgets commands that no longer apply (a shape reloaded after someone else changed it). */
  dropWhere(test: (c: C) => boolean): void {
    this.done = this.done.filter((c) => !test(c));
    this.undone = this.undone.filter((c) => !test(c));
  }

  clear(): void {
    this.done = [];
    this.undone = [];
  }
}
