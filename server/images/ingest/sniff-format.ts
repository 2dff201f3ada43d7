import type { ImageFormat } from '../../../shared/images';

/** The format read from a file's first bytes, or what else it looks like. */
export type Sniffed = { format: ImageFormat } | { refused: string };

const ACCEPTED = 'Etchfile takes TIFF, PNG, JPEG and WebP images';

const starts = (head: Buffer, bytes: number[], at = 0) => bytes.every((b, i) => head[at + i] === b);
const ascii = (head: Buffer, text: string, at = 0) => head.subarray(at, at + text.length).toString('latin1') === text;

/**
 * Identifies the format by its signature, never by the file name: TIFF (II*\0 or MM\0*, and
 * BigTIFF), PNG, JPEG (FF D8 FF) and WebP (RIFF….WEBP). Anything else is refused with a
 * sentence naming what it seems to be.
 */
export function sniffFormat(head: Buffer): Sniffed {
  if (starts(head, [0x49, 0x49, 0x2a, 0x00]) || starts(head, [0x4d, 0x4d, 0x00, 0x2a])) return { format: 'tiff' };
  if (starts(head, [0x49, 0x49, 0x2b, 0x00]) || starts(head, [0x4d, 0x4d, 0x00, 0x2b])) return { format: 'tiff' };
  if (starts(head, [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a])) return { format: 'png' };
  if (starts(head, [0xff, 0xd8, 0xff])) return { format: 'jpeg' };
  if (ascii(head, 'RIFF') && ascii(head, 'WEBP', 8)) return { format: 'webp' };
  return { refused: `${describe(head)}; ${ACCEPTED}.` };
}

function describe(head: Buffer): string {
  if (head.length === 0) return 'This file is empty';
  if (ascii(head, '%PDF')) return 'This file is a PDF document';
  if (starts(head, [0x50, 0x4b, 0x03, 0x04]) || starts(head, [0x1f, 0x8b]) || starts(head, [0x37, 0x7a, 0xbc, 0xaf]) || ascii(head, 'Rar!')) {
    return 'This file is a compressed archive';
  }
  if (ascii(head, 'GIF8')) return 'This file is a GIF image';
  if (ascii(head, 'BM')) return 'This file is a BMP image';
  const text = head.toString('utf8').replace(/^\uFEFF/, '').trimStart().toLowerCase();
  if (text.startsWith('<svg') || (text.startsWith('<?xml') && text.includes('<svg'))) return 'This file is an SVG drawing';
  if (text.startsWith('<!doctype html') || text.startsWith('<html')) return 'This file is an HTML page';
  if (text.startsWith('<')) return 'This file is XML or markup text';
  if (isMostlyText(head)) return 'This file is text, not an image';
  return `This file is not an image Etchfile knows (it starts with ${[...head.subarray(0, 4)].map((b) => b.toString(16).padStart(2, '0')).join(' ')})`;
}

function isMostlyText(head: Buffer): boolean {
  const printable = [...head].filter((b) => b === 9 || b === 10 || b === 13 || (b >= 32 && b < 127) || b >= 0xc0).length;
  return printable / head.length > 0.95;
}
