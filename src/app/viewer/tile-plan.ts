import { deepZoomLevelCount, TILE_SIZE } from '../../../shared/tile-pyramid';
import { levelForScale, screenToImage, visibleTiles, type ImageSize, type TileRef, type Viewport } from '../../../shared/viewer/viewport';

/**
 * Which Deep Zoom tiles to draw and fetch for a view. The level and the tiles in view come from
 * shared/viewer/viewport.ts; this adds where a tile sits on the image and what to show while it loads.
 * Pure.
 */

/** A rectangle in full-resolution image pixels. */
export interface ImageRect {
  x: number;
  y: number;
  width: number;
  height: number;
}

export function tileKey(t: TileRef): string {
  return `${t.level}/${t.col}_${t.row}`;
}

/** The part of the full image a tile covers, clipped at the image's right and bottom edges. */
export function tileRect(image: ImageSize, t: TileRef, tileSize = TILE_SIZE): ImageRect {
  const top = deepZoomLevelCount(image.width, image.height) - 1;
  const span = tileSize * 2 ** (top - t.level);
  const x = t.col * span;
  const y = t.row * span;
  return { x, y, width: Math.min(span, image.width - x), height: Math.min(span, image.height - y) };
}

/** The tile one level coarser that contains this one; null at level 0. */
export function parentTile(t: TileRef): TileRef | null {
  return t.level === 0 ? null : { level: t.level - 1, col: Math.floor(t.col / 2), row: Math.floor(t.row / 2) };
}

export interface TilePlan {
  /** The level that matches the screen. */
  level: number;
  /** Tiles to show, coarser levels first so finer ones cover them. */
  draw: TileRef[];
  /** Tiles of `level` still missing, nearest the view's centre first. */
  fetch: TileRef[];
}

/** How many levels up a missing tile may borrow a coarser stand-in from. */
export const PLACEHOLDER_LEVELS = 5;

/**
 * Tiles for the view at `pixelRatio` device pixels per screen pixel. A tile `isReady` reports
 * loaded is drawn; for one that is not, the nearest loaded ancestor stands in while it loads.
 */
export function planTiles(v: Viewport, image: ImageSize, isReady: (key: string) => boolean, pixelRatio = 1, tileSize = TILE_SIZE): TilePlan {
  const level = levelForScale(image, v.scale * pixelRatio);
  const wanted = visibleTiles(v, image, level, tileSize);
  const centre = screenToImage(v, v.width / 2, v.height / 2);
  const placeholders = new Map<string, TileRef>();
  const ready: TileRef[] = [];
  const fetch: TileRef[] = [];
  for (const t of wanted) {
    if (isReady(tileKey(t))) {
      ready.push(t);
      continue;
    }
    fetch.push(t);
    let up = parentTile(t);
    for (let i = 0; up && i < PLACEHOLDER_LEVELS; i++, up = parentTile(up)) {
      const key = tileKey(up);
      if (isReady(key)) {
        placeholders.set(key, up);
        break;
      }
    }
  }
  const distance = (t: TileRef) => {
    const r = tileRect(image, t, tileSize);
    return Math.hypot(r.x + r.width / 2 - centre.x, r.y + r.height / 2 - centre.y);
  };
  fetch.sort((a, b) => distance(a) - distance(b));
  const draw = [...placeholders.values()].sort((a, b) => a.level - b.level).concat(ready);
  return { level, draw, fetch };
}
