import { open, type FileHandle } from 'node:fs/promises';
import type { ImageFormat } from '../../../shared/images';

/**
 * Whether a file holds all the data its own structure announces, checked from its headers
 * without decoding pixels: a TIFF's strips or tiles end inside the file, a PNG reaches IEND,
 * a JPEG has its end-of-image marker, a WebP is as long as its RIFF header says.
 * Returns a sentence saying what is missing, or null when the file is whole.
 */
export async function findTruncation(file: string, format: ImageFormat, size: number): Promise<string | null> {
  const fh = await open(file, 'r');
  try {
    if (format === 'tiff') return await tiffTruncation(fh, size);
    if (format === 'png') return await pngTruncation(fh, size);
    if (format === 'jpeg') return await jpegTruncation(fh, size);
    return await webpTruncation(fh, size);
  } finally {
    await fh.close();
  }
}

async function bytesAt(fh: FileHandle, position: number, length: number): Promise<Buffer> {
  const buf = Buffer.alloc(length);
  const { bytesRead } = await fh.read(buf, 0, length, position);
  return buf.subarray(0, bytesRead);
}

// TIFF 6.0, Section 2 (structure) and tags 273/279 (strips), 324/325 (tiles).
const STRIP_OFFSETS = 273;
const STRIP_COUNTS = 279;
const TILE_OFFSETS = 324;
const TILE_COUNTS = 325;

async function tiffTruncation(fh: FileHandle, size: number): Promise<string | null> {
  const header = await bytesAt(fh, 0, 8);
  const le = header[0] === 0x49;
  const u16 = (b: Buffer, at: number) => (le ? b.readUInt16LE(at) : b.readUInt16BE(at));
  const u32 = (b: Buffer, at: number) => (le ? b.readUInt32LE(at) : b.readUInt32BE(at));
  // BigTIFF (43) has 8-byte offsets; libvips checks its data when the job decodes it.
  if (header.length < 8 || u16(header, 2) !== 42) return header.length < 8 ? 'The TIFF header is cut short.' : null;
  const ifd = u32(header, 4);
  const countBuf = await bytesAt(fh, ifd, 2);
  if (countBuf.length < 2) return 'The TIFF directory lies beyond the end of the file.';
  const entries = await bytesAt(fh, ifd + 2, u16(countBuf, 0) * 12);
  if (entries.length < u16(countBuf, 0) * 12) return 'The TIFF directory is cut short.';
  const arrays = new Map<number, number[]>();
  for (let at = 0; at < entries.length; at += 12) {
    const tag = u16(entries, at);
    if (![STRIP_OFFSETS, STRIP_COUNTS, TILE_OFFSETS, TILE_COUNTS].includes(tag)) continue;
    const type = u16(entries, at + 2);
    const n = u32(entries, at + 4);
    const width = type === 3 ? 2 : type === 4 ? 4 : 0; // SHORT or LONG, the only types the spec allows here
    if (width === 0) return 'The TIFF strip table has an unexpected type.';
    const inline = n * width <= 4;
    const data = inline ? entries.subarray(at + 8, at + 12) : await bytesAt(fh, u32(entries, at + 8), n * width);
    if (data.length < n * width) return 'The TIFF strip table lies beyond the end of the file.';
    arrays.set(tag, Array.from({ length: n }, (_, i) => (width === 2 ? u16(data, i * 2) : u32(data, i * 4))));
  }
  const offsets = arrays.get(STRIP_OFFSETS) ?? arrays.get(TILE_OFFSETS) ?? [];
  const counts = arrays.get(STRIP_COUNTS) ?? arrays.get(TILE_COUNTS) ?? [];
  if (offsets.length === 0) return 'The TIFF names no image data.';
  const end = Math.max(...offsets.map((o, i) => o + (counts[i] ?? 0)));
  return end > size ? `The file ends at byte ${size} but its image data runs to byte ${end}: it was cut short.` : null;
}

async function pngTruncation(fh: FileHandle, size: number): Promise<string | null> {
  // PNG (ISO/IEC 15948) chunks: 4-byte length, 4-byte type, data, 4-byte CRC; the last is IEND.
  let at = 8;
  while (at + 12 <= size) {
    const header = await bytesAt(fh, at, 8);
    const type = header.subarray(4, 8).toString('latin1');
    at += 12 + header.readUInt32BE(0);
    if (type === 'IEND') return at <= size ? null : 'The PNG end chunk is cut short.';
  }
  return 'The PNG stops before its end chunk: it was cut short.';
}

async function jpegTruncation(fh: FileHandle, size: number): Promise<string | null> {
  // JPEG (ITU T.81) ends with the EOI marker FF D9; some writers append a little after it.
  const tailLength = Math.min(size, 4096);
  const tail = await bytesAt(fh, size - tailLength, tailLength);
  for (let i = tail.length - 2; i >= 0; i--) if (tail[i] === 0xff && tail[i + 1] === 0xd9) return null;
  return 'The JPEG has no end-of-image marker: it was cut short.';
}

async function webpTruncation(fh: FileHandle, size: number): Promise<string | null> {
  // RIFF: bytes 4-7 hold the length of everything after byte 8, little-endian.
  const header = await bytesAt(fh, 0, 8);
  const declared = 8 + header.readUInt32LE(4);
  return declared > size ? `The WebP declares ${declared} bytes but the file has ${size}: it was cut short.` : null;
}
