import sharp, { type Sharp, type SharpOptions } from 'sharp';

/** What the job knows about the original from its row. */
export interface SourceFacts {
  width: number;
  height: number;
  bitDepth: number;
  channels: number;
}

/** Percentiles of the 16-bit display window: 0.5 % of samples go black, 0.5 % white (common practice, no source). */
export const WINDOW_PERCENTILES = { low: 0.005, high: 0.995 } as const;

/** Longest edge of the copy the window is measured on: enough samples for stable percentiles. */
const WINDOW_SAMPLE_EDGE = 1024;

/**
 * A factory of 8-bit display pipelines for an original: grey stays one band, alpha is flattened on
 * white, only the first page is read, and 16-bit images are windowed to 8 bits by a percentile
 * stretch. The original file is only ever read.
 */
export async function displaySource(file: string, facts: SourceFacts, maxPixels: number): Promise<() => Sharp> {
  const open: SharpOptions = { limitInputPixels: maxPixels, failOn: 'truncated', page: 0 };
  const grey = facts.channels <= 2;
  if (facts.bitDepth === 8) {
    return () => {
      const s = sharp(file, open);
      if (facts.channels === 2 || facts.channels === 4) s.flatten({ background: '#ffffff' });
      return s.toColourspace(grey ? 'b-w' : 'srgb');
    };
  }
  // 16 bits: sharp's linear() wraps out-of-range values instead of clipping them when it converts
  // back to 8 bits, so the window is applied here through a lookup table, streaming the samples.
  const sixteen = () => {
    const s = sharp(file, open);
    if (facts.channels === 2 || facts.channels === 4) s.removeAlpha();
    return s.toColourspace(grey ? 'grey16' : 'rgb16');
  };
  const lut = windowTable(await sampleWindow(sixteen));
  const bands = grey ? 1 : 3;
  const out = Buffer.allocUnsafe(facts.width * facts.height * bands);
  let written = 0;
  let carry: number | null = null;
  for await (const chunk of sixteen().raw({ depth: 'ushort' }) as AsyncIterable<Buffer>) {
    let i = 0;
    if (carry !== null) {
      out[written++] = lut[carry | (chunk[0]! << 8)]!;
      carry = null;
      i = 1;
    }
    for (; i + 1 < chunk.length; i += 2) out[written++] = lut[chunk[i]! | (chunk[i + 1]! << 8)]!;
    if (i < chunk.length) carry = chunk[i]!;
  }
  if (written !== out.length) throw new Error(`The 16-bit decode gave ${written} samples; expected ${out.length}.`);
  return () => sharp(out, { raw: { width: facts.width, height: facts.height, channels: bands }, limitInputPixels: maxPixels }).toColourspace(grey ? 'b-w' : 'srgb');
}

/** The low and high sample values of the display window, measured on a reduced copy. */
export async function sampleWindow(sixteen: () => Sharp): Promise<{ low: number; high: number }> {
  const { data } = await sixteen().resize(WINDOW_SAMPLE_EDGE, WINDOW_SAMPLE_EDGE, { fit: 'inside', withoutEnlargement: true }).raw({ depth: 'ushort' }).toBuffer({ resolveWithObject: true });
  const samples = new Uint16Array(Uint8Array.from(data).buffer);
  const histogram = new Uint32Array(65536);
  for (const v of samples) histogram[v]!++;
  const at = (fraction: number) => {
    const target = fraction * samples.length;
    let seen = 0;
    for (let v = 0; v < histogram.length; v++) {
      seen += histogram[v]!;
      if (seen > target) return v;
    }
    return 65535;
  };
  const low = at(WINDOW_PERCENTILES.low);
  return { low, high: Math.max(at(WINDOW_PERCENTILES.high), low + 1) };
}

/** 16-bit sample → 8-bit display value: 0 at or below `low`, 255 at or above `high`, linear between. */
export function windowTable({ low, high }: { low: number; high: number }): Uint8Array {
  const table = new Uint8Array(65536);
  for (let v = 0; v < table.length; v++) table[v] = v <= low ? 0 : v >= high ? 255 : Math.round(((v - low) * 255) / (high - low));
  return table;
}
