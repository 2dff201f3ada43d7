import { DEFAULT_PRINT, type FigureBody, type FigureSpec, type PanelSpec } from '../../../shared/figures';
import { defaultLetter } from './figure-geometry';

/** A panel being edited, with a key that survives reordering (for `track`). */
export interface PanelDraft {
  key: number;
  spec: PanelSpec;
}

/** What a panel shows before an image is chosen: a 4:3 placeholder so the layout has a shape. */
export function blankPanel(index: number): PanelSpec {
  return {
    imageId: '',
    region: { x: 0, y: 0, width: 400, height: 300 },
    classIds: [],
    legend: false,
    letter: defaultLetter(index),
    scaleBar: { lengthUm: null, position: 'bottom-right', colour: 'auto', show: true },
  };
}

/** A new figure: two columns, a 1.5 mm gap, one common bar, a full page at 300 dpi, one empty panel. */
export function blankFigure(): Omit<FigureSpec, 'panels'> {
  return { title: '', columns: 2, gapMm: 1.5, commonScaleBar: true, ...DEFAULT_PRINT };
}

/** The request body from the edited values. Pure. */
export function figureBodyOf(head: Omit<FigureSpec, 'panels'>, panels: readonly PanelDraft[]): FigureBody {
  return { ...head, title: head.title.trim(), panels: panels.map((p) => ({ ...p.spec, letter: p.spec.letter.trim() })) };
}
