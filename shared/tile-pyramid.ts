/**
 * Deep Zoom pyramid arithmetic: level 0 is 1×1 px, the top level is the full image,
 * and each level below halves the one above, rounding up. The IIIF scale factors
 * of the same tile set follow from it. Pure functions, used by the server, the tests and the viewer.
 */

/** Etchfile's tile edge, px. */
export const TILE_SIZE = 256;

export interface LevelSize {
  level: number;
  width: number;
  height: number;
  columns: number;
  rows: number;
}

/** Number of levels: ⌈log2(max(W, H))⌉ + 1, counted by halving so no floating-point log is involved. */
export function deepZoomLevelCount(width: number, height: number): number {
  assertSize(width, height);
  let n = Math.max(width, height);
  let levels = 1;
  while (n > 1) {
    n = Math.ceil(n / 2);
    levels++;
  }
  return levels;
}

/** Size and tile grid of one level (0 = 1×1, levelCount − 1 = full size). */
export function levelSize(width: number, height: number, level: number, tileSize = TILE_SIZE): LevelSize {
  const top = deepZoomLevelCount(width, height) - 1;
  if (!Number.isInteger(level) || level < 0 || level > top) throw new RangeError(`Level ${level} is outside 0…${top}.`);
  const scale = 2 ** (top - level);
  const w = Math.ceil(width / scale);
  const h = Math.ceil(height / scale);
  return { level, width: w, height: h, columns: Math.ceil(w / tileSize), rows: Math.ceil(h / tileSize) };
}

/** Every level, from 0 (1×1) to the full image. */
export function pyramidLevels(width: number, height: number, tileSize = TILE_SIZE): LevelSize[] {
  const count = deepZoomLevelCount(width, height);
  return Array.from({ length: count }, (_, level) => levelSize(width, height, level, tileSize));
}

/** Total tiles over all levels. */
export function totalTileCount(width: number, height: number, tileSize = TILE_SIZE): number {
  return pyramidLevels(width, height, tileSize).reduce((sum, l) => sum + l.columns * l.rows, 0);
}

/**
 * IIIF scale factors of the pyramid: 1, 2, 4… down to the first level that fits in one tile
 * (smaller levels add nothing a viewer needs).
 */
export function iiifScaleFactors(width: number, height: number, tileSize = TILE_SIZE): number[] {
  const levels = pyramidLevels(width, height, tileSize).reverse();
  const factors: number[] = [];
  for (const [i, l] of levels.entries()) {
    factors.push(2 ** i);
    if (l.columns === 1 && l.rows === 1) break;
  }
  return factors;
}

function assertSize(width: number, height: number): void {
  if (!Number.isInteger(width) || !Number.isInteger(height) || width < 1 || height < 1) {
    throw new RangeError(`An image size must be whole pixels ≥ 1; got ${width}×${height}.`);
  }
}
