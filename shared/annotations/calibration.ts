import { distance, type Point } from './geometry';

/** Pixel sizes outside this range are almost surely a typing error (0.1 nm to 1 mm per pixel). */
export const PLAUSIBLE_PIXEL_SIZE_UM = { min: 1e-4, max: 1000 } as const;

export interface DrawnCalibration {
  umPerPx: number;
  /** A warning to show (and confirm) when the result is implausible; null when it looks sound. */
  warning: string | null;
}

/**
 * Pixel size from a line drawn along a stage micrometer or a burned-in scale bar:
 * true length / length in pixels (e.g. 100 µm over 412 px = 0.2427 µm/px, TRADE primer).
 */
export function pixelSizeFromLine(a: Point, b: Point, trueLengthUm: number): DrawnCalibration {
  const px = distance(a, b);
  if (!(px >= 1)) throw new RangeError('The line is shorter than one pixel; draw it along the scale.');
  if (!(trueLengthUm > 0) || !Number.isFinite(trueLengthUm)) throw new RangeError('The true length must be a positive number of µm.');
  const umPerPx = trueLengthUm / px;
  const { min, max } = PLAUSIBLE_PIXEL_SIZE_UM;
  const warning =
    umPerPx < min || umPerPx > max
      ? `That makes ${umPerPx.toPrecision(3)} µm per pixel, outside the usual 0.1 nm–1 mm; check the length and its unit.`
      : null;
  return { umPerPx, warning };
}
