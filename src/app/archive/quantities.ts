import type { StepParams, StepType } from '../../../shared/archive/process-route';

/**
 * Number formatting for the archive pages: thicknesses with a unit that suits
 * their size, percentages, strains and step parameters. Pure, no Angular, so
 * `test/` runs it under mocha.
 */

/** `value` rounded to `digits` significant figures, never in exponent notation ("1.50", "0.188", "1500"). */
export function significant(value: number, digits = 3): string {
  if (!Number.isFinite(value)) return '–';
  if (value === 0) return '0';
  // Round first, so 0.9996 becomes "1.00" rather than "1.000".
  const rounded = Number(value.toPrecision(digits));
  const magnitude = Math.floor(Math.log10(Math.abs(rounded)));
  if (magnitude >= digits - 1) return String(Math.round(rounded));
  return rounded.toFixed(digits - 1 - magnitude);
}

/**
 * A thickness given in mm, in the unit a metallographer would say it in:
 * mm from 0.1 mm up, µm below that, nm below 1 µm; three significant figures
 * ("1.50 mm", "0.188 mm", "46.9 µm", "366 nm").
 */
export function formatThickness(mm: number): string {
  if (!Number.isFinite(mm)) return '–';
  if (mm === 0) return '0 mm';
  // Round once, in the smaller unit, and pick the unit from that rounded number: rounding in two
  // units can disagree at half-way values (0.09995 mm), and then unit and text would not match.
  const um = Number((mm * 1000).toPrecision(3));
  if (um >= 100) return `${significant(um / 1000)} mm`;
  const nm = Number((mm * 1e6).toPrecision(3));
  if (nm >= 1000) return `${significant(nm / 1000)} µm`;
  return `${significant(nm)} nm`;
}

/** A fraction (0.875) as a percentage with one decimal ("87.5 %"); whole numbers lose the ".0". */
export function formatPercent(fraction: number): string {
  if (!Number.isFinite(fraction)) return '–';
  const pct = Math.round(fraction * 1000) / 10;
  // -0 would print as "0"; keep it that way rather than "-0.0".
  return `${Number.isInteger(pct) ? String(pct === 0 ? 0 : pct) : pct.toFixed(1)} %`;
}

/** Von Mises equivalent strain, dimensionless, to two decimals ("2.40"). */
export function formatStrain(strain: number): string {
  return Number.isFinite(strain) ? strain.toFixed(2) : '–';
}

/** A plain number without trailing zeros, for parameters people typed (50, 0.5, 800). */
function plain(value: number): string {
  return String(Number(value.toPrecision(6)));
}

/**
 * A step's parameters as short phrases with units, in the order people read
 * them: "50 % reduction"; "2 pieces"; "800 °C", "30 min", "argon"; free details last.
 */
export function formatStepParams(type: StepType, params: StepParams): string[] {
  const out: string[] = [];
  if (params.reductionPct !== undefined) out.push(`${plain(params.reductionPct)} % reduction`);
  if (type === 'cut_and_stack') out.push(`${params.pieces ?? 2} pieces`);
  else if (params.pieces !== undefined) out.push(`${params.pieces} pieces`);
  if (params.temperatureC !== undefined) out.push(`${plain(params.temperatureC)} °C`);
  if (params.timeMin !== undefined) out.push(`${plain(params.timeMin)} min`);
  if (params.atmosphere) out.push(params.atmosphere);
  if (params.details) out.push(params.details);
  return out;
}

/** An etching time in s ("8 s", "90 s"); empty when none was recorded. */
export function formatEtchingTime(seconds: number | null): string {
  return seconds === null ? '' : `${plain(seconds)} s`;
}

/** A position on a specimen ("x 2 mm, y 0.5 mm"); empty when neither coordinate is known. */
export function formatPosition(xMm: number | null, yMm: number | null): string {
  const parts = [xMm === null ? '' : `x ${plain(xMm)} mm`, yMm === null ? '' : `y ${plain(yMm)} mm`].filter(Boolean);
  return parts.join(', ');
}
