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

/**
 * A square point grid over a `width` × `height` image, `spacing` apart (same units), centred on the
 * image like the line patterns and moved by `offset`; only points on the image are returned.
 */
export function gridPoints(width: number, height: number, spacing: number, offset: readonly [number, number] = [0, 0]): [number, number][] {
  if (!(spacing > 0)) throw new RangeError('The grid spacing must be above 0.');
  const axis = (size: number, shift: number) => {
    const centre = size / 2 + shift;
    const out: number[] = [];
    for (let k = Math.ceil(-centre / spacing); centre + k * spacing <= size; k++) out.push(centre + k * spacing);
    return out;
  };
  const xs = axis(width, offset[0]);
  return axis(height, offset[1]).flatMap((y) => xs.map((x) => [x, y] as [number, number]));
}
