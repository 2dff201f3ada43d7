import { screenToImage, type Viewport } from '../../../shared/viewer/viewport';
import { centreOn } from './view-maths';

/**
 * Side-by-side viewing of two images of one location: the view of the second image that shows
 * what the first view shows. Pure.
 */
export interface LinkedImage {
  width: number;
  height: number;
  /** µm per pixel; null when uncalibrated. */
  umPerPx: number | null;
}

/**
 * The view of `b`, `size` screen pixels large, matching view `v` of `a`: the same place and field
 * in µm when both images are calibrated (a 50 µm feature is as large in both panes), otherwise the
 * same fraction of each image (both are assumed to frame the same field).
 */
export function linkedViewport(v: Viewport, a: LinkedImage, b: LinkedImage, size: { width: number; height: number }): Viewport {
  const centre = screenToImage(v, v.width / 2, v.height / 2);
  const calibrated = a.umPerPx && b.umPerPx;
  const kx = calibrated ? a.umPerPx! / b.umPerPx! : b.width / a.width;
  const ky = calibrated ? kx : b.height / a.height;
  // b pixels per a pixel is kx, so b's zoom (screen px per b px) is a's divided by it.
  const scale = v.scale / kx;
  return centreOn({ ...v, ...size, scale }, centre.x * kx, centre.y * ky);
}

/** Whether the link is by physical size (both calibrated) or only by image fractions. */
export function linkedByMicrometres(a: LinkedImage, b: LinkedImage): boolean {
  return !!(a.umPerPx && b.umPerPx);
}
