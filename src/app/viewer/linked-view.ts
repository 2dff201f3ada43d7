import { apply, compose, determinant, invert, type Affine } from '../../../shared/viewer/alignment';
import { screenToImage, type Viewport } from '../../../shared/viewer/viewport';
import { centreOn } from './view-maths';

/**
 * Side-by-side and overlaid viewing of two images of one location: the view of the second image
 * that shows what the first view shows, and where an aligned image lands on the first's screen. Pure.
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

/**
 * The view of the target image, `size` screen px large, showing what view `v` of the source shows
 * once the two are aligned: the source's centre carried by `t` (source px → target px), and a zoom
 * divided by the transform's mean scale √|det t|. Rotation is not shown (viewports do not turn).
 */
export function alignedViewport(v: Viewport, t: Affine, size: { width: number; height: number }): Viewport {
  const centre = screenToImage(v, v.width / 2, v.height / 2);
  const [x, y] = apply(t, [centre.x, centre.y]);
  const scale = v.scale / Math.sqrt(Math.abs(determinant(t)));
  return centreOn({ ...v, ...size, scale }, x, y);
}

/**
 * Where the overlaid image lands on the main view's screen: the alignment `t` (other px → main px)
 * followed by the view (main px → screen px), as one matrix in canvas order.
 */
export function overlayMatrix(v: Viewport, t: Affine): Affine {
  return compose({ a: v.scale, b: 0, c: 0, d: v.scale, e: -v.x * v.scale, f: -v.y * v.scale }, t);
}

/**
 * An upright view of the overlaid image that covers what the main view shows, for choosing its
 * tiles: the box around the main screen's corners carried into the other image, at the screen px
 * per other px the overlay is drawn with (the transform's mean scale times the main zoom).
 */
export function overlayTileView(v: Viewport, t: Affine): Viewport {
  const back = invert(t);
  const corners = [[0, 0], [v.width, 0], [0, v.height], [v.width, v.height]].map(([sx, sy]) => {
    const p = screenToImage(v, sx!, sy!);
    return apply(back, [p.x, p.y]);
  });
  const xs = corners.map((c) => c[0]);
  const ys = corners.map((c) => c[1]);
  const scale = v.scale * Math.sqrt(Math.abs(determinant(t)));
  const x = Math.min(...xs);
  const y = Math.min(...ys);
  return { scale, x, y, width: Math.max(1, (Math.max(...xs) - x) * scale), height: Math.max(1, (Math.max(...ys) - y) * scale) };
}
