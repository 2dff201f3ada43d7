import { expect } from 'chai';
import type { TestLine } from '../../../../shared/measurements/patterns';
import {
  markNear,
  nearestPointOn,
  pathSegments,
  snapToSegments,
  snapToTestLine,
  spacingToReach,
} from '../../../../src/app/measurements/test-line-snap';

const horizontal = (y: number, x0 = 0, x1 = 100): TestLine => ({ kind: 'segment', a: [x0, y], b: [x1, y], family: 'horizontal' });
const circle = (cx: number, cy: number, radius: number): TestLine => ({ kind: 'circle', centre: [cx, cy], radius });

describe('client: test-line snapping, the nearest point on a line', () => {
  it('drops a click straight onto a segment between its ends', () => {
    expect(nearestPointOn(horizontal(50), [30, 42])).to.deep.equal([30, 50]);
  });

  it('clamps a click beyond a segment end to that end', () => {
    expect(nearestPointOn(horizontal(50), [-20, 55])).to.deep.equal([0, 50]);
    expect(nearestPointOn(horizontal(50), [140, 45])).to.deep.equal([100, 50]);
  });

  it('projects onto a slanted segment perpendicularly', () => {
    // Hand-computed: the foot of (0, 10) on the line y = x is (5, 5).
    const diagonal: TestLine = { kind: 'segment', a: [0, 0], b: [100, 100], family: 'angle' };
    const [x, y] = nearestPointOn(diagonal, [0, 10]);

    expect(x).to.be.closeTo(5, 1e-9);
    expect(y).to.be.closeTo(5, 1e-9);
  });

  it('projects a click onto a circle along the radius through it, from inside and outside', () => {
    // Hand-computed: (3, 4) is 5 from the centre; on a radius-10 circle the point is (6, 8).
    const c = circle(0, 0, 10);
    const inside = nearestPointOn(c, [3, 4]);
    const outside = nearestPointOn(c, [30, 40]);

    expect(inside[0]).to.be.closeTo(6, 1e-9);
    expect(inside[1]).to.be.closeTo(8, 1e-9);
    expect(outside[0]).to.be.closeTo(6, 1e-9);
    expect(outside[1]).to.be.closeTo(8, 1e-9);
  });

  it('still gives a point on the circle for a click exactly at the centre', () => {
    const [x, y] = nearestPointOn(circle(50, 50, 20), [50, 50]);

    expect(Math.hypot(x - 50, y - 50)).to.be.closeTo(20, 1e-9);
  });

  it('gives an end for a segment that has no length', () => {
    const dot: TestLine = { kind: 'segment', a: [7, 7], b: [7, 7], family: 'angle' };

    expect(nearestPointOn(dot, [20, 30])).to.deep.equal([7, 7]);
  });
});

describe('client: test-line snapping, a click on the pattern', () => {
  const lines = [horizontal(20), horizontal(40), horizontal(60)];

  it('snaps to the nearest line and reports the line, the point and the distance', () => {
    const hit = snapToTestLine([50, 37], lines, 5);

    expect(hit).to.deep.equal({ line: 1, point: [50, 40], distancePx: 3 });
  });

  it('returns null for a click farther than the tolerance from every line', () => {
    expect(snapToTestLine([50, 30], lines, 5)).to.equal(null);
  });

  it('accepts a click exactly at the tolerance', () => {
    expect(snapToTestLine([50, 25], lines, 5)?.line).to.equal(0);
  });

  it('passes over a line whose point the caller refuses and takes the next one in reach', () => {
    // Click midway-ish: line 0 (y 20) is 4 px away, line 1 (y 40) 16 px.
    const hit = snapToTestLine([50, 24], lines, 20, (q) => q[1] !== 20);

    expect(hit?.line).to.equal(1);
    expect(hit?.point).to.deep.equal([50, 40]);
  });

  it('returns null when the only line in reach is refused', () => {
    expect(snapToTestLine([50, 22], lines, 5, () => false)).to.equal(null);
  });

  it('snaps to a circle of a three-circle pattern by its radius', () => {
    const rings = [circle(100, 100, 90), circle(100, 100, 60), circle(100, 100, 30)];
    const hit = snapToTestLine([100, 163], rings, 5);

    expect(hit?.line).to.equal(1);
    expect(hit?.point[1]).to.be.closeTo(160, 1e-9);
    expect(hit?.distancePx).to.be.closeTo(3, 1e-9);
  });
});

