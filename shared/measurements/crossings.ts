/**
 * Suggested boundary crossings along a test line, from the pixel values sampled along it
 * (one sample per pixel of line). Two detectors: dark valleys for etched light micrographs
 * (boundaries etch dark) and colour or intensity steps for orientation maps and BSE images
 * (grains are flat regions that change abruptly). Suggestions only: a person confirms them.
 */
export type CrossingDetector = 'valleys' | 'steps';

/**
 * The detector that fits how an image was made: etched light micrographs and band-contrast maps show
 * boundaries as dark lines (valleys); orientation and phase maps and BSE images show grains as flat
 * tones that change at the boundary (steps). Other modalities have no sensible default (null).
 */
export function defaultDetector(modality: string): CrossingDetector | null {
  if (modality.startsWith('lom_') || modality === 'ebsd_band_contrast') return 'valleys';
  if (modality === 'sem_backscattered' || modality === 'ebsd_orientation' || modality === 'ebsd_phase' || modality === 'ebsd_other') return 'steps';
  return null;
}

export interface DetectorOptions {
  /** Smallest distance between two crossings, samples (a boundary is a few pixels wide). */
  minSeparation: number;
  /** How many noise levels deep a valley (or high a step) must be. */
  sensitivity: number;
}

export const DEFAULT_DETECTOR_OPTIONS: DetectorOptions = { minSeparation: 4, sensitivity: 4 };
/** Flat-colour maps have no drawn boundary width: steps may sit two pixels apart near triple points. */
export const DEFAULT_STEP_OPTIONS: DetectorOptions = { minSeparation: 2, sensitivity: 4 };

/** Gaussian smoothing of a profile (σ in samples), clamped at the ends. */
export function smooth(profile: readonly number[], sigma: number): number[] {
  if (sigma <= 0) return [...profile];
  const r = Math.ceil(3 * sigma);
  const w = Array.from({ length: 2 * r + 1 }, (_, i) => Math.exp(-((i - r) ** 2) / (2 * sigma * sigma)));
  const sum = w.reduce((a, b) => a + b, 0);
  return profile.map((_, i) => {
    let acc = 0;
    for (let k = -r; k <= r; k++) acc += w[k + r]! * profile[Math.min(profile.length - 1, Math.max(0, i + k))]!;
    return acc / sum;
  });
}

/** Robust noise level: median absolute first difference / (0.6745·√2) for Gaussian noise. */
export function noiseLevel(profile: readonly number[]): number {
  const d = profile.slice(1).map((v, i) => Math.abs(v - profile[i]!)).sort((a, b) => a - b);
  if (d.length === 0) return 0;
  return d[Math.floor(d.length / 2)]! / (0.6745 * Math.SQRT2);
}

/**
 * Positions (sample indices, fractional) of dark valleys whose prominence — depth below the lower of
 * the highest points reached on either side before a deeper valley — exceeds sensitivity × noise.
 */
export function findValleys(profile: readonly number[], options: DetectorOptions = DEFAULT_DETECTOR_OPTIONS): number[] {
  const raw = noiseLevel(profile);
  const s = smooth(profile, 1.2);
  const range = Math.max(...s) - Math.min(...s);
  const threshold = Math.max(options.sensitivity * raw, 0.08 * range);
  const candidates: { i: number; prominence: number }[] = [];
  for (let i = 1; i < s.length - 1; i++) {
    if (!(s[i]! < s[i - 1]! && s[i]! <= s[i + 1]!)) continue;
    const left = highestUntilLower(s, i, -1);
    const right = highestUntilLower(s, i, 1);
    const prominence = Math.min(left, right) - s[i]!;
    if (prominence >= threshold) candidates.push({ i, prominence });
  }
  return thin(candidates, options.minSeparation).map((c) => refine(s, c.i));
}

/** Positions of abrupt changes in a multi-channel profile (e.g. RGB), where the local contrast stands out. */
export function findSteps(channels: readonly (readonly number[])[], options: DetectorOptions = DEFAULT_STEP_OPTIONS): number[] {
  const n = channels[0]?.length ?? 0;
  // Contrast across a 2-sample gap, so a boundary drawn over a pixel or two still shows as one step.
  const contrast = Array.from({ length: n }, (_, i) => {
    const a = Math.max(0, i - 1);
    const b = Math.min(n - 1, i + 1);
    return Math.sqrt(channels.reduce((acc, ch) => acc + (ch[b]! - ch[a]!) ** 2, 0));
  });
  const quiet = [...contrast].sort((x, y) => x - y)[Math.floor(n / 2)] ?? 0;
  const peak = Math.max(...contrast);
  // Neighbouring grains can differ little in colour: a small floor relative to the strongest step keeps them.
  const threshold = Math.max(options.sensitivity * (quiet + 1e-9), 0.04 * peak);
  const candidates: { i: number; prominence: number }[] = [];
  for (let i = 0; i < n; i++) {
    const isPeak = contrast[i]! >= (contrast[i - 1] ?? -1) && contrast[i]! > (contrast[i + 1] ?? -1);
    if (isPeak && contrast[i]! >= threshold) candidates.push({ i, prominence: contrast[i]! });
  }
  return thin(candidates, options.minSeparation).map((c) => c.i);
}

function highestUntilLower(s: readonly number[], from: number, dir: 1 | -1): number {
  let best = s[from]!;
  for (let j = from + dir; j >= 0 && j < s.length; j += dir) {
    if (s[j]! < s[from]!) break;
    best = Math.max(best, s[j]!);
  }
  return best;
}

/** Keeps the most prominent candidate in each cluster closer than `minSeparation`. */
function thin(candidates: { i: number; prominence: number }[], minSeparation: number): { i: number; prominence: number }[] {
  const kept: { i: number; prominence: number }[] = [];
  for (const c of [...candidates].sort((a, b) => b.prominence - a.prominence)) {
    if (kept.every((k) => Math.abs(k.i - c.i) >= minSeparation)) kept.push(c);
  }
  return kept.sort((a, b) => a.i - b.i);
}

/** Sub-sample position of a minimum by a parabola through it and its neighbours. */
function refine(s: readonly number[], i: number): number {
  const [a, b, c] = [s[i - 1]!, s[i]!, s[i + 1]!];
  const denom = a - 2 * b + c;
  return denom === 0 ? i : i + (0.5 * (a - c)) / denom;
}
