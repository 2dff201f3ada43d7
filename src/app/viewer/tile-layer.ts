import type Konva from 'konva';
import type { ImageSize, Viewport } from '../../../shared/viewer/viewport';
import { LruCache } from './lru-cache';
import { planTiles, tileKey, tileRect } from './tile-plan';

type KonvaModule = typeof Konva;

/** Decoded tiles kept: a few screens' worth at two or three levels. */
const TILE_CACHE_SIZE = 320;
/** Tile requests in flight at once (a browser opens about six connections per host anyway). */
const MAX_LOADING = 6;
/** A failed tile is tried again after this long. */
const RETRY_FAILED_MS = 15_000;
/** Tiles overlap by this many screen pixels so no hairline seam shows between them. */
const SEAM_PX = 0.6;

/**
 * The micrograph itself: the preview stretched over the whole image as the base, then Deep Zoom
 * tiles of the level that matches the screen, with coarser tiles standing in while finer ones
 * load. Only tiles in view are requested; decoded tiles live in a small LRU.
 */
export class TileLayer {
  readonly layer: Konva.Layer;
  private readonly base: Konva.Image;
  private readonly levels = new Map<number, Konva.Group>();
  private readonly nodes = new Map<string, Konva.Image>();
  private readonly cache: LruCache<string, HTMLImageElement>;
  private readonly loading = new Map<string, HTMLImageElement>();
  private readonly failed = new Map<string, number>();
  private shown = new Set<string>();
  private destroyed = false;
  private markDrawn: () => void = () => undefined;
  /** Resolves when the first tiles are placed to be drawn (the page holds other work back until then). */
  readonly firstDrawn = new Promise<void>((resolve) => (this.markDrawn = resolve));

  constructor(
    private readonly K: KonvaModule,
    private readonly image: ImageSize,
    private readonly tileUrl: (level: number, col: number, row: number) => string,
    previewUrl: string,
    /** Called when a tile arrived and the layer should be drawn again. */
    private readonly changed: () => void,
  ) {
    this.layer = new K.Layer({ listening: false });
    this.base = new K.Image({ image: undefined, x: 0, y: 0, width: image.width, height: image.height, listening: false, perfectDrawEnabled: false });
    this.layer.add(this.base);
    this.cache = new LruCache(TILE_CACHE_SIZE, (key) => {
      this.nodes.get(key)?.destroy();
      this.nodes.delete(key);
    });
    const preview = new window.Image();
    preview.onload = () => {
      if (this.destroyed) return;
      this.base.image(preview);
      this.changed();
    };
    preview.src = previewUrl;
  }

  /** Places what is loaded for view `v` and asks for what is missing. */
  update(v: Viewport, pixelRatio: number): void {
    const plan = planTiles(v, this.image, (key) => this.cache.has(key), pixelRatio);
    const next = new Set<string>();
    const overlap = SEAM_PX / v.scale;
    for (const t of plan.draw) {
      const key = tileKey(t);
      const img = this.cache.get(key);
      if (!img) continue;
      let node = this.nodes.get(key);
      if (!node) {
        const r = tileRect(this.image, t);
        node = new this.K.Image({ image: img, x: r.x, y: r.y, width: r.width, height: r.height, listening: false, perfectDrawEnabled: false });
        node.setAttr('tileWidth', r.width);
        node.setAttr('tileHeight', r.height);
        this.group(t.level).add(node);
        this.nodes.set(key, node);
      }
      node.width(node.getAttr('tileWidth') + overlap);
      node.height(node.getAttr('tileHeight') + overlap);
      node.visible(true);
      next.add(key);
    }
    for (const key of this.shown) if (!next.has(key)) this.nodes.get(key)?.visible(false);
    this.shown = next;
    if (next.size > 0) this.markDrawn();
    // Pixels as blocks once they are bigger than a device pixel: a micrograph shows what was measured.
    this.layer.imageSmoothingEnabled(v.scale * pixelRatio < 2);
    this.request(plan.fetch);
  }

  destroy(): void {
    this.destroyed = true;
    for (const img of this.loading.values()) img.src = '';
    this.loading.clear();
    this.layer.destroy();
  }

  private request(tiles: { level: number; col: number; row: number }[]): void {
    const now = Date.now();
    for (const t of tiles) {
      if (this.loading.size >= MAX_LOADING) return;
      const key = tileKey(t);
      if (this.loading.has(key) || this.cache.has(key)) continue;
      const failedAt = this.failed.get(key);
      if (failedAt !== undefined && now - failedAt < RETRY_FAILED_MS) continue;
      const img = new window.Image();
      this.loading.set(key, img);
      img.onload = () => {
        this.loading.delete(key);
        this.failed.delete(key);
        if (this.destroyed) return;
        this.cache.set(key, img);
        this.changed();
      };
      img.onerror = () => {
        this.loading.delete(key);
        this.failed.set(key, Date.now());
        if (!this.destroyed) this.changed();
      };
      img.src = this.tileUrl(t.level, t.col, t.row);
    }
  }

  /** One group per level, in level order, so finer tiles always lie over coarser ones. */
  private group(level: number): Konva.Group {
    let g = this.levels.get(level);
    if (g) return g;
    g = new this.K.Group({ listening: false });
    this.layer.add(g);
    this.levels.set(level, g);
    const ordered = [...this.levels.entries()].sort((a, b) => a[0] - b[0]);
    ordered.forEach(([, group], i) => group.zIndex(i + 1)); // index 0 is the preview
    return g;
  }
}
