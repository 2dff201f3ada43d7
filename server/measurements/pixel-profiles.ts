import sharp from 'sharp';

type Point = [number, number];

/** A rectangle of an original's pixels, as floats on the 0-255 scale whatever the bit depth. */
export interface PixelWindow {
  left: number;
  top: number;
  width: number;
  height: number;
  channels: number;
  data: Float32Array;
}

export interface WindowBox {
  left: number;
  top: number;
  width: number;
  height: number;
}

/** What the reader needs to know about the original, from its row. */
export interface OriginalFacts {
  width: number;
  height: number;
  bitDepth: number;
  channels: number;
}

/** The smallest pixel rectangle holding every point, one pixel of margin for the interpolation, inside the image. */
export function boxAround(chains: readonly (readonly Point[])[], image: OriginalFacts): WindowBox {
  let [x0, y0, x1, y1] = [Infinity, Infinity, -Infinity, -Infinity];
  for (const c of chains) for (const [x, y] of c) [x0, y0, x1, y1] = [Math.min(x0, x), Math.min(y0, y), Math.max(x1, x), Math.max(y1, y)];
  const left = Math.max(0, Math.floor(x0) - 1);
  const top = Math.max(0, Math.floor(y0) - 1);
  const right = Math.min(image.width, Math.ceil(x1) + 1);
  const bottom = Math.min(image.height, Math.ceil(y1) + 1);
  return { left, top, width: Math.max(1, right - left), height: Math.max(1, bottom - top) };
}

/**
 * Decodes one rectangle of the original as grey (one band) or colour (three bands). Alpha is
 * dropped; 16-bit samples are divided by 257 so both depths land on 0-255 (the detectors' noise
 * and range thresholds are relative, but one scale keeps logs and tests comparable).
 */
export async function readWindow(input: string | Buffer, image: OriginalFacts, box: WindowBox, mode: 'grey' | 'colour', maxPixels: number): Promise<PixelWindow> {
  const sixteen = image.bitDepth > 8;
  const s = sharp(input, { limitInputPixels: maxPixels, failOn: 'truncated', page: 0 }).extract(box);
  if (image.channels === 2 || image.channels === 4) s.removeAlpha();
  s.toColourspace(mode === 'grey' ? (sixteen ? 'grey16' : 'b-w') : sixteen ? 'rgb16' : 'srgb');
  const { data, info } = await (sixteen ? s.raw({ depth: 'ushort' }) : s.raw()).toBuffer({ resolveWithObject: true });
  const values = new Float32Array(info.width * info.height * info.channels);
  if (sixteen) {
    const words = new Uint16Array(data.buffer, data.byteOffset, values.length);
    for (let i = 0; i < values.length; i++) values[i] = words[i]! / 257;
  } else {
    for (let i = 0; i < values.length; i++) values[i] = data[i]!;
  }
  return { ...box, channels: info.channels, data: values };
}

/**
 * One sample per pixel of arc length along a chain, by bilinear interpolation between pixel
 * centres (pixel (i, j) covers [i, i+1) × [j, j+1), so its centre is at i + ½). Returns the
 * profile per channel; sample k lies k px along the chain from its start.
 */
export function sampleChain(win: PixelWindow, chain: readonly Point[]): number[][] {
  const positions = stepsAlong(chain);
  const n = positions.length;
  const out = Array.from({ length: win.channels }, () => new Array<number>(n));
  for (let k = 0; k < n; k++) {
    const [x, y] = positions[k]!;
    const fx = clamp(x - 0.5 - win.left, 0, win.width - 1);
    const fy = clamp(y - 0.5 - win.top, 0, win.height - 1);
    const [ix, iy] = [Math.floor(fx), Math.floor(fy)];
    const [jx, jy] = [Math.min(ix + 1, win.width - 1), Math.min(iy + 1, win.height - 1)];
    const [wx, wy] = [fx - ix, fy - iy];
    for (let c = 0; c < win.channels; c++) {
      const at = (px: number, py: number) => win.data[(py * win.width + px) * win.channels + c]!;
      const top = at(ix, iy) * (1 - wx) + at(jx, iy) * wx;
      const bottom = at(ix, jy) * (1 - wx) + at(jx, jy) * wx;
      out[c]![k] = top * (1 - wy) + bottom * wy;
    }
  }
  return out;
}

/** The point `s` px of arc length along a chain (clamped to its ends). */
export function pointAlong(chain: readonly Point[], s: number): Point {
  let left = Math.max(0, s);
  for (let i = 1; i < chain.length; i++) {
    const [a, b] = [chain[i - 1]!, chain[i]!];
    const len = Math.hypot(b[0] - a[0], b[1] - a[1]);
    if (left <= len && len > 0) return [a[0] + ((b[0] - a[0]) * left) / len, a[1] + ((b[1] - a[1]) * left) / len];
    left -= len;
  }
  const last = chain[chain.length - 1]!;
  return [last[0], last[1]];
}

/** Points at 0, 1, 2 … px of arc length along a chain, walked once (circles have hundreds of short pieces). */
export function stepsAlong(chain: readonly Point[]): Point[] {
  const out: Point[] = [[chain[0]![0], chain[0]![1]]];
  let next = 1; // arc length of the next point to emit
  let done = 0; // arc length at the start of the current piece
  for (let i = 1; i < chain.length; i++) {
    const [a, b] = [chain[i - 1]!, chain[i]!];
    const len = Math.hypot(b[0] - a[0], b[1] - a[1]);
    for (; next <= done + len; next++) {
      const t = (next - done) / len;
      out.push([a[0] + (b[0] - a[0]) * t, a[1] + (b[1] - a[1]) * t]);
    }
    done += len;
  }
  return out;
}

function clamp(v: number, lo: number, hi: number): number {
  return Math.min(hi, Math.max(lo, v));
}
