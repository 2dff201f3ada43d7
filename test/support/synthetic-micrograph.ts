import sharp from 'sharp';
import { seededRandom } from '../../server/demo/demo-micrographs';

export { seededRandom };

/** A Voronoi tessellation: the grain label of every pixel (nearest of `grains` random seeds). */
export function voronoiLabels(width: number, height: number, grains: number, seed: number): Int32Array {
  const rnd = seededRandom(seed);
  const seeds = Array.from({ length: grains }, () => [rnd() * width, rnd() * height] as const);
  const labels = new Int32Array(width * height);
  for (let y = 0; y < height; y++) {
    for (let x = 0; x < width; x++) {
      let best = 0;
      let bestD = Infinity;
      for (let g = 0; g < grains; g++) {
        const d = (seeds[g]![0] - x) ** 2 + (seeds[g]![1] - y) ** 2;
        if (d < bestD) [best, bestD] = [g, d];
      }
      labels[y * width + x] = best;
    }
  }
  return labels;
}

/** Gaussian noise by Box-Muller from the seeded generator. */
function gaussian(rnd: () => number): number {
  return Math.sqrt(-2 * Math.log(rnd() + 1e-12)) * Math.cos(2 * Math.PI * rnd());
}

/**
 * An etched light micrograph of the tessellation: grains in grey levels, boundaries dark (the pixels on
 * both sides of a label change), slightly blurred, with Gaussian noise. Returned as PNG bytes made by sharp.
 */
export async function etchedMicrograph(labels: Int32Array, width: number, height: number, seed: number, noiseSigma = 6): Promise<Buffer> {
  const rnd = seededRandom(seed + 1);
  const shade = new Map<number, number>();
  const grey = new Uint8Array(width * height);
  for (let y = 0; y < height; y++) {
    for (let x = 0; x < width; x++) {
      const i = y * width + x;
      const l = labels[i]!;
      const boundary = (x > 0 && labels[i - 1] !== l) || (x < width - 1 && labels[i + 1] !== l) || (y > 0 && labels[i - width] !== l) || (y < height - 1 && labels[i + width] !== l);
      if (!shade.has(l)) shade.set(l, 150 + rnd() * 70);
      grey[i] = boundary ? 60 : shade.get(l)!;
    }
  }
  const blurred = await sharp(grey, { raw: { width, height, channels: 1 } }).blur(0.8).extractChannel(0).raw().toBuffer();
  const noisy = Buffer.from(blurred.map((v) => Math.max(0, Math.min(255, Math.round(v + noiseSigma * gaussian(rnd))))));
  return sharp(noisy, { raw: { width, height, channels: 1 } }).toColourspace('b-w').png().toBuffer();
}

/** An orientation-map rendering: one flat colour per grain, no boundary lines. PNG bytes. */
export async function orientationMap(labels: Int32Array, width: number, height: number, seed: number): Promise<Buffer> {
  const rnd = seededRandom(seed + 2);
  const colours = new Map<number, [number, number, number]>();
  const rgb = Buffer.alloc(width * height * 3);
  labels.forEach((l, i) => {
    if (!colours.has(l)) colours.set(l, [rnd() * 255, rnd() * 255, rnd() * 255].map(Math.round) as [number, number, number]);
    rgb.set(colours.get(l)!, i * 3);
  });
  return sharp(rgb, { raw: { width, height, channels: 3 } }).png().toBuffer();
}

/** True intersections along row y of the label image: every change of grain label. */
export function labelChangesAlongRow(labels: Int32Array, width: number, y: number): number {
  let n = 0;
  for (let x = 1; x < width; x++) if (labels[y * width + x] !== labels[y * width + x - 1]) n++;
  return n;
}
