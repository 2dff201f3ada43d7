import { expect } from 'chai';
import type { CountRules } from '../../../../shared/measurements/e112';
import { defaultRules, liveCounts, markKindsFor, type DraftMark } from '../../../../src/app/measurements/mark-counts';

const mark = (line: number, kind: DraftMark['kind'], status: DraftMark['status'] = 'confirmed'): DraftMark => ({ x: 0, y: 0, line, kind, status });
const lineRules: CountRules = { count: 'intersections', triplePoint: 1.5 };
const circleRules: CountRules = { count: 'intersections', triplePoint: 2 };

describe('client: mark counts, the live tally', () => {
  it('counts each crossing and tangent as 1 on its own line', () => {
    // ASTM E112 / TRADE primer [C]: a crossing counts 1, a tangent hit 1.
    const counts = liveCounts([mark(0, 'crossing'), mark(0, 'tangent'), mark(2, 'crossing')], 3, lineRules);

    expect(counts.perLine).to.deep.equal([2, 0, 1]);
    expect(counts.total).to.equal(3);
  });

  it('counts a triple point 1½ on a straight line', () => {
    // ASTM E112 / TRADE primer [C]: a hit through a triple point counts 1½ on straight lines.
    const counts = liveCounts([mark(0, 'triple_point'), mark(0, 'crossing')], 1, lineRules);

    expect(counts.perLine).to.deep.equal([2.5]);
  });

  it('counts a triple point 2 on a circle', () => {
    // TRADE primer [C]: a triple point counts 2 on circles.
    const counts = liveCounts([mark(0, 'triple_point'), mark(0, 'triple_point'), mark(0, 'crossing')], 1, circleRules);

    expect(counts.total).to.equal(5);
  });

  it('leaves suggested marks out of P but counts them for display', () => {
    const counts = liveCounts(
      [mark(0, 'crossing'), mark(0, 'crossing', 'suggested'), mark(1, 'triple_point', 'suggested'), mark(1, 'tangent')],
      2,
      lineRules,
    );

    expect(counts.perLine).to.deep.equal([1, 1]);
    expect(counts.total).to.equal(2);
    expect(counts.confirmed).to.equal(2);
    expect(counts.suggested).to.equal(2);
  });

  it('gives a line end ½ when intercepts are counted and nothing when intersections are', () => {
    // ASTM E112 / TRADE primer [C]: a line end inside a grain is ½ (intercept count); it is no boundary intersection.
    const ends = [mark(0, 'line_end'), mark(0, 'line_end'), mark(0, 'line_end')];

    expect(liveCounts(ends, 1, { count: 'intercepts', triplePoint: 1.5 }).total).to.equal(1.5);
    expect(liveCounts(ends, 1, lineRules).total).to.equal(0);
  });

  it('keeps a zero for every line without marks and an empty tally when there are none', () => {
    expect(liveCounts([], 4, lineRules)).to.deep.equal({ perLine: [0, 0, 0, 0], total: 0, confirmed: 0, suggested: 0 });
  });

  it('does not put a mark on a line the pattern no longer has into any line or the field total', () => {
    const counts = liveCounts([mark(5, 'crossing'), mark(-1, 'crossing'), mark(1, 'crossing')], 2, lineRules);

    expect(counts.perLine).to.deep.equal([0, 1]);
    expect(counts.total).to.equal(1);
  });
});

describe('client: mark counts, starting rules for a pattern', () => {
  it('starts straight lines with triple points at 1½ and circles at 2, counting intersections', () => {
    // TRADE primer [C]: 1½ on straight lines, 2 on circles.
    expect(defaultRules('lines')).to.deep.equal({ count: 'intersections', triplePoint: 1.5 });
    expect(defaultRules('circle')).to.deep.equal({ count: 'intersections', triplePoint: 2 });
    expect(defaultRules('three_circles')).to.deep.equal({ count: 'intersections', triplePoint: 2 });
  });

  it('hands out a copy, so changing the rules of one count leaves the next alone', () => {
    const first = defaultRules('lines');
    first.triplePoint = 2;

    expect(defaultRules('lines').triplePoint).to.equal(1.5);
  });
});

describe('client: mark counts, mark kinds offered', () => {
  it('offers line ends only when straight lines count intercepts', () => {
    expect(markKindsFor('lines', { count: 'intercepts', triplePoint: 1.5 })).to.include('line_end');
    expect(markKindsFor('lines', lineRules)).to.not.include('line_end');
  });

  it('never offers line ends on circles, which have no ends', () => {
    expect(markKindsFor('circle', { count: 'intercepts', triplePoint: 2 })).to.not.include('line_end');
    expect(markKindsFor('three_circles', circleRules)).to.deep.equal(['crossing', 'tangent', 'triple_point']);
  });
});
