/**
 * Scale bars: a length of 1, 2 or 5 × 10^k in the unit shown, the largest such length
 * not above a fraction (20 % by default) of the field width (TRADE primer, common practice).
 */
export interface ScaleBar {
  /** Bar length in µm. */
  lengthUm: number;
  /** Bar length in screen (or output) pixels. */
  lengthPx: number;
  /** "50 µm", "2 mm", "500 nm". */
  label: string;
}

const STEPS = [5, 2, 1];

/** The largest 1-2-5 × 10^k value not above `max` (max > 0). */
export function niceLengthAtMost(max: number): number {
  if (!(max > 0) || !Number.isFinite(max)) throw new RangeError(`A bar needs a positive field; got ${max}.`);
  let decade = 10 ** Math.floor(Math.log10(max));
  // Guard the floating-point edge where log10 lands a hair below a power of ten.
  if (decade * 10 <= max) decade *= 10;
  for (const step of STEPS) if (step * decade <= max * (1 + 1e-12)) return step * decade;
  return decade / 2;
}

/**
 * The bar for a view `fieldWidthPx` screen pixels wide at `umPerScreenPx`.
 * Labels switch unit at 1000 (1000 µm → "1 mm", 0.5 µm → "500 nm").
 */
export function chooseScaleBar(fieldWidthPx: number, umPerScreenPx: number, fraction = 0.2): ScaleBar {
  const lengthUm = niceLengthAtMost(fieldWidthPx * umPerScreenPx * fraction);
  return { lengthUm, lengthPx: lengthUm / umPerScreenPx, label: scaleLabel(lengthUm) };
}

export function scaleLabel(um: number): string {
  if (um >= 1000) return `${round(um / 1000)} mm`;
  if (um < 1) return `${round(um * 1000)} nm`;
  return `${round(um)} µm`;
}

function round(v: number): number {
  return Number(v.toPrecision(6));
}
