import type { ProcessingInfo } from '../../../shared/images';
import { significant } from './quantities';

/**
 * How image facts read on screen: pixel size, field of view, magnification,
 * file size, processing state. Pure, no Angular, so `test/` runs it under mocha.
 */

/** µm per pixel with four significant figures; nm/px below 0.1 µm/px, where SEM images live ("0.2427 µm/px", "4.883 nm/px"). */
export function formatPixelSize(um: number | null): string {
  if (um === null || !Number.isFinite(um) || um <= 0) return 'uncalibrated';
  return Number(um.toPrecision(4)) < 0.1 ? `${significant(um * 1000, 4)} nm/px` : `${significant(um, 4)} µm/px`;
}

/** A pixel size that may differ along x and y: one value when square, else "x 0.25 × y 0.5 µm/px" in the x unit. */
export function formatPixelSizeXY(xUm: number | null, yUm: number | null): string {
  if (xUm === null || yUm === null || Math.abs(xUm - yUm) <= xUm * 1e-6) return formatPixelSize(xUm);
  return `x ${formatPixelSize(xUm)}, y ${formatPixelSize(yUm)}`;
}

/** A length in µm in the unit that suits it: nm below 1 µm, mm from 1000 µm; three significant figures. */
export function formatLengthUm(um: number): string {
  if (!Number.isFinite(um)) return '–';
  const rounded = Number(um.toPrecision(3));
  if (rounded >= 1000) return `${significant(um / 1000)} mm`;
  if (rounded < 1) return `${significant(um * 1000)} nm`;
  return `${significant(um)} µm`;
}

/** The width × height the image covers, "512 × 384 µm"; empty when uncalibrated. Both sides in the unit of the longer one. */
export function fieldOfView(width: number, height: number, xUm: number | null, yUm: number | null): string {
  if (xUm === null || yUm === null || xUm <= 0 || yUm <= 0) return '';
  const w = width * xUm;
  const h = height * yUm;
  const unit = formatLengthUm(Math.max(w, h)).split(' ')[1]!;
  const factor = unit === 'mm' ? 1 / 1000 : unit === 'nm' ? 1000 : 1;
  return `${significant(w * factor)} × ${significant(h * factor)} ${unit}`;
}

/** "500×"; empty when not recorded. */
export function formatMagnification(m: number | null): string {
  return m === null ? '' : `${Number(m.toPrecision(6))}×`;
}

/** File sizes in binary units, as the upload limit is written ("12.4 MiB"). */
export function formatBytes(bytes: number): string {
  if (!Number.isFinite(bytes) || bytes < 0) return '–';
  if (bytes < 1024) return `${bytes} B`;
  const units = ['KiB', 'MiB', 'GiB', 'TiB'];
  let value = bytes / 1024;
  let unit = 0;
  const shown = (v: number) => (v >= 100 ? String(Math.round(v)) : v.toFixed(1));
  // Move up a unit when the number as written would reach 1024 (1048575 B is "1.0 MiB", not "1024 KiB").
  while (Number(shown(value)) >= 1024 && unit < units.length - 1) {
    value /= 1024;
    unit += 1;
  }
  return `${shown(value)} ${units[unit]}`;
}

/** One phrase for where an image is in processing: "queued", "processing 40 %", "ready", "failed: reason". */
export function processingText(p: ProcessingInfo): string {
  switch (p.state) {
    case 'queued':
      return 'queued';
    case 'processing':
      return `processing ${Math.round(p.progress)} %`;
    case 'ready':
      return 'ready';
    case 'failed':
      return p.failureReason ? `failed: ${p.failureReason}` : 'failed';
  }
}

/** Whether a list still has images on their way, so the view should look again shortly. */
export function anyInProgress(items: readonly { processing: ProcessingInfo }[]): boolean {
  return items.some((i) => i.processing.state === 'queued' || i.processing.state === 'processing');
}
