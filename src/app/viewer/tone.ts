/**
 * Display-only tone adjustment of the tile layer: brightness, contrast and gamma folded into one
 * per-channel curve, out = contrast · in^(1/gamma) + (0.5 − 0.5 · contrast + brightness), with
 * values in 0…1. That is exactly an SVG `feFuncR/G/B type="gamma"` (amplitude · in^exponent +
 * offset, SVG 1.1 §15.11), so the browser applies it to the canvas and the image data stays untouched.
 * Pure.
 */
export interface Tone {
  /** Added to every value, −1…1 (0 leaves it). */
  brightness: number;
  /** Slope around mid-grey, 0…3 (1 leaves it). */
  contrast: number;
  /** Display gamma, 0.2…5 (1 leaves it; above 1 lightens the mid-tones). */
  gamma: number;
}

export const NEUTRAL_TONE: Tone = { brightness: 0, contrast: 1, gamma: 1 };

export const TONE_LIMITS = {
  brightness: { min: -1, max: 1, step: 0.01 },
  contrast: { min: 0, max: 3, step: 0.01 },
  gamma: { min: 0.2, max: 5, step: 0.01 },
} as const;

/** The three numbers of an SVG component-transfer gamma function. */
export interface GammaTransfer {
  amplitude: number;
  exponent: number;
  offset: number;
}

export function toneTransfer(t: Tone): GammaTransfer {
  const c = clamp(t.contrast, TONE_LIMITS.contrast, NEUTRAL_TONE.contrast);
  const b = clamp(t.brightness, TONE_LIMITS.brightness, NEUTRAL_TONE.brightness);
  const g = clamp(t.gamma, TONE_LIMITS.gamma, NEUTRAL_TONE.gamma);
  return { amplitude: c, exponent: 1 / g, offset: 0.5 - 0.5 * c + b };
}

/** The curve itself, for checks and for a small preview: one value in 0…1 to its displayed value, clipped to 0…1. */
export function applyTone(t: Tone, value: number): number {
  const { amplitude, exponent, offset } = toneTransfer(t);
  return Math.min(1, Math.max(0, amplitude * Math.pow(value, exponent) + offset));
}

export function isNeutralTone(t: Tone): boolean {
  return t.brightness === 0 && t.contrast === 1 && t.gamma === 1;
}

/** Into the slider's range; a value that is not a number counts as neutral. */
function clamp(v: number, range: { min: number; max: number }, neutral: number): number {
  return Number.isFinite(v) ? Math.min(range.max, Math.max(range.min, v)) : neutral;
}
