import { VIEWER_PATH } from '../../../shared/viewer/viewer-path';
import { fitViewport, levelForScale, visibleTiles } from '../../../shared/viewer/viewport';

/**
 * A head start for a viewer link, given by main.ts before Angular boots. Opened cold, the viewer
 * otherwise waits in turn for the app, the session check, its own code and konva, the image
 * record, and its first render before it asks for a tile. Here, at once and side by side: the
 * viewer's code and konva are loaded, the record is asked for, and the tiles of the first (fitted)
 * view are fetched into the browser's cache (they are served as immutable), where the canvas then
 * finds them. Nothing here is required: the page asks again through HttpClient whenever an early
 * answer is missing or not a success, and a failed import is simply retried by the router.
 */

/** Tiles fetched at once; the rest of the browser's six connections stay free for the app's code. */
const PARALLEL_TILES = 4;
/** A fitted view beyond this many tiles is unusual; then the page's own requests are left alone. */
const MAX_TILES = 64;
/** The viewer's frame around the canvas (tool rail and side panel; header and drawing bar), in CSS px. */
const FRAME = { wide: { width: 56 + 360, height: 56 + 56 }, narrow: { width: 56, height: 56 + 56 } };
const NARROW_BELOW_PX = 1024;

const early = new Map<string, Promise<unknown>>();

interface RecordShape {
  width: number;
  height: number;
  processing: { state: string };
}

/** Starts the early requests when `path` is a viewer page. */
export function headStartViewer(path: string, screen: { width: number; height: number; pixelRatio: number }): void {
  const m = VIEWER_PATH.exec(path);
  if (!m || typeof fetch !== 'function') return;
  // The same specifiers as the route and the page use, so these are the very chunks they load.
  void Promise.all([import('./viewer.routes'), import('./viewer-page')]).catch(() => undefined);
  void Promise.all([import('konva'), import('./micrograph-stage'), import('./viewer-interaction')]).catch(() => undefined);
  const url = `/api/projects/${m[1]}/images/${m[2]}`;
  const record = fetch(url, { credentials: 'same-origin', headers: { accept: 'application/json' } })
    .then((r) => (r.ok ? (r.json() as Promise<unknown>) : null))
    .catch(() => null);
  early.set(url, record);
  void record.then((r) => {
    if (isReadyRecord(r)) void warmTiles(firstViewTiles(url, r, screen));
  });
}

/** The early answer for `url` (null when it failed), once; null when none was started. */
export function takeEarly<T>(url: string): Promise<T | null> | null {
  const p = early.get(url);
  early.delete(url);
  return (p as Promise<T | null> | undefined) ?? null;
}

/** Tile URLs of the fitted first view, nearest the centre first, for a canvas of about this size. */
export function firstViewTiles(recordUrl: string, image: { width: number; height: number }, screen: { width: number; height: number; pixelRatio: number }): string[] {
  const frame = screen.width < NARROW_BELOW_PX ? FRAME.narrow : FRAME.wide;
  const height = screen.width < NARROW_BELOW_PX ? screen.height * 0.6 : screen.height;
  const v = fitViewport(image, Math.max(1, screen.width - frame.width), Math.max(1, height - frame.height));
  const level = levelForScale(image, v.scale * screen.pixelRatio);
  const tiles = visibleTiles(v, image, level);
  if (tiles.length > MAX_TILES) return [];
  const midCol = (Math.min(...tiles.map((t) => t.col)) + Math.max(...tiles.map((t) => t.col))) / 2;
  const midRow = (Math.min(...tiles.map((t) => t.row)) + Math.max(...tiles.map((t) => t.row))) / 2;
  return tiles
    .sort((a, b) => Math.hypot(a.col - midCol, a.row - midRow) - Math.hypot(b.col - midCol, b.row - midRow))
    .map((t) => `${recordUrl}/tiles/${t.level}/${t.col}_${t.row}.jpg`);
}

function isReadyRecord(r: unknown): r is RecordShape {
  const rec = r as Partial<RecordShape> | null;
  return !!rec && typeof rec.width === 'number' && typeof rec.height === 'number' && rec.processing?.state === 'ready';
}

async function warmTiles(urls: string[]): Promise<void> {
  const queue = [...urls];
  const worker = async () => {
    for (let url = queue.shift(); url; url = queue.shift()) {
      // Read to the end so the response is complete in the cache; a failure only loses the head start.
      await fetch(url, { credentials: 'same-origin', priority: 'low' } as RequestInit)
        .then((r) => r.blob())
        .catch(() => undefined);
    }
  };
  await Promise.all(Array.from({ length: PARALLEL_TILES }, worker));
}
