import sharp from 'sharp';

/** A seeded generator (mulberry32): the demo's pictures come out the same on every machine. */
export function seededRandom(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/**
 * Grain labels of a jittered-grid tessellation with cells of `cell` px: each pixel belongs to the
 * nearest seed among the 3 × 3 neighbouring cells, which keeps large pictures fast to draw.
 */
function tessellate(width: number, height: number, cell: number, rnd: () => number, offset: number): Int32Array {
  const cols = Math.ceil(width / cell) + 2;
  const rows = Math.ceil(height / cell) + 2;
  const seeds = Array.from({ length: cols * rows }, (_, i) => [((i % cols) - 1 + rnd()) * cell, (Math.floor(i / cols) - 1 + rnd()) * cell] as const);
  const labels = new Int32Array(width * height);
  for (let y = 0; y < height; y++) {
    const cy = Math.floor(y / cell) + 1;
    for (let x = 0; x < width; x++) {
      const cx = Math.floor(x / cell) + 1;
      let best = 0;
      let bestD = Infinity;
      for (let j = cy - 1; j <= cy + 1; j++) {
        for (let i = cx - 1; i <= cx + 1; i++) {
          const s = seeds[j * cols + i]!;
          const d = (s[0] - x) ** 2 + (s[1] - y) ** 2;
          if (d < bestD) [best, bestD] = [j * cols + i, d];
        }
      }
      labels[y * width + x] = best + offset;
    }
  }
  return labels;
}

/** Where the bond interface runs in the demo pictures (a gentle wave, as rolled interfaces are). */
const interfaceY = (x: number, height: number) => height * 0.52 + 18 * Math.sin(x / 95) + 7 * Math.sin(x / 23);

/** A two-layer laminate: fine grains above the bond interface, coarser below; labels per pixel. */
export function laminateLabels(width: number, height: number, seed: number): Int32Array {
  const rnd = seededRandom(seed);
  const fine = tessellate(width, height, 34, rnd, 0);
  const coarse = tessellate(width, height, 70, rnd, 1_000_000);
  return fine.map((l, i) => (i / width < interfaceY(i % width, height) ? l : coarse[i]!));
}

/** An etched light micrograph of the laminate: grey grains, dark boundaries, a dark interface with oxide particles. */
export async function etchedLaminate(labels: Int32Array, width: number, height: number, seed: number, umPerPx: number): Promise<Buffer> {
  const rnd = seededRandom(seed + 1);
  const shade = new Map<number, number>();
  const grey = new Uint8Array(width * height);
  for (let y = 0; y < height; y++) {
    for (let x = 0; x < width; x++) {
      const i = y * width + x;
      const l = labels[i]!;
      const edge = (x > 0 && labels[i - 1] !== l) || (x < width - 1 && labels[i + 1] !== l) || (y > 0 && labels[i - width] !== l) || (y < height - 1 && labels[i + width] !== l);
      if (!shade.has(l)) shade.set(l, 150 + rnd() * 75);
      grey[i] = edge ? 55 : shade.get(l)!;
    }
  }
  // Oxide particles strung along the interface: small dark ellipses.
  for (let x = 10; x < width - 10; x += 14 + Math.floor(rnd() * 30)) {
    const cy = interfaceY(x, height);
    const [rx, ry] = [2 + rnd() * 4, 1.5 + rnd() * 2.5];
    for (let y = Math.floor(cy - ry - 1); y <= cy + ry + 1; y++) {
      for (let xx = Math.floor(x - rx - 1); xx <= x + rx + 1; xx++) {
        if (((xx - x) / rx) ** 2 + ((y - cy) / ry) ** 2 <= 1 && y >= 0 && y < height) grey[y * width + xx] = 25;
      }
    }
  }
  const noisy = grey.map((v) => Math.max(0, Math.min(255, Math.round(v + 5 * (rnd() + rnd() + rnd() - 1.5)))));
  // TIFF resolution in pixels per mm (libvips' unit), so ingest reads a real calibration from the tags.
  return sharp(Buffer.from(noisy), { raw: { width, height, channels: 1 } })
    .blur(0.7)
    .toColourspace('b-w')
    .tiff({ compression: 'lzw', xres: 1000 / umPerPx, yres: 1000 / umPerPx, resolutionUnit: 'cm' })
    .toBuffer();
}

/** The same field as an orientation map rendering: one flat colour per grain. PNG, no calibration. */
export async function orientationLaminate(labels: Int32Array, width: number, height: number, seed: number): Promise<Buffer> {
  const rnd = seededRandom(seed + 2);
  const colours = new Map<number, number[]>();
  const rgb = Buffer.alloc(width * height * 3);
  labels.forEach((l, i) => {
    if (!colours.has(l)) colours.set(l, [rnd() * 255, rnd() * 255, rnd() * 255].map(Math.round));
    rgb.set(colours.get(l)!, i * 3);
  });
  return sharp(rgb, { raw: { width, height, channels: 3 } }).png().toBuffer();
}
