import { fieldStatistics, type FieldStatistics } from './statistics';

/** ASTM E562 manual point count: a point inside the feature counts 1, on its boundary ½. */
export interface PointCountField {
  gridPoints: number;
  inside: number;
  onBoundary: number;
}

/** P_p = (inside + ½·boundary) / P_T for one field. */
export function pointFraction(field: PointCountField): number {
  if (!(field.gridPoints > 0)) throw new RangeError('A grid needs at least one point.');
  const hits = field.inside + 0.5 * field.onBoundary;
  if (field.inside < 0 || field.onBoundary < 0 || hits > field.gridPoints) throw new RangeError('More hits than grid points.');
  return hits / field.gridPoints;
}

/** Mean P_p across fields with s, 95 % CI and %RA (E562 §10-11); V_V is estimated by the mean P_p. */
export function volumeFraction(fields: readonly PointCountField[]): FieldStatistics {
  return fieldStatistics(fields.map(pointFraction));
}
