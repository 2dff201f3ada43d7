import type { Viewport } from '../../../shared/viewer/viewport';
import { centreOn } from './view-maths';

/** The view a glide from `from` to `to` shows at `t` (0…1): centre eased, zoom eased on a log scale. Pure. */
export function flightView(from: Viewport, to: Viewport, t: number): Viewport {
  const k = t * (2 - t);
  const c0 = { x: from.x + from.width / from.scale / 2, y: from.y + from.height / from.scale / 2 };
  const c1 = { x: to.x + to.width / to.scale / 2, y: to.y + to.height / to.scale / 2 };
  const scale = Math.exp(Math.log(from.scale) + (Math.log(to.scale) - Math.log(from.scale)) * k);
  return centreOn({ ...from, scale }, c0.x + (c1.x - c0.x) * k, c0.y + (c1.y - c0.y) * k);
}

/**
 * Glides the view over `durationMs` with animation frames, or jumps when the person asked for
 * less motion. Returns a function that stops the glide.
 */
export function fly(from: Viewport, to: Viewport, apply: (v: Viewport) => void, durationMs = 280): () => void {
  if (matchMedia('(prefers-reduced-motion: reduce)').matches) {
    apply(to);
    return () => undefined;
  }
  const start = performance.now();
  let frame = 0;
  const step = (now: number) => {
    const t = Math.min(1, (now - start) / durationMs);
    apply(t < 1 ? flightView(from, to, t) : to);
    if (t < 1) frame = requestAnimationFrame(step);
  };
  frame = requestAnimationFrame(step);
  return () => cancelAnimationFrame(frame);
}
