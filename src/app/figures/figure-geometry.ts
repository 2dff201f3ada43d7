import { commonBarLengthUm } from '../../../shared/figures';
import { niceLengthAtMost } from '../../../shared/viewer/scale-bar';

/**
 * Pure geometry and wording for the figure composer: preview ↔ image coordinates, regions in µm,
 * default panel letters, and server field paths sorted to their panels. No Angular here, so
 * `test/` can run it under mocha as it is.
 */

/** A rectangle in full-resolution image px (the shape of `PanelSpec.region`). */
export interface Region {
  x: number;
  y: number;
  width: number;
  height: number;
}

/** A point in some pixel space. */
export interface Point {
  x: number;
  y: number;
}

/** Smallest side of a region the server accepts (shared/figures.ts). */
export const MIN_REGION_SIDE = 16;

/** The whole image as a region. */
export function wholeImage(imageWidth: number, imageHeight: number): Region {
  return { x: 0, y: 0, width: imageWidth, height: imageHeight };
}

/**
 * A point on the shown preview (CSS px from its top-left corner, preview drawn `shownWidth` ×
 * `shownHeight`) as a full-resolution image point, clamped inside the image.
 */
export function previewToImage(point: Point, shownWidth: number, shownHeight: number, imageWidth: number, imageHeight: number): Point {
  const x = (point.x / shownWidth) * imageWidth;
  const y = (point.y / shownHeight) * imageHeight;
  return { x: clamp(x, 0, imageWidth), y: clamp(y, 0, imageHeight) };
}

/** An image region as a rectangle on the shown preview (CSS px). */
export function imageToPreview(region: Region, shownWidth: number, shownHeight: number, imageWidth: number, imageHeight: number): Region {
  const sx = shownWidth / imageWidth;
  const sy = shownHeight / imageHeight;
  return { x: region.x * sx, y: region.y * sy, width: region.width * sx, height: region.height * sy };
}

/**
 * The region spanned by a drag between two image points: whole pixels, at least
 * MIN_REGION_SIDE on each side (grown towards the image's inside), never past the edges.
 */
export function regionBetween(a: Point, b: Point, imageWidth: number, imageHeight: number): Region {
  const side = (from: number, to: number, size: number): [number, number] => {
    let start = Math.floor(Math.min(from, to));
    let end = Math.ceil(Math.max(from, to));
    const min = Math.min(MIN_REGION_SIDE, size);
    if (end - start < min) {
      end = Math.min(size, start + min);
      start = Math.max(0, end - min);
    }
    return [clamp(start, 0, size), clamp(end, 0, size) - clamp(start, 0, size)];
  };
  const [x, width] = side(a.x, b.x, imageWidth);
  const [y, height] = side(a.y, b.y, imageHeight);
  return { x, y, width, height };
}

/** True when the region lies inside the image and is at least MIN_REGION_SIDE on each side. */
export function regionFits(region: Region, imageWidth: number, imageHeight: number): boolean {
  return (
    region.x >= 0 &&
    region.y >= 0 &&
    region.width >= MIN_REGION_SIDE &&
    region.height >= MIN_REGION_SIDE &&
    region.x + region.width <= imageWidth &&
    region.y + region.height <= imageHeight
  );
}

/** The region's size in µm, or null when the image has no pixel size. */
export function regionSizeUm(region: Region, xUm: number | null, yUm: number | null): { width: number; height: number } | null {
  if (xUm === null || !(xUm > 0)) return null;
  const y = yUm !== null && yUm > 0 ? yUm : xUm;
  return { width: region.width * xUm, height: region.height * y };
}

/** "412 × 309 µm" (or mm above 1000 µm) for a region size; three significant figures. */
export function sizeUmText(size: { width: number; height: number }): string {
  const big = Math.max(size.width, size.height) >= 1000;
  const f = (v: number) => String(Number((big ? v / 1000 : v).toPrecision(3)));
  return `${f(size.width)} × ${f(size.height)} ${big ? 'mm' : 'µm'}`;
}

