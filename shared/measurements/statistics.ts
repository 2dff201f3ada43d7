/**
 * Field statistics as E112 and E562 report them: mean, s (n − 1), 95 % confidence interval
 * t·s/√n with Student t at 0.975 and n − 1 degrees of freedom, and % relative accuracy.
 */

export interface FieldStatistics {
  n: number;
  mean: number;
  /** Sample standard deviation (n − 1). */
  s: number;
  /** Half-width of the 95 % confidence interval. */
  ci95: number;
  /** ci95 / mean · 100. */
  relativeAccuracyPct: number;
}

export function fieldStatistics(values: readonly number[]): FieldStatistics {
  const n = values.length;
  if (n < 2) throw new RangeError('Statistics across fields need at least two fields.');
  const mean = values.reduce((a, b) => a + b, 0) / n;
  const s = Math.sqrt(values.reduce((a, v) => a + (v - mean) ** 2, 0) / (n - 1));
  const ci95 = (studentTQuantile(0.975, n - 1) * s) / Math.sqrt(n);
  return { n, mean, s, ci95, relativeAccuracyPct: (ci95 / mean) * 100 };
}

/** %RA above this is usually not acceptable (E112, E562). */
export const RELATIVE_ACCURACY_LIMIT_PCT = 10;

/** Inverse of Student's t distribution function, by bisection on the exact CDF (enough for 1e-10). */
export function studentTQuantile(p: number, df: number): number {
  if (!(p > 0 && p < 1) || !(df > 0)) throw new RangeError(`Need 0 < p < 1 and df > 0; got p = ${p}, df = ${df}.`);
  if (p === 0.5) return 0;
  if (p < 0.5) return -studentTQuantile(1 - p, df);
  let lo = 0;
  let hi = 1;
  while (studentTCdf(hi, df) < p) hi *= 2;
  for (let i = 0; i < 200 && hi - lo > 1e-12 * hi; i++) {
    const mid = (lo + hi) / 2;
    if (studentTCdf(mid, df) < p) lo = mid;
    else hi = mid;
  }
  return (lo + hi) / 2;
}

/** Student t CDF via the regularized incomplete beta function: F(t) = 1 − ½·I_{df/(df+t²)}(df/2, ½) for t ≥ 0. */
export function studentTCdf(t: number, df: number): number {
  const x = df / (df + t * t);
  const tail = 0.5 * regularizedBeta(x, df / 2, 0.5);
  return t >= 0 ? 1 - tail : tail;
}

/** I_x(a, b) by the continued fraction (Numerical Recipes, 2nd ed., §6.4). */
function regularizedBeta(x: number, a: number, b: number): number {
  if (x <= 0) return 0;
  if (x >= 1) return 1;
  const front = Math.exp(logGamma(a + b) - logGamma(a) - logGamma(b) + a * Math.log(x) + b * Math.log(1 - x));
  return x < (a + 1) / (a + b + 2) ? (front * betaFraction(x, a, b)) / a : 1 - (front * betaFraction(1 - x, b, a)) / b;
}

function betaFraction(x: number, a: number, b: number): number {
  const tiny = 1e-300;
  let c = 1;
  let d = 1 - ((a + b) * x) / (a + 1);
  if (Math.abs(d) < tiny) d = tiny;
  d = 1 / d;
  let h = d;
  for (let m = 1; m <= 300; m++) {
    const m2 = 2 * m;
    let aa = (m * (b - m) * x) / ((a + m2 - 1) * (a + m2));
    d = 1 + aa * d;
    d = Math.abs(d) < tiny ? tiny : d;
    c = 1 + aa / c;
    c = Math.abs(c) < tiny ? tiny : c;
    d = 1 / d;
    h *= d * c;
    aa = (-(a + m) * (a + b + m) * x) / ((a + m2) * (a + m2 + 1));
    d = 1 + aa * d;
    d = Math.abs(d) < tiny ? tiny : d;
    c = 1 + aa / c;
    c = Math.abs(c) < tiny ? tiny : c;
    d = 1 / d;
    const delta = d * c;
    h *= delta;
    if (Math.abs(delta - 1) < 1e-15) break;
  }
  return h;
}

/** ln Γ(x) by the Lanczos approximation (g = 7, n = 9), accurate to ~1e-15 for x > 0. */
function logGamma(x: number): number {
  const c = [0.99999999999980993, 676.5203681218851, -1259.1392167224028, 771.32342877765313, -176.61503916999185, 12.507343278686905, -0.13857109526572012, 9.9843695780195716e-6, 1.5056327351493116e-7];
  if (x < 0.5) return Math.log(Math.PI / Math.sin(Math.PI * x)) - logGamma(1 - x);
  x -= 1;
  let sum = c[0]!;
  for (let i = 1; i < 9; i++) sum += c[i]! / (x + i);
  const t = x + 7.5;
  return 0.5 * Math.log(2 * Math.PI) + (x + 0.5) * Math.log(t) - t + Math.log(sum);
}