describe('client: test-line snapping, the mark under a click', () => {
  const marks = [
    { x: 10, y: 10 },
    { x: 14, y: 10 },
    { x: 80, y: 80 },
  ];

  it('finds the nearest mark within the tolerance', () => {
    expect(markNear([13, 10], marks, 5)).to.equal(1);
    expect(markNear([11, 10], marks, 5)).to.equal(0);
  });

  it('answers -1 when no mark is within the tolerance, or there are none', () => {
    expect(markNear([50, 50], marks, 5)).to.equal(-1);
    expect(markNear([10, 10], [], 5)).to.equal(-1);
  });
});

describe('client: test-line snapping, spacing for "about N lines"', () => {
  it('lays N lines with N + 1 equal gaps across the field', () => {
    // Hand-computed: 1000 px / (9 + 1) = 100 px; at 0.5 µm/px that is 50 µm.
    expect(spacingToReach(9, 1000, 0.5)).to.equal(50);
  });

  it('rounds to three significant digits', () => {
    // Hand-computed: 1000 / 10 × 0.2427 = 24.27 µm → 24.3; 2048 / 5 × 0.2427 = 99.4099 → 99.4;
    // 4000 / 3 × 0.2427 = 323.6 → 324.
    expect(spacingToReach(9, 1000, 0.2427)).to.equal(24.3);
    expect(spacingToReach(4, 2048, 0.2427)).to.equal(99.4);
    expect(spacingToReach(2, 4000, 0.2427)).to.equal(324);
  });

  // Skipped: spacingToReach floors the decimals at 0, so 1234.4 µm stays "1234" (4 digits) (bug reported).
  it('keeps spacings of a millimetre and more to three significant digits', () => {
    // Hand-computed: 10000 px / 5 × 0.6172 µm/px = 1234.4 µm → 1230.
    expect(spacingToReach(4, 10_000, 0.6172)).to.equal(1230);
  });

  it('keeps small spacings to three significant digits too', () => {
    // Hand-computed: 100 / 11 × 0.05 = 0.4545… µm → 0.455.
    expect(spacingToReach(10, 100, 0.05)).to.equal(0.455);
  });
});

describe('client: test-line snapping, pieces of lines counted by the server', () => {
  it('splits each piece into straight segments named by their test line', () => {
    const segs = pathSegments([
      { line: 0, pieces: [[[0, 0], [10, 0], [10, 10]]] },
      { line: 2, pieces: [[[0, 50], [5, 50]], [[20, 50], [30, 50]]] },
    ]);

    expect(segs.map((s) => s.line)).to.deep.equal([0, 0, 2, 2]);
    expect(segs.map((s) => (s.seg.kind === 'segment' ? [s.seg.a, s.seg.b] : null))).to.deep.equal([
      [[0, 0], [10, 0]],
      [[10, 0], [10, 10]],
      [[0, 50], [5, 50]],
      [[20, 50], [30, 50]],
    ]);
  });

  it('names the test line, not the piece index, when a click snaps to a piece', () => {
    const segs = pathSegments([
      { line: 0, pieces: [[[0, 0], [100, 0]]] },
      { line: 3, pieces: [[[0, 40], [40, 40]], [[60, 40], [100, 40]]] },
    ]);
    const hit = snapToSegments([80, 42], segs, 5);

    expect(hit?.line).to.equal(3);
    expect(hit?.point).to.deep.equal([80, 40]);
  });

  it('does not snap into a gap between pieces of a clipped line', () => {
    const segs = pathSegments([{ line: 1, pieces: [[[0, 40], [40, 40]], [[60, 40], [100, 40]]] }]);

    expect(snapToSegments([50, 40], segs, 5)).to.equal(null);
  });
});
