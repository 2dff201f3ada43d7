/**
 * Aligning one image of a location onto another from matching points the person clicks: the fit,
 * applying and inverting it, how well the points agree, and which inputs cannot give a sensible
 * alignment. Pure; the server checks with it what the browser showed.
 *
 * Coordinates are full-resolution image pixels. A transform maps a point of the *other* image
 * (the one laid over) to the point of the *main* image it shows.
 */

/** A point in image pixels, [x, y]. */
export type Vec2 = readonly [number, number];

/** One matching pair: where a feature is on the main image and where the same feature is on the other. */
export interface PointPair {
  image: Vec2;
  other: Vec2;
}

/**
 * x' = a·x + c·y + e, y' = b·x + d·y + f: the order of canvas `setTransform(a, b, c, d, e, f)`
 * and of DOMMatrix, so the browser can draw with it as it is.
 */
export interface Affine {
  a: number;
  b: number;
  c: number;
  d: number;
  e: number;
  f: number;
}

/** Two pairs fix scale, rotation and shift (a similarity); three also fix shear and unequal scales (an affine). */
export type AlignmentKind = 'similarity' | 'affine';

export const MIN_PAIRS = 2;
export const MAX_PAIRS = 3;

/** Two clicks on one image closer than this (px) are taken as the same place. */
export const MIN_POINT_GAP_PX = 3;
/**
 * Three points count as on one line when the triangle's height over its longest side is less than
 * this fraction of that side (common practice, no source: 5 % leaves shear badly determined).
 */
export const COLLINEAR_RATIO = 0.05;
/** Main-image pixels per other-image pixel outside [1/MAX_SCALE, MAX_SCALE] is not the same field. */
export const MAX_SCALE = 100;
/** An affine that stretches one direction more than this many times the other is a mis-click, not optics. */
export const MAX_STRETCH = 5;

/** A fit and what it says about the two images. */
export interface AlignmentFit {
  kind: AlignmentKind;
  transform: Affine;
  /** Per pair, how far the transformed other point lands from the main point, main-image px. */
  residualsPx: number[];
  /**
   * Per pair, the same for the best similarity (scale, rotation, shift only). With three pairs the
   * affine goes through every point, so these say whether the images differ by more than that.
   */
  similarityResidualsPx: number[];
  /** Main-image px per other-image px along the transform's two principal directions, larger first. */
  scales: [number, number];
  /** Rotation of the other image on the main one, degrees; positive turns clockwise on screen (image y points down). */
  rotationDeg: number;
}

export function apply(t: Affine, p: Vec2): [number, number] {
  return [t.a * p[0] + t.c * p[1] + t.e, t.b * p[0] + t.d * p[1] + t.f];
}

export function determinant(t: Affine): number {
  return t.a * t.d - t.b * t.c;
}

/** The transform that undoes `t` (main-image px → other-image px). Throws for a singular one. */
export function invert(t: Affine): Affine {
  const det = determinant(t);
  if (!Number.isFinite(det) || Math.abs(det) < 1e-15) throw new RangeError('The transform squashes the image to a line and cannot be undone.');
  const a = t.d / det;
  const b = -t.b / det;
  const c = -t.c / det;
  const d = t.a / det;
  return { a, b, c, d, e: -(a * t.e + c * t.f), f: -(b * t.e + d * t.f) };
}

/** `first` then `second`: the point goes through `first`, its result through `second`. */
export function compose(second: Affine, first: Affine): Affine {
  return {
    a: second.a * first.a + second.c * first.b,
    b: second.b * first.a + second.d * first.b,
    c: second.a * first.c + second.c * first.d,
    d: second.b * first.c + second.d * first.d,
    e: second.a * first.e + second.c * first.f + second.e,
    f: second.b * first.e + second.d * first.f + second.f,
  };
}

/**
 * The least-squares similarity w = s·z + t, with points as complex numbers z = x + iy (other) and
 * w (main): after removing the centroids, s = Σ conj(z)·w / Σ |z|². Exact for two pairs.
 */
