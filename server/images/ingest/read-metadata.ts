import exifr from 'exifr';
import sharp, { type Metadata } from 'sharp';
import type { ImageFormat } from '../../../shared/images';
import { pixelSizeFromTiffResolution, uncalibrated, type PixelSizeReading } from '../../../shared/pixel-size';
import { AppError } from '../../http/app-error';
import { pixelSizeFromOmeXml } from './ome-xml';
import { assertWithinPixelLimit } from './pixel-limit';

/** What Etchfile reads from an original before keeping it. */
export interface ImageFacts {
  format: ImageFormat;
  width: number;
  height: number;
  bitDepth: 8 | 16;
  channels: number;
  pageCount: number;
  acquiredAt: Date | null;
  instrument: string;
  pixelSize: PixelSizeReading;
}

const DISPLAYABLE_SPACES = new Set(['b-w', 'grey16', 'srgb', 'rgb', 'rgb16']);

/**
 * Reads size, depth and channels with sharp (headers only; the pixel limit is checked before
 * anything is decoded), then date, instrument and resolution tags with exifr, and the pixel size
 * from OME-XML first, TIFF resolution tags second.
 */
export async function readImageFacts(file: string, sniffed: ImageFormat, maxPixels: number): Promise<ImageFacts> {
  let meta: Metadata;
  try {
    // Header only: metadata() decodes no pixels, so the limit is ours to apply just below.
    meta = await sharp(file, { limitInputPixels: false }).metadata();
  } catch (err) {
    throw new AppError(422, 'image_corrupt', `This ${sniffed.toUpperCase()} file cannot be read: ${firstLine(err)}.`);
  }
  if (!meta.width || !meta.height) throw new AppError(422, 'image_corrupt', 'This file declares no image size.');
  assertWithinPixelLimit(meta.width, meta.height, maxPixels);
  if (meta.format !== sniffed) throw new AppError(415, 'unsupported_format', `This file starts like ${sniffed.toUpperCase()} but reads as ${meta.format}.`);
  const bitDepth = meta.depth === 'uchar' || meta.depth === 'char' ? 8 : meta.depth === 'ushort' || meta.depth === 'short' ? 16 : null;
  if (bitDepth === null) throw new AppError(415, 'unsupported_format', `Images with ${meta.depth} samples are not supported; use 8- or 16-bit grey or RGB.`);
  if (!DISPLAYABLE_SPACES.has(meta.space ?? '') || !meta.channels || meta.channels > 4) {
    throw new AppError(415, 'unsupported_format', `Images in the ${meta.space} colour space are not supported; use grey or RGB.`);
  }
  const tags = await readTags(file);
  const pixelSize = pixelSizeFromOmeXml(tags.ImageDescription) ?? (sniffed === 'tiff' || tags.XResolution !== undefined
    ? pixelSizeFromTiffResolution(tags.XResolution, tags.YResolution, tags.ResolutionUnit)
    : uncalibrated('The file carries no calibration.'));
  return {
    format: sniffed,
    width: meta.width,
    height: meta.height,
    bitDepth,
    channels: meta.channels,
    pageCount: meta.pages ?? 1,
    acquiredAt: validDate(tags.DateTimeOriginal) ?? validDate(tags.CreateDate) ?? validDate(tags.ModifyDate),
    instrument: [tags.Make, tags.Model].filter((s): s is string => typeof s === 'string' && s.trim() !== '').map((s) => s.trim()).join(' ').slice(0, 120),
    pixelSize,
  };
}

interface Tags {
  ImageDescription?: string;
  XResolution?: number;
  YResolution?: number;
  ResolutionUnit?: number;
  DateTimeOriginal?: unknown;
  CreateDate?: unknown;
  ModifyDate?: unknown;
  Make?: unknown;
  Model?: unknown;
}

async function readTags(file: string): Promise<Tags> {
  try {
    // Numbers, not words, for ResolutionUnit (exifr translates values by default).
    const tags = (await exifr.parse(file, { tiff: true, ifd0: {}, exif: true, gps: false, xmp: false, icc: false, iptc: false, translateValues: false })) as Tags | undefined;
    return tags ?? {};
  } catch {
    // exifr throws on files without any tag block it knows (many PNG/WebP); no tags is a normal answer.
    return {};
  }
}

function validDate(value: unknown): Date | null {
  return value instanceof Date && !Number.isNaN(value.getTime()) && value.getFullYear() > 1900 ? value : null;
}

function firstLine(err: unknown): string {
  return String((err as Error)?.message ?? err).split('\n')[0]!.replace(/\.$/, '');
}
