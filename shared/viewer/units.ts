/** A length in µm written with the unit a person expects: nm below 1 µm, mm from 1000 µm. */
export function formatLength(um: number, digits = 3): string {
  const abs = Math.abs(um);
  if (abs > 0 && abs < 1) return `${trim(um * 1000, digits)} nm`;
  if (abs >= 1000) return `${trim(um / 1000, digits)} mm`;
  return `${trim(um, digits)} µm`;
}

/** An area in µm², switching to mm² from 10⁶ µm². */
export function formatArea(um2: number, digits = 3): string {
  return Math.abs(um2) >= 1e6 ? `${trim(um2 / 1e6, digits)} mm²` : `${trim(um2, digits)} µm²`;
}

/** Significant digits without trailing zeros, e.g. 12.50 → "12.5". */
function trim(value: number, digits: number): string {
  return String(Number(value.toPrecision(digits)));
}
