/**
 * ASTM E112 grain size relations (the TRADE primer; constants as printed in E112, checked by the
 * tests against the exact forms and the anchor table).
 */

/** l̄ at G = 0, mm: the intercept length the lineal relation is anchored to (G = −2·log2(l̄ / 0.32 mm)). */
export const L0_MM = 0.32;

/** G from the mean lineal intercept l̄ in µm: G = −6.643856·log10(l̄ / mm) − 3.288. */
export function grainSizeFromIntercept(meanInterceptUm: number): number {
  if (!(meanInterceptUm > 0)) throw new RangeError(`A mean intercept must be above 0 µm; got ${meanInterceptUm}.`);
  return -6.643856 * Math.log10(meanInterceptUm / 1000) - 3.288;
}

/** l̄ in µm for a grain size number G, by the exact form l̄ = 0.32 mm · 2^(−G/2). */
export function interceptForGrainSize(g: number): number {
  return L0_MM * 1000 * 2 ** (-g / 2);
}

/** G from grains per mm² at 1x (planimetric): G = 3.321928·log10(N_A) − 2.954. */
export function grainSizeFromAreaDensity(grainsPerMm2: number): number {
  if (!(grainsPerMm2 > 0)) throw new RangeError(`N_A must be above 0 per mm²; got ${grainsPerMm2}.`);
  return 3.321928 * Math.log10(grainsPerMm2) - 2.954;
}

/**
 * ISO 643 index for the same count: ISO defines m = 8·2^G grains/mm², ASTM N_A = 15.50·2^(G−1),
 * so G_ISO = G_ASTM + log2(15.5 / 16) ≈ G_ASTM − 0.046.
 */
export function isoIndexFromAstm(gAstm: number): number {
  return gAstm + Math.log2(15.5 / 16);
}

/** The count rules of E112 for straight lines; circles differ only in the triple-point value. */
export const MARK_KINDS = ['crossing', 'tangent', 'triple_point', 'line_end'] as const;
export type MarkKind = (typeof MARK_KINDS)[number];

export interface CountRules {
  /** Intersections P (boundary crossings) or intercepts N (grain segments). */
  count: 'intersections' | 'intercepts';
  /** Value of a hit through a triple point; 1.5 on straight lines, often 2 on circles (make it visible). */
  triplePoint: number;
}

export const LINE_RULES: CountRules = { count: 'intersections', triplePoint: 1.5 };
export const CIRCLE_RULES: CountRules = { count: 'intersections', triplePoint: 2 };

/** Value each mark adds to P (or N): crossing 1, tangent 1, triple point per the rules, line end inside a grain ½. */
export function markValue(kind: MarkKind, rules: CountRules): number {
  switch (kind) {
    case 'crossing':
    case 'tangent':
      return 1;
    case 'triple_point':
      return rules.triplePoint;
    case 'line_end':
      // A line end inside a grain is half an intercept; it is no boundary intersection.
      return rules.count === 'intercepts' ? 0.5 : 0;
  }
}

export interface FieldCount {
  /** Total true test-line length on the specimen, µm. */
  lineLengthUm: number;
  /** P or N: the summed mark values. */
  count: number;
}

export interface FieldResult extends FieldCount {
  /** P_L or N_L per mm. */
  perMm: number;
  /** Mean lineal intercept, µm. */
  meanInterceptUm: number;
  g: number;
}

/** P_L = P / L, l̄ = 1 / P_L, and G for one field. */
export function fieldResult(field: FieldCount): FieldResult {
  if (!(field.lineLengthUm > 0)) throw new RangeError('The test line has no length.');
  if (!(field.count > 0)) throw new RangeError('No boundary was counted on this field; l̄ is undefined.');
  const perMm = field.count / (field.lineLengthUm / 1000);
  const meanInterceptUm = 1000 / perMm;
  return { ...field, perMm, meanInterceptUm, g: grainSizeFromIntercept(meanInterceptUm) };
}

/** Two-phase structures: intercept length of phase α = V_Vα·L / N_α (E112 two-phase note in the TRADE primer). */
export function phaseIntercept(volumeFraction: number, lineLengthUm: number, phaseIntercepts: number): number {
  if (!(volumeFraction > 0 && volumeFraction <= 1)) throw new RangeError('A volume fraction lies in (0, 1].');
  if (!(phaseIntercepts > 0)) throw new RangeError('No intercepts of the phase were counted.');
  return (volumeFraction * lineLengthUm) / phaseIntercepts;
}
