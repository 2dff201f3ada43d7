import type { AnnotationKind } from '../../../shared/annotations/annotations';
import { KIND_OF_TOOL, type DrawTool } from './shape-draft';

/**
 * The viewer's keyboard scheme, one table read by the key handler and by the help panel. Pure.
 */
export type ViewerTool = DrawTool | 'select';

export type ShortcutAction =
  | { type: 'tool'; tool: ViewerTool }
  | { type: 'zoomIn' | 'zoomOut' | 'fit' | 'actualPixels' | 'undo' | 'redo' | 'delete' | 'finish' | 'cancel' | 'removeLast' | 'help' }
  | { type: 'pan'; dx: number; dy: number };

export interface KeyPress {
  key: string;
  ctrlKey: boolean;
  metaKey: boolean;
  shiftKey: boolean;
  altKey: boolean;
}

/** Letters that pick tools. */
export const TOOL_KEYS: Record<string, ViewerTool> = {
  v: 'select',
  l: 'polyline',
  p: 'polygon',
  f: 'freehand',
  r: 'rectangle',
  o: 'point',
  m: 'ruler',
  a: 'angle',
  t: 'text',
  k: 'calibrate',
  c: 'pin',
};

/** Screen pixels an arrow key pans; with Shift, a larger step. */
export const PAN_STEP_PX = 60;
export const PAN_STEP_LARGE_PX = 300;

/** The action for a key press, or null when the viewer leaves the key alone. */
export function actionForKey(e: KeyPress): ShortcutAction | null {
  const key = e.key.length === 1 ? e.key.toLowerCase() : e.key;
  const command = e.ctrlKey || e.metaKey;
  if (command && key === 'z') return { type: e.shiftKey ? 'redo' : 'undo' };
  if (command && key === 'y') return { type: 'redo' };
  if (command || e.altKey) return null;
  const step = e.shiftKey ? PAN_STEP_LARGE_PX : PAN_STEP_PX;
  switch (key) {
    case '+':
    case '=':
      return { type: 'zoomIn' };
    case '-':
    case '_':
      return { type: 'zoomOut' };
    case '0':
      return { type: 'fit' };
    case '1':
      return { type: 'actualPixels' };
    case 'ArrowLeft':
      return { type: 'pan', dx: step, dy: 0 };
    case 'ArrowRight':
      return { type: 'pan', dx: -step, dy: 0 };
    case 'ArrowUp':
      return { type: 'pan', dx: 0, dy: step };
    case 'ArrowDown':
      return { type: 'pan', dx: 0, dy: -step };
    case 'Delete':
      return { type: 'delete' };
    case 'Backspace':
      return { type: 'removeLast' };
    case 'Enter':
      return { type: 'finish' };
    case 'Escape':
      return { type: 'cancel' };
    case '?':
      return { type: 'help' };
  }
  const tool = TOOL_KEYS[key];
  return tool && !e.shiftKey ? { type: 'tool', tool } : null;
}

/** The help panel's rows, in the order people look for them. */
export const SHORTCUT_HELP: { keys: string; what: string }[] = [
  { keys: 'V', what: 'Select, move and edit shapes' },
  { keys: 'L', what: 'Polyline (click points; double-click or Enter ends)' },
  { keys: 'P', what: 'Polygon (click points; click the first point or press Enter to close)' },
  { keys: 'F', what: 'Freehand outline (drag around the feature)' },
  { keys: 'R', what: 'Rectangle (drag from corner to corner)' },
  { keys: 'O', what: 'Point' },
  { keys: 'M', what: 'Ruler (drag between the two ends)' },
  { keys: 'A', what: 'Angle (click end, vertex, end)' },
  { keys: 'T', what: 'Note (click where it belongs, then type)' },
  { keys: 'K', what: 'Calibrate (drag along a scale of known length)' },
  { keys: 'C', what: 'Comment pin (click a point or drag a box, then write)' },
  { keys: 'Backspace', what: 'Take back the last point while drawing' },
  { keys: 'Esc', what: 'Cancel the shape being drawn; clear the selection' },
  { keys: 'Del', what: 'Delete the selected shape' },
  { keys: 'Drag a round edge handle', what: 'Add a vertex to the selected line or outline' },
  { keys: 'Alt+click a vertex', what: 'Remove that vertex from the selected line or outline' },
  { keys: 'Ctrl+Z', what: 'Undo' },
  { keys: 'Ctrl+Shift+Z or Ctrl+Y', what: 'Redo' },
  { keys: '+ / −, wheel, pinch', what: 'Zoom in / out around the pointer' },
  { keys: 'Arrows, drag', what: 'Pan (Shift for larger steps)' },
  { keys: '0', what: 'Fit the whole image' },
  { keys: '1', what: 'Actual pixels (1 image pixel = 1 screen pixel)' },
  { keys: '?', what: 'Show or hide this list' },
];

/** Hints beside the class picker: how the current tool is used. */
export const TOOL_HINTS: Record<ViewerTool, string> = {
  select: 'Click a shape to select it; drag it or its corner handles to change it, drag a round edge handle to add a vertex, Alt+click a vertex to remove it. Drag elsewhere to pan.',
  polyline: 'Click to place points; double-click or press Enter to finish.',
  polygon: 'Click to place corners; click the first one or press Enter to close.',
  freehand: 'Drag around the feature; release to close the outline.',
  rectangle: 'Drag from one corner to the opposite one.',
  point: 'Click to place a point.',
  ruler: 'Drag from one end to the other.',
  angle: 'Click the first end, the vertex, then the other end.',
  text: 'Click where the note belongs, then type it.',
  pin: 'Click to pin a comment to a point, or drag a box around a region; then write the comment.',
  calibrate: 'Drag along a stage micrometer or a burned-in scale bar, then enter its true length.',
};

/** What the person may do on this image (from the roles matrix, as the project tells the client). */
export interface ToolRights {
  annotate: boolean;
  calibrate: boolean;
  comment: boolean;
}

/**
 * Whether `tool` can be picked: select always; calibrate and the comment pin by their rights; a
 * drawing tool when the person may annotate and the chosen class takes its shape (`kinds`).
 */
export function mayPickTool(tool: ViewerTool, rights: ToolRights, kinds: readonly AnnotationKind[]): boolean {
  if (tool === 'select') return true;
  if (tool === 'calibrate') return rights.calibrate;
  if (tool === 'pin') return rights.comment;
  const kind = KIND_OF_TOOL[tool];
  return rights.annotate && kind !== null && kinds.includes(kind);
}

/** Whether a key press belongs to a text field or a list the focus is in, rather than to the viewer. */
export function isTypingTarget(target: EventTarget | null): boolean {
  if (typeof HTMLElement === 'undefined' || !(target instanceof HTMLElement)) return false;
  if (target.isContentEditable) return true;
  if (target instanceof HTMLInputElement) return target.type !== 'checkbox' && target.type !== 'radio';
  if (target instanceof HTMLTextAreaElement || target instanceof HTMLSelectElement) return true;
  const role = target.getAttribute('role');
  return role === 'combobox' || role === 'listbox' || role === 'option';
}
