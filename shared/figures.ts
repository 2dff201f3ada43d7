import { z } from 'zod';
import type { ReviewState } from './reviews';
import { niceLengthAtMost, scaleLabel } from './viewer/scale-bar';

/** Where a panel's scale bar sits. */
export const BAR_POSITIONS = ['bottom-right', 'bottom-left', 'top-right', 'top-left'] as const;
export type BarPosition = (typeof BAR_POSITIONS)[number];

export interface PanelSpec {
  imageId: string;
  /** The part of the image shown, in full-resolution image px. */
  region: { x: number; y: number; width: number; height: number };
  /** Annotation classes drawn on the panel (none = a clean micrograph). */
  classIds: string[];
  legend: boolean;
  /** "a", "b"…; empty for none. */
  letter: string;
  scaleBar: { lengthUm: number | null; position: BarPosition; colour: 'auto' | 'white' | 'black'; show: boolean };
}

export interface FigureSpec {
  title: string;
  columns: number;
  /** Gap between panels, mm on the printed figure. */
  gapMm: number;
  /** One bar length for every panel, when their pixel sizes allow it. */
  commonScaleBar: boolean;
  /** The printed width the figure is made for, in mm; clearing renders the kept export at this size. */
  widthMm: number;
  /** Dots per inch of that print; clearing renders the kept export at this resolution. */
  dpi: number;
  panels: PanelSpec[];
}

/** Print size of figures saved before the figure carried one (a full page at 300 dpi). */
export const DEFAULT_PRINT = { widthMm: 170, dpi: 300 } as const;

export interface Figure extends FigureSpec {
  id: string;
  projectId: string;
  version: number;
  createdByName: string;
  updatedAt: string;
  /** Where the figure stands in review ('draft' until someone submits it). */
  reviewState: ReviewState;
}

const printWidthMm = z.number().min(20, { error: 'At least 20 mm wide.' }).max(500, { error: 'At most 500 mm wide.' });
const printDpi = z.number().int({ error: 'Enter a whole number of dots per inch.' }).min(72, { error: 'At least 72 dpi.' }).max(1200, { error: 'At most 1200 dpi.' });

const panel = z.strictObject({
  imageId: z.uuid({ error: 'Choose an image.' }),
  region: z.strictObject({
    x: z.number().min(0),
    y: z.number().min(0),
    width: z.number().min(16, { error: 'A panel shows at least 16 × 16 image pixels.' }),
    height: z.number().min(16, { error: 'A panel shows at least 16 × 16 image pixels.' }),
  }),
  classIds: z.array(z.uuid()).max(50).default([]),
  legend: z.boolean().default(false),
  letter: z.string().trim().max(3).default(''),
  scaleBar: z
    .strictObject({
      lengthUm: z.number().positive({ error: 'A bar length must be above 0 µm.' }).nullable().default(null),
      position: z.enum(BAR_POSITIONS).default('bottom-right'),
      colour: z.enum(['auto', 'white', 'black']).default('auto'),
      show: z.boolean().default(true),
    })
    .default({ lengthUm: null, position: 'bottom-right', colour: 'auto', show: true }),
});

/** The fields of a figure, without defaults: a PATCH changes only what it names. */
const figureFields = {
  title: z.string().trim().min(1, { error: 'Enter a title.' }).max(200),
  columns: z.number().int().min(1).max(6),
  gapMm: z.number().min(0).max(20),
  commonScaleBar: z.boolean(),
  widthMm: printWidthMm,
  dpi: printDpi,
  panels: z.array(panel).min(1, { error: 'A figure needs at least one panel.' }).max(24),
};

export const figureBody = z.strictObject({
  ...figureFields,
  columns: figureFields.columns.default(2),
  gapMm: figureFields.gapMm.default(1.5),
  commonScaleBar: figureFields.commonScaleBar.default(true),
  widthMm: figureFields.widthMm.default(DEFAULT_PRINT.widthMm),
  dpi: figureFields.dpi.default(DEFAULT_PRINT.dpi),
});
export type FigureBody = z.infer<typeof figureBody>;

/** PATCH: the version the caller edited, and only the fields that change (no defaults fill the others in). */
export const updateFigureBody = z.strictObject(figureFields).partial().extend({ version: z.number().int().min(1) });
export type UpdateFigureBody = z.infer<typeof updateFigureBody>;

export const exportFigureBody = z.strictObject({
  format: z.enum(['png', 'tiff']),
  widthMm: printWidthMm,
  dpi: printDpi,
});
export type ExportFigureBody = z.infer<typeof exportFigureBody>;

export interface PanelBox {
  left: number;
  top: number;
  width: number;
  height: number;
}

/**
 * Panel boxes in output pixels: equal-width columns, each panel as tall as its region's aspect
 * asks, rows as tall as their tallest panel. Returns the canvas size too.
 */
export function layoutPanels(spec: Pick<FigureSpec, 'columns' | 'gapMm' | 'panels'>, widthMm: number, dpi: number): { width: number; height: number; boxes: PanelBox[] } {
  const pxPerMm = dpi / 25.4;
  const width = Math.round(widthMm * pxPerMm);
  const gap = Math.round(spec.gapMm * pxPerMm);
  const columns = Math.min(spec.columns, spec.panels.length);
  const colWidth = Math.floor((width - gap * (columns - 1)) / columns);
  const boxes: PanelBox[] = [];
  let top = 0;
  for (let start = 0; start < spec.panels.length; start += columns) {
    const row = spec.panels.slice(start, start + columns);
    const heights = row.map((p) => Math.round((colWidth * p.region.height) / p.region.width));
    row.forEach((_, i) => boxes.push({ left: i * (colWidth + gap), top, width: colWidth, height: heights[i]! }));
    top += Math.max(...heights) + gap;
  }
  return { width, height: top - gap, boxes };
}

/**
 * One bar length for all panels: the largest 1-2-5 length not above 20 % of the narrowest
 * panel's field width (TRADE primer rule), or null when a panel has no pixel size.
 */
export function commonBarLengthUm(fieldWidthsUm: readonly (number | null)[]): number | null {
  if (fieldWidthsUm.some((w) => w === null)) return null;
  return niceLengthAtMost(Math.min(...(fieldWidthsUm as number[])) * 0.2);
}

export { scaleLabel };
