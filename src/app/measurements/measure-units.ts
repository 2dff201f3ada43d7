/** Number formatting with units for the measuring pages; no Angular, so mocha can run it. */

import { defaultDetector } from '../../../shared/measurements/crossings';

const nbsp = '\u00a0';

/** "12.3 µm", or an em dash when there is no value. Pure. */
export function formatUm(value: number | null | undefined, digits = 1): string {
  return value === null || value === undefined || !Number.isFinite(value) ? '—' : `${value.toFixed(digits)}${nbsp}µm`;
}

/** Line length: µm below 1 mm, mm above. Pure. */
export function formatLength(um: number | null | undefined): string {
  if (um === null || um === undefined || !Number.isFinite(um)) return '—';
  // Decide the unit on the number as it will be written (999.96 µm is "1.000 mm", not "1000.0 µm").
  return Number(um.toFixed(1)) >= 1000 ? `${(um / 1000).toFixed(3)}${nbsp}mm` : `${um.toFixed(1)}${nbsp}µm`;
}

/** "45.2 mm⁻¹" for P_L, N_L. Pure. */
export function formatPerMm(value: number | null | undefined): string {
  return value === null || value === undefined || !Number.isFinite(value) ? '—' : `${value.toFixed(1)}${nbsp}mm⁻¹`;
}

/** ASTM grain size number to the nearest 0.1 (E112 reporting). Pure. */
export function formatG(value: number | null | undefined): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '—';
  const text = value.toFixed(1);
  // A value that rounds to zero from below is written "0.0", not "-0.0".
  return text === '-0.0' ? '0.0' : text;
}

/** A count of P or N: whole numbers plain, halves with one decimal. Pure. */
export function formatCount(value: number): string {
  return Number.isInteger(value) ? String(value) : value.toFixed(1);
}

/** "1 240 ms" or "2.4 s". Pure. */
export function formatDuration(ms: number): string {
  return ms < 1000 ? `${Math.round(ms)}${nbsp}ms` : `${(ms / 1000).toFixed(1)}${nbsp}s`;
}

/** "±1.2 µm", "12.5 %". Pure. */
export function formatPlusMinusUm(value: number | null | undefined): string {
  return value === null || value === undefined || !Number.isFinite(value) ? '—' : `±${value.toFixed(1)}${nbsp}µm`;
}

export function formatPercent(value: number | null | undefined): string {
  return value === null || value === undefined || !Number.isFinite(value) ? '—' : `${value.toFixed(1)}${nbsp}%`;
}

/** µm per px with enough digits to recognise the calibration. Pure. */
export function formatUmPerPx(value: number | null | undefined): string {
  return value === null || value === undefined ? 'uncalibrated' : `${Number(value.toPrecision(4))}${nbsp}µm/px`;
}

/** What the chosen crossing finder suits, and whether it is the one that fits how the image was made. Pure. */
export function detectorHint(modality: string | null, chosen: 'valleys' | 'steps'): string {
  const suits = chosen === 'valleys' ? 'Suits etched light micrographs and band-contrast maps, where boundaries are dark lines.' : 'Suits orientation and phase maps and BSE images, where grains are flat tones.';
  const fitting = modality ? defaultDetector(modality) : null;
  const kind = modality ? modality.replace(/_/g, ' ') : 'this image';
  if (fitting === null) return `${suits} There is no usual choice for ${kind} images.`;
  return fitting === chosen ? `${suits} This is the usual choice for ${kind} images.` : `${suits} ${kind[0]!.toUpperCase()}${kind.slice(1)} images are usually searched for ${fitting === 'valleys' ? 'dark boundary lines' : 'changes of colour or brightness'}.`;
}
