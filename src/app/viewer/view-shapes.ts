import type { Annotation, AnnotationKind, Coordinates } from '../../../shared/annotations/annotations';
import type { ShapeState } from './command-stack';
import { boundsOf, type Bounds } from './hit-test';
import type { PendingChange } from './save-queue';

/**
 * The viewer's own record of a shape: the server's annotation plus a client key that outlives
 * re-creation (undo of a delete), and whether a change still waits to be saved. Pure.
 */
export interface ViewShape {
  key: string;
  /** Server id; null until the server stored it. */
  id: string | null;
  version: number | null;
  classId: string;
  kind: AnnotationKind;
  points: Coordinates;
  label: string;
  authorId: string;
  authorName: string;
  updatedAt: string;
  bounds: Bounds;
  /** A change to it has not been saved yet. */
  pending: boolean;
}

export function fromAnnotation(a: Annotation, key: string = a.id): ViewShape {
  return {
    key,
    id: a.id,
    version: a.version,
    classId: a.classId,
    kind: a.kind,
    points: a.points,
    label: a.label,
    authorId: a.authorId,
    authorName: a.authorName,
    updatedAt: a.updatedAt,
    bounds: boundsOf(a.points),
    pending: false,
  };
}

export function stateOf(s: ViewShape): ShapeState {
  return { classId: s.classId, kind: s.kind, points: s.points, label: s.label };
}

/** A shape with new editable parts (bounds follow the points). */
export function withState(s: ViewShape, state: ShapeState, pending: boolean): ViewShape {
  return { ...s, ...state, bounds: boundsOf(state.points), pending };
}

/** A shape drawn here that the server has not stored yet. */
export function localShape(key: string, state: ShapeState, author: { id: string; name: string }, now: string): ViewShape {
  return { key, id: null, version: null, ...state, authorId: author.id, authorName: author.name, updatedAt: now, bounds: boundsOf(state.points), pending: true };
}

/**
 * The server's list with the changes still waiting laid over it (after a reload while offline):
 * queued creations appear, queued edits replace, queued deletions hide.
 */
export function overlayPending(
  annotations: readonly Annotation[],
  queue: readonly PendingChange[],
  author: { id: string; name: string },
  now: string,
): ViewShape[] {
  const byId = new Map(queue.filter((c) => c.id).map((c) => [c.id!, c]));
  const shapes: ViewShape[] = [];
  for (const a of annotations) {
    const change = byId.get(a.id);
    if (!change) shapes.push(fromAnnotation(a));
    else if (change.op === 'update' && change.shape) shapes.push(withState({ ...fromAnnotation(a, change.key), version: change.version }, change.shape, true));
    // A queued deletion: not shown.
  }
  for (const c of queue) {
    if (c.op === 'create' && c.shape && !c.id) shapes.push(localShape(c.key, c.shape, author, now));
  }
  return shapes;
}

export interface ShapeFilter {
  /** Classes switched off in the list (hidden on the canvas too). */
  hiddenClasses: ReadonlySet<string>;
  /** Only this class in the list; '' for all. */
  classId: string;
  /** Only this author in the list; '' for all. */
  authorId: string;
}

export function isShown(s: ViewShape, hiddenClasses: ReadonlySet<string>): boolean {
  return !hiddenClasses.has(s.classId);
}

/** The side list's entries. */
export function filterShapes(shapes: readonly ViewShape[], f: ShapeFilter): ViewShape[] {
  return shapes.filter((s) => (!f.classId || s.classId === f.classId) && (!f.authorId || s.authorId === f.authorId));
}

/** Everyone who drew on the image, by name. */
export function authorsOf(shapes: readonly ViewShape[]): { id: string; name: string }[] {
  const seen = new Map<string, string>();
  for (const s of shapes) if (!seen.has(s.authorId)) seen.set(s.authorId, s.authorName);
  return [...seen].map(([id, name]) => ({ id, name })).sort((a, b) => a.name.localeCompare(b.name));
}