/** "a", "b", … "z", then "aa", "ab", … for the panel at `index` (0-based). */
export function defaultLetter(index: number): string {
  let n = index;
  let out = '';
  do {
    out = String.fromCharCode(97 + (n % 26)) + out;
    n = Math.floor(n / 26) - 1;
  } while (n >= 0);
  return out;
}

/**
 * Letters after a reorder or removal: a panel whose letter was still its old default takes its
 * new default; a letter someone typed stays.
 */
export function relabel(letters: readonly string[], previousIndices: readonly number[]): string[] {
  return letters.map((letter, i) => (letter === defaultLetter(previousIndices[i]!) ? defaultLetter(i) : letter));
}

/** Moves the item at `from` to `to` in a copy of the list. */
export function moveItem<T>(items: readonly T[], from: number, to: number): T[] {
  const copy = [...items];
  if (to < 0 || to >= copy.length || from === to) return copy;
  const [item] = copy.splice(from, 1);
  copy.splice(to, 0, item!);
  return copy;
}

/** One server problem, as in shared/api-error.ts. */
export interface FieldProblem {
  field: string;
  message: string;
}

/** Server problems split into those about one panel (by index) and those about the figure. */
export interface SortedProblems {
  panels: Record<number, string[]>;
  figure: Record<string, string>;
}

/**
 * `body.panels.1.region` → panel 1, "region: …"; `body.title` → figure field `title`.
 * Messages about panels keep the part they concern, so they read on their own beside the panel.
 */
export function sortProblems(problems: readonly FieldProblem[]): SortedProblems {
  const sorted: SortedProblems = { panels: {}, figure: {} };
  for (const { field, message } of problems) {
    const parts = field.split('.');
    if (parts[0] === 'body') parts.shift();
    if (parts[0] === 'panels' && parts[1] !== undefined && /^\d+$/.test(parts[1])) {
      const index = Number(parts[1]);
      const what = PART_NAMES[parts[2] ?? ''] ?? parts.slice(2).join(' ');
      (sorted.panels[index] ??= []).push(what ? `${what}: ${message}` : message);
    } else {
      const key = parts.join('.') || 'figure';
      sorted.figure[key] ??= message;
    }
  }
  return sorted;
}

const PART_NAMES: Record<string, string> = {
  imageId: 'Image',
  region: 'Region',
  classIds: 'Annotation classes',
  letter: 'Letter',
  scaleBar: 'Scale bar',
  legend: 'Legend',
};

/** Export size in px worded for people: "2362 × 1575 px (3.7 megapixels)". */
export function pixelSizeText(width: number, height: number): string {
  const mp = (width * height) / 1e6;
  return `${width} × ${height} px (${Number(mp.toPrecision(2))} megapixels)`;
}

/** What the bar length of one panel depends on. */
export interface BarInput {
  regionWidth: number;
  /** µm per image px along x, or null when uncalibrated. */
  xUm: number | null;
  fixedUm: number | null;
  show: boolean;
}

/**
 * Each panel's bar length in µm as the server will draw it: the fixed length, else the common
 * one (when asked and every panel is calibrated), else the panel's own 1-2-5 length; null for no bar.
 */
export function barLengthsUm(panels: readonly BarInput[], common: boolean): (number | null)[] {
  const fields = panels.map((p) => (p.xUm ? p.regionWidth * p.xUm : null));
  const shared = common && panels.length > 0 ? commonBarLengthUm(fields) : null;
  return panels.map((p, i) => {
    if (!p.show || !p.xUm) return null;
    return p.fixedUm ?? shared ?? niceLengthAtMost(fields[i]! * 0.2);
  });
}

/** Where a panel's legend goes: the letter holds the top-left corner, the bar its own; the first corner left free (as the server draws it). */
export function legendCorner(barPosition: string): 'top-right' | 'bottom-left' | 'bottom-right' {
  return (['top-right', 'bottom-left', 'bottom-right'] as const).find((c) => c !== barPosition)!;
}

function clamp(v: number, lo: number, hi: number): number {
  return Math.min(hi, Math.max(lo, v));
}
