import { CIRCLE_RULES, LINE_RULES, markValue, type CountRules, type MarkKind } from '../../../shared/measurements/e112';
import type { PatternSpec } from '../../../shared/measurements/patterns';

/** A mark as the measuring page holds it (the same shape the server stores). */
export interface DraftMark {
  x: number;
  y: number;
  line: number;
  kind: MarkKind;
  status: 'confirmed' | 'suggested';
}

/** The live tally: P or N per test line and for the field, from confirmed marks only. */
export interface LiveCounts {
  perLine: number[];
  total: number;
  confirmed: number;
  suggested: number;
}

/** Sums the E112 value of each confirmed mark per line; suggestions are shown, never counted. Pure. */
export function liveCounts(marks: readonly DraftMark[], lineCount: number, rules: CountRules): LiveCounts {
  const perLine = Array.from({ length: lineCount }, () => 0);
  let confirmed = 0;
  let suggested = 0;
  for (const m of marks) {
    if (m.status === 'suggested') {
      suggested++;
      continue;
    }
    confirmed++;
    if (m.line >= 0 && m.line < lineCount) perLine[m.line]! += markValue(m.kind, rules);
  }
  return { perLine, total: perLine.reduce((a, v) => a + v, 0), confirmed, suggested };
}

/** The starting rules for a pattern: lines count triple points 1½, circles 2 (E112 practice as our primer states it). Pure. */
export function defaultRules(pattern: PatternSpec['type']): CountRules {
  return pattern === 'lines' ? { ...LINE_RULES } : { ...CIRCLE_RULES };
}

/** The mark kinds that make sense for a pattern and count: circles have no ends; ends count only for intercepts. Pure. */
export function markKindsFor(pattern: PatternSpec['type'], rules: CountRules): MarkKind[] {
  const kinds: MarkKind[] = ['crossing', 'tangent', 'triple_point'];
  if (pattern === 'lines' && rules.count === 'intercepts') kinds.push('line_end');
  return kinds;
}

export const MARK_KIND_LABELS: Record<MarkKind, string> = {
  crossing: 'Crossing',
  tangent: 'Tangent',
  triple_point: 'Triple point',
  line_end: 'Line end in a grain',
};
