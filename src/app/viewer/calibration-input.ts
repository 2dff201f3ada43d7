import { pixelSizeFromLine } from '../../../shared/annotations/calibration';
import type { Point } from '../../../shared/annotations/geometry';

/**
 * The calibrate tool's form: a true length typed in nm, µm or mm, turned into µm and previewed as
 * µm per pixel with the shared plausibility warning. Pure.
 */
export const LENGTH_UNITS = { nm: 1e-3, 'µm': 1, mm: 1e3 } as const;
export type LengthUnit = keyof typeof LENGTH_UNITS;

export function toMicrometres(value: number, unit: LengthUnit): number {
  return value * LENGTH_UNITS[unit];
}

export type CalibrationPreview = { ok: true; umPerPx: number; warning: string | null; trueLengthUm: number } | { ok: false; problem: string };

/** What saving would set, or why it cannot be saved yet. */
export function previewCalibration(start: Point, end: Point, value: number | null, unit: LengthUnit): CalibrationPreview {
  if (value === null || !Number.isFinite(value)) return { ok: false, problem: 'Enter the true length of the line.' };
  if (value <= 0) return { ok: false, problem: 'The true length must be above 0.' };
  const trueLengthUm = toMicrometres(value, unit);
  try {
    const { umPerPx, warning } = pixelSizeFromLine(start, end, trueLengthUm);
    return { ok: true, umPerPx, warning, trueLengthUm };
  } catch (err) {
    // pixelSizeFromLine throws RangeError for a line shorter than a pixel or a length that is not positive.
    if (err instanceof RangeError) return { ok: false, problem: err.message };
    throw err;
  }
}

/** µm per pixel as the info panel writes it: four significant digits. */
export function formatPixelSize(umPerPx: number): string {
  return `${Number(umPerPx.toPrecision(4))} µm/px`;
}
