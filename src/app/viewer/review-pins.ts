import { distance, type Point } from '../../../shared/annotations/geometry';
import type { CommentThread, ThreadAnchor } from '../../../shared/reviews';
import { imageToScreen, type Viewport } from '../../../shared/viewer/viewport';
import { boundsOf, pointInRing, type Bounds } from './hit-test';

/**
 * Comment threads as pins on the micrograph: where each one sits, which one the pointer is on,
 * and the anchor a drawn pin gives a new thread. Pure.
 */

/** What a pin drawn on the canvas anchors a thread to. */
export type PinAnchor = Extract<ThreadAnchor, { kind: 'point' | 'region' }>;

/** A thread drawn on the image: a numbered marker, and the region's outline when it has one. */
export interface ViewPin {
  threadId: string;
  /** 1 for the oldest thread: the number on the marker and in the side list. */
  number: number;
  open: boolean;
  /** Where the marker sits, in image pixels. */
  at: Point;
  ring: Point[] | null;
}

/** Screen pixels: the marker's radius, and how near the pointer must come to a region's outline. */
export const PIN_RADIUS_PX = 10;

/** Pins of the threads pinned to a point or a region (measurement threads show with their measurement), oldest first. */
export function pinsFromThreads(threads: readonly CommentThread[]): ViewPin[] {
  return [...threads]
    .sort((a, b) => a.createdAt.localeCompare(b.createdAt) || a.id.localeCompare(b.id))
    .flatMap((t, i): ViewPin[] => {
      const a = t.anchor;
      const base = { threadId: t.id, number: i + 1, open: t.status === 'open' };
      if (a.kind === 'point') return [{ ...base, at: a.at, ring: null }];
      if (a.kind === 'region') return [{ ...base, at: ringMarker(a.ring), ring: a.ring }];
      return [];
    });
}

/** A region's marker goes on its top-left corner (smallest y, then x), where it covers least of the region. */
function ringMarker(ring: readonly Point[]): Point {
  let best = ring[0]!;
  for (const p of ring) if (p[1] < best[1] || (p[1] === best[1] && p[0] < best[0])) best = p;
  return [best[0], best[1]];
}

/**
 * The pin under `p` (`unit` is image pixels per screen pixel): markers first, newest on top,
 * then the inside of a region, smallest region first so nested ones stay reachable.
 */
export function pinUnder(pins: readonly ViewPin[], p: Point, unit: number): string | null {
  for (let i = pins.length - 1; i >= 0; i--) {
    if (distance(pins[i]!.at, p) <= PIN_RADIUS_PX * unit) return pins[i]!.threadId;
  }
  const inside = pins.filter((pin) => pin.ring && pointInRing(p, pin.ring));
  if (inside.length === 0) return null;
  const area = (b: Bounds) => (b.maxX - b.minX) * (b.maxY - b.minY);
  return inside.reduce((a, b) => (area(boundsOf(b.ring!)) < area(boundsOf(a.ring!)) ? b : a)).threadId;
}

/** What the view should frame to show a pin: its region, or a small box around its point. */
export function pinFrame(pin: ViewPin, image: { width: number; height: number }): Bounds {
  if (pin.ring) return boundsOf(pin.ring);
  // A point gets a tenth of the image's shorter side around it, so some context shows.
  const half = Math.max(20, Math.min(image.width, image.height) / 20);
  return { minX: pin.at[0] - half, minY: pin.at[1] - half, maxX: pin.at[0] + half, maxY: pin.at[1] + half };
}

/** The anchor a finished pin draft gives: one point, or the four corners of the dragged box. */
export function anchorFromDraft(points: readonly Point[]): PinAnchor {
  if (points.length === 1) return { kind: 'point', at: [round(points[0]![0]), round(points[0]![1])] };
  return { kind: 'region', ring: points.map(([x, y]) => [round(x), round(y)] as [number, number]) };
}

/** Screen px: the new-thread card's size, for keeping it inside the canvas. */
const CARD = { width: 356, height: 260 };

/** Where the card for a new thread goes: below and right of the pin (a region's lower right corner), inside the canvas. */
export function cardNear(v: Viewport, anchor: PinAnchor): { x: number; y: number } {
  const at = anchor.kind === 'point' ? anchor.at : boundsCorner(anchor.ring);
  const s = imageToScreen(v, at[0], at[1]);
  return { x: Math.max(8, Math.min(s.x + 12, v.width - CARD.width)), y: Math.max(8, Math.min(s.y + 12, v.height - CARD.height)) };
}

function boundsCorner(ring: readonly Point[]): Point {
  const b = boundsOf(ring);
  return [b.maxX, b.maxY];
}

/** Tenths of a pixel: finer than anyone can point, coarser than floating-point noise. */
function round(v: number): number {
  return Math.round(v * 10) / 10;
}