export function fitSimilarity(pairs: readonly PointPair[]): Affine {
  const { zc, wc, other, image } = centred(pairs);
  let re = 0;
  let im = 0;
  let norm = 0;
  other.forEach(([x, y], i) => {
    const [u, v] = image[i]!;
    re += x * u + y * v;
    im += x * v - y * u;
    norm += x * x + y * y;
  });
  const p = re / norm;
  const q = im / norm;
  return { a: p, b: q, c: -q, d: p, e: wc[0] - (p * zc[0] - q * zc[1]), f: wc[1] - (q * zc[0] + p * zc[1]) };
}

/**
 * The least-squares affine from three or more pairs: with centroids removed, the 2 × 2 linear part
 * solves the normal equations [Sxx Sxy; Sxy Syy]·[a c] = [Σx·u Σy·u] (and likewise for b, d with v).
 * Exact for three pairs not on one line.
 */
export function fitAffine(pairs: readonly PointPair[]): Affine {
  const { zc, wc, other, image } = centred(pairs);
  let sxx = 0, sxy = 0, syy = 0, sxu = 0, syu = 0, sxv = 0, syv = 0;
  other.forEach(([x, y], i) => {
    const [u, v] = image[i]!;
    sxx += x * x;
    sxy += x * y;
    syy += y * y;
    sxu += x * u;
    syu += y * u;
    sxv += x * v;
    syv += y * v;
  });
  const det = sxx * syy - sxy * sxy;
  const a = (sxu * syy - syu * sxy) / det;
  const c = (syu * sxx - sxu * sxy) / det;
  const b = (sxv * syy - syv * sxy) / det;
  const d = (syv * sxx - sxv * sxy) / det;
  return { a, b, c, d, e: wc[0] - (a * zc[0] + c * zc[1]), f: wc[1] - (b * zc[0] + d * zc[1]) };
}

/** Per pair, |t(other) − image| in main-image px. */
export function residuals(t: Affine, pairs: readonly PointPair[]): number[] {
  return pairs.map((p) => {
    const [x, y] = apply(t, p.other);
    return Math.hypot(x - p.image[0], y - p.image[1]);
  });
}

/**
 * The singular values of the linear part, larger first: σ₁² + σ₂² = a² + b² + c² + d² and
 * σ₁·σ₂ = |det|, so σ = (√(E + 2|det|) ± √(E − 2|det|)) / 2.
 */
export function principalScales(t: Affine): [number, number] {
  const sumSq = t.a * t.a + t.b * t.b + t.c * t.c + t.d * t.d;
  const det = Math.abs(determinant(t));
  const p = Math.sqrt(sumSq + 2 * det);
  const m = Math.sqrt(Math.max(0, sumSq - 2 * det));
  return [(p + m) / 2, (p - m) / 2];
}

/** The rotation of the nearest pure rotation (polar decomposition), degrees. */
export function rotationDegrees(t: Affine): number {
  return (Math.atan2(t.b - t.c, t.a + t.d) * 180) / Math.PI;
}

/**
 * Why these pairs cannot give a sensible alignment, in words a person can act on; null when they can.
 * Checks the count, points on top of each other, three points on one line, and the fitted transform's
 * scale, stretch and handedness.
 */
