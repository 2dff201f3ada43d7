import { CIRCLE_RULES, LINE_RULES, fieldResult, grainSizeFromIntercept, isoIndexFromAstm, markValue, phaseIntercept, type CountRules } from '../../shared/measurements/e112';
import { layerThickness } from '../../shared/measurements/layers';
import type { DistanceBin, Direction, InterceptFigures, InterceptResult, PointCountResult, PointCountSource, TestPath, ThicknessResult } from '../../shared/measurements/measurement-records';
import { MARK_TOLERANCE_PX, type InterceptBody, type PointCountBody, type ThicknessBody } from '../../shared/measurements/measurements';
import { pointFraction } from '../../shared/measurements/point-count';
import { bandOf, distanceToInterfaces, distanceToPath, lengthInDistanceRange, type FieldFrame } from './field-geometry';

type Phase = { name: string; volumeFraction: number } | null;

/** The phase with its volume fraction (always set once the server has resolved a point count). */
function phaseOf(def: InterceptBody): Phase {
  if (!def.phase) return null;
  if (def.phase.volumeFraction === undefined) throw new RangeError('A two-phase definition reached the results without its volume fraction.');
  return { name: def.phase.name, volumeFraction: def.phase.volumeFraction };
}

/**
 * Results from definitions, with the shared E112/E562 functions only. Nothing here trusts a number
 * a client sent: counts come from the marks, lengths from the counted test lines.
 */

/** The rules a definition counts by: its own, or E112's defaults for its pattern. */
export function rulesOf(def: InterceptBody): CountRules {
  return def.rules ?? (def.pattern.type === 'lines' ? LINE_RULES : CIRCLE_RULES);
}

/** Where a line family points relative to the interfaces (or image x when none are drawn). */
function directionOf(family: TestPath['family'], frame: FieldFrame): Direction {
  if (family === 'circle') return 'all';
  if (family === 'angle') return 'oblique';
  return (family === 'horizontal') === (frame.axis === 'x') ? 'along' : 'across';
}

function figures(lengthPx: number, count: number, umPerPx: number, phase: Phase): InterceptFigures {
  const lineLengthUm = lengthPx * umPerPx;
  if (!(count > 0) || !(lineLengthUm > 0)) return { lineLengthUm, count, perMm: null, meanInterceptUm: null, g: null, gIso: null };
  const field = fieldResult({ lineLengthUm, count });
  // Two-phase: l̄α = V_Vα·L / Nα (E112 two-phase note, TRADE primer), and G of that phase from it.
  const meanInterceptUm = phase ? phaseIntercept(phase.volumeFraction, lineLengthUm, count) : field.meanInterceptUm;
  const g = phase ? grainSizeFromIntercept(meanInterceptUm) : field.g;
  return { lineLengthUm, count, perMm: field.perMm, meanInterceptUm, g, gIso: isoIndexFromAstm(g) };
}

/** P or N, P_L or N_L, l̄ and G of one field, per direction for crossed lines. */
export function interceptResult(def: InterceptBody, paths: readonly TestPath[], frame: FieldFrame, umPerPx: number, pointCount: PointCountSource | null = null): InterceptResult {
  const rules = rulesOf(def);
  const phase = phaseOf(def);
  const confirmed = def.marks.filter((m) => m.status === 'confirmed');
  const counted = confirmed.filter((m) => paths[m.line] && distanceToPath([m.x, m.y], paths[m.line]!) <= MARK_TOLERANCE_PX);
  const tally = (dir: Direction | null) => {
    const inDir = (line: number) => dir === null || directionOf(paths[line]!.family, frame) === dir;
    const length = paths.filter((p) => inDir(p.line)).reduce((sum, p) => sum + p.lengthPx, 0);
    const count = counted.filter((m) => inDir(m.line)).reduce((sum, m) => sum + markValue(m.kind, rules), 0);
    return figures(length, count, umPerPx, phase);
  };
  const crossed = def.pattern.type === 'lines' && def.pattern.direction === 'both';
  const direction: Direction = crossed ? 'all' : directionOf(paths[0]?.family ?? 'circle', frame);
  let byDirection: InterceptResult['byDirection'] = null;
  if (crossed) {
    const [along, across] = [tally('along'), tally('across')];
    const ai = along.meanInterceptUm && across.meanInterceptUm ? along.meanInterceptUm / across.meanInterceptUm : null;
    byDirection = { along, across, anisotropyIndex: ai };
  }
  const symbol = rules.count === 'intersections' ? 'P' : 'N';
  const statements = [
    `Counted ${symbol} (${rules.count}); a triple point counts ${rules.triplePoint}${rules.count === 'intercepts' ? ', a line end inside a grain ½' : ''}.`,
    def.twinsExcluded ? 'Annealing twin boundaries were excluded (E112 grain size).' : 'Annealing twin boundaries were counted as boundaries (not an E112 grain size; report it "with twins").',
    frame.axisSource === 'bond_interfaces' ? `"Along" follows the bond interfaces (image ${frame.axis}).` : 'No bond interfaces are drawn: "along" is taken as the image x axis.',
  ];
  if (phase) {
    const from = pointCount
      ? ` from the saved point count of “${pointCount.phaseName}” on ${pointCount.whereLabel} (version ${pointCount.version}, P_p = ${round4(pointCount.pointFraction)})`
      : ' as typed in';
    statements.push(`Two-phase: l̄ of ${phase.name} = V_V·L / N with V_V = ${round4(phase.volumeFraction)}${from}.`);
  }
  const bins = def.distanceBinsUm ? distanceBins(def.distanceBinsUm, paths, counted, frame, umPerPx, rules, phase) : null;
  if (bins) statements.push(`Sub-bands by distance from the nearest bond interface: ${def.distanceBinsUm!.join(', ')} µm; all directions pooled in each.`);
  const suggested = def.marks.length - confirmed.length;
  if (suggested > 0) statements.push(`${suggested} suggested mark${suggested > 1 ? 's are' : ' is'} not counted until confirmed.`);
  const leftOut = confirmed.length - counted.length;
  if (leftOut > 0) statements.push(`${leftOut} confirmed mark${leftOut > 1 ? 's' : ''} no longer lie on the counted lines and ${leftOut > 1 ? 'were' : 'was'} left out.`);
  return {
    kind: 'intercept',
    ...tally(null),
    countSymbol: symbol,
    rules,
    direction,
    byDirection,
    twinsExcluded: def.twinsExcluded,
    phase: phase ? { ...phase, pointCount } : null,
    bins,
    confirmedMarks: counted.length,
    suggestedMarks: suggested,
    marksLeftOut: leftOut,
    statements,
  };
}

