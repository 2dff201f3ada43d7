import { expect } from 'chai';
import type { Point } from '../../../shared/annotations/geometry';
import { clipSegmentByDistance } from '../../../shared/measurements/layers';
import { clipSegmentToRing, pointInRing } from '../../../shared/measurements/patterns';
import { gridPoints } from '../../../shared/measurements/point-count';

const length = (pieces: [Point, Point][]) => pieces.reduce((a, [p, q]) => a + Math.hypot(q[0] - p[0], q[1] - p[1]), 0);

describe('measurements: clipping test lines to outlines and sub-bands, and point grids', () => {
  // An L-shaped outline: the square 0-100 with the quarter 50-100 × 50-100 cut away (concave).
  const ell: Point[] = [[0, 0], [100, 0], [100, 50], [50, 50], [50, 100], [0, 100]];

  it('tells inside from outside of a concave outline', () => {
    expect(pointInRing([25, 75], ell)).to.equal(true);
    expect(pointInRing([75, 75], ell)).to.equal(false);
    expect(pointInRing([75, 25], ell)).to.equal(true);
  });

  it('keeps exactly the parts of a segment inside a concave outline', () => {
    // y = 75 crosses the L from x = 0 to 50 only; y = 25 from 0 to 100; the diagonal from (0,0) to (100,100) runs
    // inside up to (50, 50) and leaves there: 50·√2 (hand-computed).
    expect(clipSegmentToRing([-20, 75], [120, 75], ell)).to.deep.equal([[[0, 75], [50, 75]]]);
    expect(length(clipSegmentToRing([-20, 25], [120, 25], ell))).to.be.closeTo(100, 1e-9);
    expect(length(clipSegmentToRing([0, 0], [100, 100], ell))).to.be.closeTo(50 * Math.SQRT2, 1e-9);
    // A U-shape opening upwards: a line through both arms gives two pieces (hand-computed: 20 + 20).
    const u: Point[] = [[0, 0], [20, 0], [20, 80], [40, 80], [40, 0], [60, 0], [60, 100], [0, 100]];
    const pieces = clipSegmentToRing([-5, 40], [65, 40], u);
    expect(pieces).to.have.length(2);
    expect(length(pieces)).to.be.closeTo(40, 1e-9);
  });

  it('keeps the parts of a segment within a distance range of lines, to within a millionth of a pixel', () => {
    // Interfaces y = 0 and y = 100; a vertical segment from y = -50 to 150, kept where 10 ≤ distance ≤ 20:
    // y in [10, 20] and [80, 90], and below/above the lines y in [-20, -10] and [110, 120]: 4 pieces of 10 (hand-computed).
    const lines: Point[][] = [[[-500, 0], [500, 0]], [[-500, 100], [500, 100]]];
    const pieces = clipSegmentByDistance([0, -50], [0, 150], lines, 10, 20);
    expect(pieces).to.have.length(4);
    const ys = pieces.flatMap(([p, q]) => [p[1], q[1]]);
    [-20, -10, 10, 20, 80, 90, 110, 120].forEach((y, i) => expect(ys[i]).to.be.closeTo(y, 1e-6));
  });

  it('lays a point grid centred on the image, edges included, moved by an offset', () => {
    // 2000 × 1500 at 200 px: x = 0 … 2000 (11), y = 150 … 1350 (7) → 77 points (hand-computed).
    const grid = gridPoints(2000, 1500, 200);
    expect(grid).to.have.length(77);
    expect(grid[0]).to.deep.equal([0, 150]);
    // Moved 100 px right: x = 100 … 1900 (10) → 70 points.
    expect(gridPoints(2000, 1500, 200, [100, 0])).to.have.length(70);
    expect(() => gridPoints(10, 10, 0)).to.throw(RangeError);
  });
});