export function alignmentProblem(pairs: readonly PointPair[]): string | null {
  if (pairs.length < MIN_PAIRS || pairs.length > MAX_PAIRS) return `Pick ${MIN_PAIRS} or ${MAX_PAIRS} pairs of matching points (there are ${pairs.length}).`;
  for (const [side, label] of [['image', 'main'], ['other', 'compared']] as const) {
    const pts = pairs.map((p) => p[side]);
    if (pts.some(([x, y]) => !Number.isFinite(x) || !Number.isFinite(y))) return `A point on the ${label} image has no position.`;
    for (let i = 0; i < pts.length; i++) {
      for (let j = i + 1; j < pts.length; j++) {
        const gap = Math.hypot(pts[i]![0] - pts[j]![0], pts[i]![1] - pts[j]![1]);
        if (gap < MIN_POINT_GAP_PX) {
          return `Points ${i + 1} and ${j + 1} on the ${label} image are the same place (${gap.toFixed(1)} px apart); pick features far apart.`;
        }
      }
    }
    if (pts.length === 3 && flatness(pts) < COLLINEAR_RATIO) {
      return `The three points on the ${label} image lie on one line; move one of them well off the line through the others.`;
    }
  }
  const t = pairs.length === 2 ? fitSimilarity(pairs) : fitAffine(pairs);
  if (determinant(t) < 0) return 'These pairs would show the compared image mirrored; check that each point on it matches the main-image point with the same number.';
  const [big, small] = principalScales(t);
  if (big > MAX_SCALE || small < 1 / MAX_SCALE) {
    return `The pairs make the compared image ${formatScale(big > MAX_SCALE ? big : small)} × the size of the main one, which cannot be the same field; check the points.`;
  }
  if (big / small > MAX_STRETCH) return `The pairs stretch the compared image ${(big / small).toFixed(1)} times more one way than the other; check the points.`;
  return null;
}

/** The fit for 2 pairs (similarity) or 3 pairs (affine). Throws RangeError with `alignmentProblem`'s message when it is refused. */
export function fitAlignment(pairs: readonly PointPair[]): AlignmentFit {
  const problem = alignmentProblem(pairs);
  if (problem) throw new RangeError(problem);
  const kind: AlignmentKind = pairs.length === 2 ? 'similarity' : 'affine';
  const similarity = fitSimilarity(pairs);
  const transform = kind === 'similarity' ? similarity : fitAffine(pairs);
  return {
    kind,
    transform,
    residualsPx: residuals(transform, pairs),
    similarityResidualsPx: residuals(similarity, pairs),
    scales: principalScales(transform),
    rotationDeg: rotationDegrees(transform),
  };
}

/**
 * How the fitted scale compares with the one the two pixel sizes imply (other µm/px ÷ main µm/px):
 * the relative difference, e.g. 0.02 for 2 % larger; null when either image is uncalibrated.
 */
export function scaleDisagreement(fit: Pick<AlignmentFit, 'scales'>, mainUmPerPx: number | null, otherUmPerPx: number | null): number | null {
  if (!mainUmPerPx || !otherUmPerPx) return null;
  const expected = otherUmPerPx / mainUmPerPx;
  const fitted = Math.sqrt(fit.scales[0] * fit.scales[1]);
  return fitted / expected - 1;
}

/** The same pairs seen from the other image: its transform is the inverse. */
export function swapPairs(pairs: readonly PointPair[]): PointPair[] {
  return pairs.map((p) => ({ image: p.other, other: p.image }));
}

function centred(pairs: readonly PointPair[]): { zc: Vec2; wc: Vec2; other: Vec2[]; image: Vec2[] } {
  const n = pairs.length;
  const zc: Vec2 = [sum(pairs, (p) => p.other[0]) / n, sum(pairs, (p) => p.other[1]) / n];
  const wc: Vec2 = [sum(pairs, (p) => p.image[0]) / n, sum(pairs, (p) => p.image[1]) / n];
  return {
    zc,
    wc,
    other: pairs.map((p) => [p.other[0] - zc[0], p.other[1] - zc[1]] as const),
    image: pairs.map((p) => [p.image[0] - wc[0], p.image[1] - wc[1]] as const),
  };
}

/** Height of the triangle over its longest side, as a fraction of that side (0 on a line). */
function flatness([p, q, r]: readonly Vec2[]): number {
  const twiceArea = Math.abs((q![0] - p![0]) * (r![1] - p![1]) - (r![0] - p![0]) * (q![1] - p![1]));
  const longest = Math.max(Math.hypot(q![0] - p![0], q![1] - p![1]), Math.hypot(r![0] - q![0], r![1] - q![1]), Math.hypot(p![0] - r![0], p![1] - r![1]));
  return twiceArea / (longest * longest);
}

function sum<T>(items: readonly T[], f: (item: T) => number): number {
  return items.reduce((s, item) => s + f(item), 0);
}

function formatScale(k: number): string {
  return k >= 1 ? k.toFixed(0) : k.toPrecision(2);
}
