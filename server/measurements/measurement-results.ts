import { CIRCLE_RULES, LINE_RULES, fieldResult, grainSizeFromIntercept, isoIndexFromAstm, markValue, phaseIntercept, type CountRules } from '../../shared/measurements/e112';
import { layerThickness } from '../../shared/measurements/layers';
import type { Direction, InterceptFigures, InterceptResult, PointCountResult, TestPath, ThicknessResult } from '../../shared/measurements/measurement-records';
import { MARK_TOLERANCE_PX, type InterceptBody, type PointCountBody, type ThicknessBody } from '../../shared/measurements/measurements';
import { pointFraction } from '../../shared/measurements/point-count';
import { bandOf, distanceToPath, type FieldFrame } from './field-geometry';

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

function figures(lengthPx: number, count: number, umPerPx: number, phase: InterceptBody['phase']): InterceptFigures {
  const lineLengthUm = lengthPx * umPerPx;
  if (!(count > 0) || !(lineLengthUm > 0)) return { lineLengthUm, count, perMm: null, meanInterceptUm: null, g: null, gIso: null };
  const field = fieldResult({ lineLengthUm, count });
  // Two-phase: l̄α = V_Vα·L / Nα (E112 two-phase note, TRADE primer), and G of that phase from it.
  const meanInterceptUm = phase ? phaseIntercept(phase.volumeFraction, lineLengthUm, count) : field.meanInterceptUm;
  const g = phase ? grainSizeFromIntercept(meanInterceptUm) : field.g;
  return { lineLengthUm, count, perMm: field.perMm, meanInterceptUm, g, gIso: isoIndexFromAstm(g) };
}

/** P or N, P_L or N_L, l̄ and G of one field, per direction for crossed lines. */
export function interceptResult(def: InterceptBody, paths: readonly TestPath[], frame: FieldFrame, umPerPx: number): InterceptResult {
  const rules = rulesOf(def);
  const confirmed = def.marks.filter((m) => m.status === 'confirmed');
  const counted = confirmed.filter((m) => paths[m.line] && distanceToPath([m.x, m.y], paths[m.line]!) <= MARK_TOLERANCE_PX);
  const tally = (dir: Direction | null) => {
    const inDir = (line: number) => dir === null || directionOf(paths[line]!.family, frame) === dir;
    const length = paths.filter((p) => inDir(p.line)).reduce((sum, p) => sum + p.lengthPx, 0);
    const count = counted.filter((m) => inDir(m.line)).reduce((sum, m) => sum + markValue(m.kind, rules), 0);
    return figures(length, count, umPerPx, def.phase);
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
  if (def.phase) statements.push(`Two-phase: l̄ of ${def.phase.name} = V_V·L / N with V_V = ${def.phase.volumeFraction}.`);
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
    phase: def.phase,
    confirmedMarks: counted.length,
    suggestedMarks: suggested,
    marksLeftOut: leftOut,
    statements,
  };
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

