/**
 * Pixel size (µm per pixel) from what image files carry: TIFF resolution tags and OME-XML.
 * Pure functions, shared by the server's ingest and the client's metadata form.
 */

/**
 * Where an image's pixel size came from; `user` means a person typed or confirmed it,
 * `drawn` a line drawn along a micrometer or scale bar, `preset` a saved instrument set-up.
 */
export const PIXEL_SIZE_SOURCES = ['ome_xml', 'tiff_resolution', 'user', 'drawn', 'preset', 'none'] as const;
export type PixelSizeSource = (typeof PIXEL_SIZE_SOURCES)[number];

export const PIXEL_SIZE_SOURCE_LABELS: Record<PixelSizeSource, string> = {
  ome_xml: 'OME-XML in the file',
  tiff_resolution: 'TIFF resolution tags',
  user: 'entered by a person',
  drawn: 'drawn along a scale on the image',
  preset: 'a saved instrument set-up',
  none: 'unknown (uncalibrated)',
};

/** TIFF 6.0 ResolutionUnit (tag 296): 1 = no absolute unit, 2 = inch, 3 = centimetre. */
export type ResolutionUnit = 1 | 2 | 3;

const UM_PER_UNIT: Record<2 | 3, number> = { 2: 25_400, 3: 10_000 };

/**
 * µm per pixel from a TIFF XResolution (pixels per unit) and ResolutionUnit:
 * 25400 / XRes for inch, 10000 / XRes for centimetre; null when the unit is "none" or the value is unusable.
 */
export function micrometresPerPixel(pixelsPerUnit: number, unit: number): number | null {
  if (unit !== 2 && unit !== 3) return null;
  if (!Number.isFinite(pixelsPerUnit) || pixelsPerUnit <= 0) return null;
  return UM_PER_UNIT[unit] / pixelsPerUnit;
}

/** Dots per inch that image writers put in by default (screen and print conventions), not calibrations. */
const DEFAULT_DPI = [72, 96, 300];
/** libvips (and so sharp) writes 1 pixel per millimetre when nobody set a resolution. */
const DEFAULT_PX_PER_MM = 1;

/**
 * True when a resolution is a writer's default rather than a calibration: 72, 96 or 300 dpi
 * (in either unit, since some writers convert them to px/cm), 1 px/mm, or a unit of "none".
 */
export function isWriterDefaultResolution(pixelsPerUnit: number, unit: number): boolean {
  if (unit !== 2 && unit !== 3) return true;
  const dpi = unit === 2 ? pixelsPerUnit : pixelsPerUnit * 2.54;
  const near = (a: number, b: number) => Math.abs(a - b) <= b * 1e-3;
  return DEFAULT_DPI.some((d) => near(dpi, d)) || near(dpi / 25.4, DEFAULT_PX_PER_MM);
}

/** The outcome of reading a pixel size: a value with its source and a sentence saying why. */
export interface PixelSizeReading {
  xUm: number | null;
  yUm: number | null;
  source: PixelSizeSource;
  note: string;
}

const UNIT_WORD: Record<number, string> = { 1: 'no unit', 2: 'inch', 3: 'cm' };

/** Reads TIFF XResolution/YResolution/ResolutionUnit into a pixel size, refusing writers' defaults. */
export function pixelSizeFromTiffResolution(xRes: number | undefined, yRes: number | undefined, unit: number | undefined): PixelSizeReading {
  if (xRes === undefined) return uncalibrated('The file has no resolution tags.');
  const u = unit ?? 2; // TIFF 6.0: ResolutionUnit defaults to inch when absent.
  const shown = `${formatNumber(xRes)} px per ${UNIT_WORD[u] ?? `unit ${u}`}`;
  if (isWriterDefaultResolution(xRes, u)) {
    return uncalibrated(`The resolution tags (${shown}) are a writer's default, not a calibration.`);
  }
  const xUm = micrometresPerPixel(xRes, u);
  const yUm = yRes === undefined ? xUm : micrometresPerPixel(yRes, u);
  if (xUm === null || yUm === null) return uncalibrated(`The resolution tags (${shown}) carry no usable length.`);
  return { xUm, yUm, source: 'tiff_resolution', note: `From the TIFF resolution tags: ${shown}.` };
}

/** OME length units accepted for PhysicalSizeX/Y, in micrometres (OME schema UnitsLength; default µm). */
export const OME_LENGTH_UNITS_UM: Readonly<Record<string, number>> = {
  'µm': 1, // U+00B5 micro sign, the schema's spelling
  'μm': 1, // U+03BC Greek mu, written by some tools
  um: 1,
  nm: 1e-3,
  mm: 1e3,
  m: 1e6,
};

/** A PhysicalSize value and unit in µm, or null for an unknown unit or a value that is not a positive number. */
export function omeLengthToMicrometres(value: number, unit: string | undefined): number | null {
  const factor = OME_LENGTH_UNITS_UM[unit ?? 'µm'];
  if (factor === undefined || !Number.isFinite(value) || value <= 0) return null;
  return value * factor;
}

/** A pixel size reading for "no calibration", with the reason. */
export function uncalibrated(note: string): PixelSizeReading {
  return { xUm: null, yUm: null, source: 'none', note };
}

function formatNumber(n: number): string {
  return Number.isInteger(n) ? String(n) : n.toPrecision(6).replace(/\.?0+$/, '');
}
