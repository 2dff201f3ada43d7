import { levelSize, deepZoomLevelCount, TILE_SIZE } from '../tile-pyramid';

/**
 * The view onto an image: `scale` screen px per image px, and the image point at the
 * screen's top-left corner. Pure maths shared by the viewer and its tests.
 */
export interface Viewport {
  scale: number;
  x: number;
  y: number;
  /** Screen size, px. */
  width: number;
  height: number;
}

export interface ImageSize {
  width: number;
  height: number;
}

export const MIN_SCALE_FACTOR = 0.5; // of the fit scale: a little room around the whole image
export const MAX_SCALE = 32; // screen px per image px: single pixels become blocks

/** The whole image centred in the screen. */
export function fitViewport(image: ImageSize, screenWidth: number, screenHeight: number): Viewport {
  const scale = Math.min(screenWidth / image.width, screenHeight / image.height);
  return {
    scale,
    x: image.width / 2 - screenWidth / scale / 2,
    y: image.height / 2 - screenHeight / scale / 2,
    width: screenWidth,
    height: screenHeight,
  };
}

/** Image coordinates under a screen point. */
export function screenToImage(v: Viewport, sx: number, sy: number): { x: number; y: number } {
  return { x: v.x + sx / v.scale, y: v.y + sy / v.scale };
}

export function imageToScreen(v: Viewport, ix: number, iy: number): { x: number; y: number } {
  return { x: (ix - v.x) * v.scale, y: (iy - v.y) * v.scale };
}

/** Zooms by `factor` keeping the image point under (sx, sy) where it is on screen. */
export function zoomAround(v: Viewport, image: ImageSize, factor: number, sx: number, sy: number): Viewport {
  const minScale = fitViewport(image, v.width, v.height).scale * MIN_SCALE_FACTOR;
  const scale = Math.min(MAX_SCALE, Math.max(minScale, v.scale * factor));
  const anchor = screenToImage(v, sx, sy);
  return { ...v, scale, x: anchor.x - sx / scale, y: anchor.y - sy / scale };
}

/** Moves the view by a screen-pixel drag. */
export function panBy(v: Viewport, dxScreen: number, dyScreen: number): Viewport {
  return { ...v, x: v.x - dxScreen / v.scale, y: v.y - dyScreen / v.scale };
}

/** One image pixel per screen pixel, centred where the view is centred now. */
export function actualPixels(v: Viewport): Viewport {
  const centre = screenToImage(v, v.width / 2, v.height / 2);
  return { ...v, scale: 1, x: centre.x - v.width / 2, y: centre.y - v.height / 2 };
}

/**
 * The pyramid level to draw: the smallest whose pixels are at least as fine as the
 * screen's (so tiles are only ever scaled down, never blurred up), capped at full size.
 */
export function levelForScale(image: ImageSize, scale: number): number {
  const top = deepZoomLevelCount(image.width, image.height) - 1;
  const down = Math.max(0, Math.floor(Math.log2(1 / scale) + 1e-9));
  return Math.max(0, top - down);
}

export interface TileRef {
  level: number;
  col: number;
  row: number;
}

/** The tiles of `level` that intersect the view, row by row. */
export function visibleTiles(v: Viewport, image: ImageSize, level: number, tileSize = TILE_SIZE): TileRef[] {
  const top = deepZoomLevelCount(image.width, image.height) - 1;
  const size = levelSize(image.width, image.height, level, tileSize);
  const factor = 2 ** (top - level); // image px per level px
  const span = tileSize * factor; // image px per tile
  const x0 = Math.max(0, Math.floor(v.x / span));
  const y0 = Math.max(0, Math.floor(v.y / span));
  const x1 = Math.min(size.columns - 1, Math.floor((v.x + v.width / v.scale) / span));
  const y1 = Math.min(size.rows - 1, Math.floor((v.y + v.height / v.scale) / span));
  const tiles: TileRef[] = [];
  for (let row = y0; row <= y1; row++) for (let col = x0; col <= x1; col++) tiles.push({ level, col, row });
  return tiles;
}
