import type { Measurement } from '../../../shared/measurements/measurement-records';
import type { PatternSpec } from '../../../shared/measurements/patterns';
import { formatUmPerPx } from './measure-units';

/** How a pattern reads in a report. Pure. */
export function describePattern(p: PatternSpec): string {
  if (p.type === 'circle') return `one circle, ${p.diameterUm} µm across`;
  if (p.type === 'three_circles') return `three concentric circles, largest ${p.largestDiameterUm} µm across`;
  const dir = p.direction === 'angle' ? `at ${p.angleDeg ?? 45}°` : p.direction === 'both' ? 'horizontal and vertical' : p.direction;
  return `${p.count} parallel lines ${dir}, ${p.spacingUm} µm apart`;
}

/** The method statement of a specimen's intercept measurements: distinct patterns, rules and pixel sizes. Pure. */
export function methodNotes(measurements: readonly Measurement[]): { patterns: string[]; rules: string[]; calibration: string[]; twins: string } {
  const patterns = new Set<string>();
  const rules = new Set<string>();
  const calibration = new Set<string>();
  let twinsKept = false;
  for (const m of measurements) {
    if (m.definition.kind !== 'intercept' || m.result.kind !== 'intercept') continue;
    patterns.add(describePattern(m.definition.pattern));
    const r = m.result.rules;
    rules.add(`${r.count === 'intersections' ? 'intersections P' : 'intercepts N'}, triple point ${r.triplePoint}`);
    calibration.add(`${formatUmPerPx(m.pixelSize.umPerPx)} (${m.pixelSize.source})`);
    if (!m.result.twinsExcluded) twinsKept = true;
  }
  return {
    patterns: [...patterns],
    rules: [...rules],
    calibration: [...calibration],
    twins: twinsKept ? 'Some fields counted annealing twin boundaries.' : 'Annealing twin boundaries were not counted.',
  };
}
