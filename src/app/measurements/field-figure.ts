import type { ImageSummary } from '../../../shared/images';
import type { Direction, InterceptResult, Measurement, TestPath } from '../../../shared/measurements/measurement-records';
import type { InterceptMark } from '../../../shared/measurements/measurements';
import { PIXEL_SIZE_SOURCE_LABELS, type PixelSizeSource } from '../../../shared/pixel-size';
import { chooseScaleBar } from '../../../shared/viewer/scale-bar';
import { markRadiusFor } from './mark-glyphs';
import { formatCount, formatG, formatLength, formatUm, formatUmPerPx } from './measure-units';
import { describePattern } from './method-notes';

/**
 * The field figures of the grain size summary: for each saved intercept measurement, the picture's frame,
 * its counted test lines and confirmed marks, a 1-2-5 scale bar and the caption that states what was
 * counted and at which pixel size. No Angular, so mocha runs it.
 */

/** An image of the specimen with the measurements saved on it. */
export interface FieldImage {
  image: Pick<ImageSummary, 'id' | 'originalName' | 'width' | 'height'>;
  measurements: Measurement[];
}

/** A scale bar laid in the lower left of the picture, in image px. */
export interface FigureScaleBar {
  label: string;
  lengthUm: number;
  /** The bar itself. */
  x: number;
  y: number;
  lengthPx: number;
  thicknessPx: number;
  /** The pale plate behind bar and label, so it reads on dark and bright pictures. */
  plate: { x: number; y: number; width: number; height: number };
  /** Label baseline and size. */
  textX: number;
  textY: number;
  fontPx: number;
}

export interface FieldFigure {
  measurementId: string;
  imageId: string;
  /** Counted from 1 in the order of the summary's images. */
  number: number;
  /** "Field 1 · laminate.tif · band 1". */
  title: string;
  width: number;
  height: number;
  viewBox: string;
  paths: TestPath[];
  /** Confirmed marks only: suggestions never count, so a report does not show them. */
  marks: InterceptMark[];
  markRadius: number;
  scaleBar: FigureScaleBar | null;
  /** Caption lines after the title, each a sentence of its own. */
  caption: string[];
  /** The staleness message, when the result is out of date. */
  stale: string | null;
}

const DIRECTION_WORDS: Record<Direction, string> = {
  along: 'along the bond interfaces',
  across: 'across the bond interfaces',
  oblique: 'oblique to the bond interfaces',
  all: 'all directions',
};

/** The direction of a field in words; circles sample every direction at once. Pure. */
export function directionWords(result: Pick<InterceptResult, 'direction' | 'byDirection'>, patternType: string): string {
  if (patternType !== 'lines') return 'all directions (circles)';
  if (result.byDirection) return 'along and across the bond interfaces';
  return DIRECTION_WORDS[result.direction];
}

/** The pixel size and where it came from, as a caption says it ("0.5 µm/px, TIFF resolution tags"). Pure. */
export function pixelSizeWords(pixelSize: { umPerPx: number; source: string }): string {
  const source = PIXEL_SIZE_SOURCE_LABELS[pixelSize.source as PixelSizeSource] ?? pixelSize.source;
  return `${formatUmPerPx(pixelSize.umPerPx)}, ${source}`;
}

/**
 * A 1-2-5 bar of at most a fifth of the picture's width at `umPerPx`, in the lower left, with its plate
 * and label sized to the picture so it prints the same at any figure size. Pure.
 */
export function figureScaleBar(width: number, height: number, umPerPx: number): FigureScaleBar | null {
  if (!(umPerPx > 0) || !(width > 0) || !(height > 0)) return null;
  const bar = chooseScaleBar(width, umPerPx);
  const margin = width * 0.03;
  const pad = width * 0.012;
  const fontPx = width / 26;
  const thicknessPx = Math.max(2, width / 110);
  const plateWidth = Math.max(bar.lengthPx, fontPx * 0.62 * bar.label.length) + 2 * pad;
  const plateHeight = pad + fontPx + pad * 0.6 + thicknessPx + pad;
  const plate = { x: margin, y: height - margin - plateHeight, width: plateWidth, height: plateHeight };
  return {
    label: bar.label,
    lengthUm: bar.lengthUm,
    x: plate.x + pad,
    y: plate.y + plate.height - pad - thicknessPx,
    lengthPx: bar.lengthPx,
    thicknessPx,
    plate,
    textX: plate.x + pad,
    textY: plate.y + pad + fontPx * 0.85,
    fontPx,
  };
}

/** The figure of one saved intercept measurement on its image; null for other kinds. Pure. */
export function fieldFigure(image: FieldImage['image'], m: Measurement, number: number): FieldFigure | null {
  if (m.definition.kind !== 'intercept' || m.result.kind !== 'intercept') return null;
  const r = m.result;
  const { width, height } = image;
  const scaleBar = figureScaleBar(width, height, m.pixelSize.umPerPx);
  const counted = r.count > 0 && r.meanInterceptUm !== null;
  const caption = [
    `Pattern: ${describePattern(m.definition.pattern)}; direction ${directionWords(r, m.definition.pattern.type)}.`,
    `L = ${formatLength(r.lineLengthUm)}, ${r.countSymbol} = ${formatCount(r.count)}, l̄ = ${formatUm(r.meanInterceptUm, 2)}, G = ${formatG(r.g)}.`,
    `Pixel size ${pixelSizeWords(m.pixelSize)}${scaleBar ? `; scale bar ${scaleBar.label.replace(' ', '\u00a0')}` : ''}.`,
  ];
  if (r.phase) caption.push(`l̄ of ${r.phase.name}, volume fraction ${r.phase.volumeFraction.toFixed(3)}.`);
  if (r.marksLeftOut > 0) caption.push(`${r.marksLeftOut} confirmed mark(s) off the counted lines were left out.`);
  if (!counted) caption.push('Nothing counted yet: this field is left out of the summary.');
  return {
    measurementId: m.id,
    imageId: image.id,
    number,
    title: `Field ${number} · ${image.originalName} · ${m.whereLabel}`,
    width,
    height,
    viewBox: `0 0 ${width} ${height}`,
    paths: m.testLines,
    marks: m.definition.marks.filter((k) => k.status !== 'suggested'),
    markRadius: markRadiusFor(width),
    scaleBar,
    caption,
    stale: m.stale?.message ?? null,
  };
}

/** Every intercept field of the specimen, numbered in image order then save order. Pure. */
export function fieldFigures(fields: readonly FieldImage[]): FieldFigure[] {
  const out: FieldFigure[] = [];
  for (const f of fields) {
    for (const m of f.measurements) {
      const figure = fieldFigure(f.image, m, out.length + 1);
      if (figure) out.push(figure);
    }
  }
  return out;
}
