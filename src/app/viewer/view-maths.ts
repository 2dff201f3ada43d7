import { MAX_SCALE, screenToImage, zoomAround, type ImageSize, type Viewport } from '../../../shared/viewer/viewport';
import type { Bounds } from './hit-test';

/**
 * View arithmetic the viewer adds to shared/viewer/viewport.ts: the overview's outline, moving
 * to a place or a shape, resizing, pinching. Pure.
 */

/** The view's outline on an overview picture `boxWidth` × `boxHeight` px showing the whole image, clipped to it. */
export function overviewRect(v: Viewport, image: ImageSize, boxWidth: number, boxHeight: number): { x: number; y: number; width: number; height: number } {
  const k = Math.min(boxWidth / image.width, boxHeight / image.height);
  const x0 = Math.max(0, v.x);
  const y0 = Math.max(0, v.y);
  const x1 = Math.min(image.width, v.x + v.width / v.scale);
  const y1 = Math.min(image.height, v.y + v.height / v.scale);
  return { x: x0 * k, y: y0 * k, width: Math.max(0, x1 - x0) * k, height: Math.max(0, y1 - y0) * k };
}

/** The image point under a click on the overview. */
export function overviewToImage(image: ImageSize, boxWidth: number, boxHeight: number, ox: number, oy: number): { x: number; y: number } {
  const k = Math.min(boxWidth / image.width, boxHeight / image.height);
  return { x: ox / k, y: oy / k };
}

/** The same zoom, centred on an image point. */
export function centreOn(v: Viewport, ix: number, iy: number): Viewport {
  return { ...v, x: ix - v.width / 2 / v.scale, y: iy - v.height / 2 / v.scale };
}

/**
 * A view that shows `b` whole with `marginPx` screen pixels around it, no closer than
 * `maxScale` (a point or a tiny shape should not fill the screen with single pixels).
 */
export function viewportForBounds(v: Viewport, b: Bounds, marginPx = 48, maxScale = 4): Viewport {
  const w = Math.max(1, b.maxX - b.minX);
  const h = Math.max(1, b.maxY - b.minY);
  const room = (n: number) => Math.max(1, n - 2 * marginPx);
  const scale = Math.min(maxScale, MAX_SCALE, room(v.width) / w, room(v.height) / h);
  return centreOn({ ...v, scale }, (b.minX + b.maxX) / 2, (b.minY + b.maxY) / 2);
}

/** The screen changed size: keep the image point at the centre where it was, at the same zoom. */
export function resizeViewport(v: Viewport, width: number, height: number): Viewport {
  const c = screenToImage(v, v.width / 2, v.height / 2);
  return centreOn({ ...v, width, height }, c.x, c.y);
}

/**
 * Keeps some of the image on screen: at least `keep` of the smaller of view and image overlaps,
 * so the image can never be panned off and lost.
 */
export function keepInView(v: Viewport, image: ImageSize, keep = 0.25): Viewport {
  const clamp = (pos: number, span: number, size: number) => {
    const overlap = keep * Math.min(span, size);
    return Math.min(size - overlap, Math.max(overlap - span, pos));
  };
  return { ...v, x: clamp(v.x, v.width / v.scale, image.width), y: clamp(v.y, v.height / v.scale, image.height) };
}

/** Two fingers moved: zoom by the change of their distance around their midpoint, and pan with the midpoint. */
export function pinch(
  v: Viewport,
  image: ImageSize,
  before: [{ x: number; y: number }, { x: number; y: number }],
  after: [{ x: number; y: number }, { x: number; y: number }],
): Viewport {
  const d0 = Math.hypot(before[1].x - before[0].x, before[1].y - before[0].y);
  const d1 = Math.hypot(after[1].x - after[0].x, after[1].y - after[0].y);
  const m0 = { x: (before[0].x + before[1].x) / 2, y: (before[0].y + before[1].y) / 2 };
  const m1 = { x: (after[0].x + after[1].x) / 2, y: (after[0].y + after[1].y) / 2 };
  const zoomed = d0 > 0 ? zoomAround(v, image, d1 / d0, m0.x, m0.y) : v;
  return { ...zoomed, x: zoomed.x - (m1.x - m0.x) / zoomed.scale, y: zoomed.y - (m1.y - m0.y) / zoomed.scale };
}

/** Zoom factor for a wheel turn: smooth for touchpads (small deltas), one notch ≈ ×1.2 for mice. */
export function wheelZoomFactor(deltaY: number, deltaMode: number): number {
  const px = deltaMode === 1 ? deltaY * 16 : deltaMode === 2 ? deltaY * 400 : deltaY;
  return Math.exp(-Math.max(-300, Math.min(300, px)) * 0.0015);
}