/**
 * Per sub-band: the counted line lying minUm–maxUm from the nearest interface and the marks there (a mark
 * exactly on an edge belongs to the farther sub-band, the last one keeps its outer edge).
 */
function distanceBins(edgesUm: readonly number[], paths: readonly TestPath[], marks: readonly InterceptBody['marks'][number][], frame: FieldFrame, umPerPx: number, rules: CountRules, phase: Phase): DistanceBin[] {
  const markUm = marks.map((m) => ({ m, d: distanceToInterfaces([m.x, m.y], frame) * umPerPx }));
  return edgesUm.slice(1).map((maxUm, i) => {
    const minUm = edgesUm[i]!;
    const last = i === edgesUm.length - 2;
    const lengthPx = paths.reduce((sum, p) => sum + lengthInDistanceRange(p, frame, minUm / umPerPx, maxUm / umPerPx), 0);
    const inBin = markUm.filter(({ d }) => d >= minUm && (d < maxUm || (last && d <= maxUm)));
    const count = inBin.reduce((sum, { m }) => sum + markValue(m.kind, rules), 0);
    return { minUm, maxUm, marks: inBin.length, ...figures(lengthPx, count, umPerPx, phase) };
  });
}

function round4(v: number): number {
  return Math.round(v * 10_000) / 10_000;
}

/** Index of the grid point a mark sits on, or -1. */
export function gridPointOf(mark: { x: number; y: number }, grid: readonly [number, number][]): number {
  let best = -1;
  let bestD = MARK_TOLERANCE_PX;
  grid.forEach((g, i) => {
    const d = Math.hypot(g[0] - mark.x, g[1] - mark.y);
    if (d <= bestD) [best, bestD] = [i, d];
  });
  return best;
}

/** P_p of one field (E562): grid points inside count 1, on the boundary ½; each grid point counts once. */
export function pointCountResult(def: PointCountBody, grid: readonly [number, number][]): PointCountResult {
  const confirmed = def.marks.filter((m) => m.status === 'confirmed');
  const hits = new Map<number, 'inside' | 'boundary'>();
  for (const m of confirmed) {
    const at = gridPointOf(m, grid);
    if (at >= 0 && !hits.has(at)) hits.set(at, m.hit);
  }
  const inside = [...hits.values()].filter((h) => h === 'inside').length;
  const onBoundary = hits.size - inside;
  const statements = [`E562 manual point count of “${def.phaseName}”: a point inside counts 1, on its boundary ½.`];
  const suggested = def.marks.length - confirmed.length;
  if (suggested > 0) statements.push(`${suggested} suggested mark${suggested > 1 ? 's are' : ' is'} not counted until confirmed.`);
  const leftOut = confirmed.length - hits.size;
  if (leftOut > 0) statements.push(`${leftOut} confirmed mark${leftOut > 1 ? 's' : ''} no longer sit on a counted grid point and ${leftOut > 1 ? 'were' : 'was'} left out.`);
  return {
    kind: 'point_count',
    phaseName: def.phaseName,
    gridPoints: grid.length,
    inside,
    onBoundary,
    pointFraction: pointFraction({ gridPoints: grid.length, inside, onBoundary }),
    confirmedMarks: hits.size,
    suggestedMarks: suggested,
    marksLeftOut: leftOut,
    statements,
  };
}

/** The layer's local thickness between the band's two interfaces, sampled along the upper (left) one. */
export function thicknessResult(def: ThicknessBody, frame: FieldFrame, umPerPx: number): ThicknessResult {
  const n = def.where.band;
  // The band's bounds are interfaces n-1 and n in band order (frame.interfaces is sorted that way).
  const [upper, lower] = [frame.interfaces[n - 2]!, frame.interfaces[n - 1]!];
  if (!bandOf(frame) || !upper || !lower) throw new RangeError(`Band ${n} does not lie between two bond interfaces.`);
  const profile = layerThickness(upper, lower, umPerPx, def.spacingUm);
  return {
    kind: 'thickness',
    band: n,
    spacingUm: def.spacingUm,
    ...profile,
    statements: [`Shortest distance to the lower interface from points every ${def.spacingUm} µm along the upper one.`],
  };
}

