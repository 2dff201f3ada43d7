import { expect } from 'chai';
import type { AnnotationKind } from '../../../../shared/annotations/annotations';
import type { Point } from '../../../../shared/annotations/geometry';
import {
  boundsIntersect,
  boundsOf,
  distanceToPath,
  growBounds,
  hitsShape,
  nearestVertex,
  pointInRing,
  topmostHit,
  type HitTarget,
} from '../../../../src/app/viewer/hit-test';

const target = (key: string, kind: AnnotationKind, points: Point[], label = ''): HitTarget => ({ key, kind, points, label, bounds: boundsOf(points) });
const square: Point[] = [[0, 0], [100, 0], [100, 100], [0, 100]];
/** A U open at the top: the notch (40…60, 0…80) is outside. */
const uShape: Point[] = [[0, 0], [40, 0], [40, 80], [60, 80], [60, 0], [100, 0], [100, 100], [0, 100]];

describe('client: hit testing, bounds', () => {
  it('finds the box around a shape', () => {
    expect(boundsOf([[5, -2], [-3, 8], [1, 1]])).to.deep.equal({ minX: -3, minY: -2, maxX: 5, maxY: 8 });
  });

  it('sees boxes that overlap or touch as intersecting, and apart ones as not', () => {
    const a = { minX: 0, minY: 0, maxX: 10, maxY: 10 };

    expect(boundsIntersect(a, { minX: 5, minY: 5, maxX: 20, maxY: 20 })).to.equal(true);
    expect(boundsIntersect(a, { minX: 10, minY: 0, maxX: 20, maxY: 10 })).to.equal(true);
    expect(boundsIntersect(a, { minX: 11, minY: 0, maxX: 20, maxY: 10 })).to.equal(false);
    expect(boundsIntersect(a, { minX: 0, minY: -9, maxX: 10, maxY: -1 })).to.equal(false);
  });

  it('grows a box on every side', () => {
    expect(growBounds({ minX: 0, minY: 0, maxX: 10, maxY: 10 }, 6)).to.deep.equal({ minX: -6, minY: -6, maxX: 16, maxY: 16 });
  });
});

describe('client: hit testing, rings and paths', () => {
  it('tells inside from outside a square', () => {
    expect(pointInRing([50, 50], square)).to.equal(true);
    expect(pointInRing([150, 50], square)).to.equal(false);
    expect(pointInRing([50, -1], square)).to.equal(false);
  });

  it('puts the notch of a concave outline outside it', () => {
    expect(pointInRing([50, 40], uShape)).to.equal(false);
    expect(pointInRing([20, 40], uShape)).to.equal(true);
    expect(pointInRing([50, 90], uShape)).to.equal(true);
  });

  it('measures to the closing edge of a ring but not of an open line', () => {
    // (−3, 50) is 3 px from the closing edge x = 0; the open path's nearest end is (0, 100): √(9 + 2500) = 50.09 [C].
    expect(distanceToPath([-3, 50], square, true)).to.equal(3);
    expect(distanceToPath([-3, 50], square, false)).to.be.closeTo(Math.hypot(3, 50), 1e-12);
  });

  it('measures to a lone point as the distance to it', () => {
    expect(distanceToPath([3, 4], [[0, 0]], false)).to.equal(5);
  });
});

describe('client: hit testing, one shape', () => {
  it('hits a line within 6 screen px of it, in image pixels at the current zoom', () => {
    const line = target('l', 'polyline', [[0, 0], [100, 0]]);

    expect(hitsShape(line, [50, 5.9], 1)).to.equal(true);
    expect(hitsShape(line, [50, 6.1], 1)).to.equal(false);
    // Zoomed out 4×: one screen px is 4 image px, so 6 screen px reach 24 image px [C].
    expect(hitsShape(line, [50, 23], 4)).to.equal(true);
    expect(hitsShape(line, [50, 25], 4)).to.equal(false);
  });

  it('hits an outline anywhere inside and near its edge, but not in its notch', () => {
    const region = target('u', 'polygon', uShape);

    expect(hitsShape(region, [20, 50], 1)).to.equal(true);
    expect(hitsShape(region, [-4, 50], 1)).to.equal(true);
    expect(hitsShape(region, [50, 40], 1)).to.equal(false);
  });

  it('hits the inside of a rectangle but not the inside of a polyline that happens to close', () => {
    expect(hitsShape(target('r', 'rectangle', square), [50, 50], 1)).to.equal(true);
    expect(hitsShape(target('p', 'polyline', [...square, [0, 0]]), [50, 50], 1)).to.equal(false);
  });

  it('hits a point marker within its radius plus the tolerance', () => {
    // 5 px marker + 6 px tolerance = 11 px [C].
    const marker = target('p', 'point', [[10, 10]]);

    expect(hitsShape(marker, [10, 20.9], 1)).to.equal(true);
    expect(hitsShape(marker, [10, 21.1], 1)).to.equal(false);
  });

  it('hits a note on its text, drawn to the right of and above its pin', () => {
    const note = target('n', 'text', [[100, 100]], 'oxide chain');

    expect(hitsShape(note, [150, 90], 1)).to.equal(true);
    expect(hitsShape(note, [150, 110], 1)).to.equal(false);
    expect(hitsShape(note, [60, 90], 1)).to.equal(false);
  });

  it('makes a longer note wider to hit, up to a limit', () => {
    const short = target('s', 'text', [[0, 100]], 'pore');
    const long = target('l', 'text', [[0, 100]], 'x'.repeat(200));

    expect(hitsShape(short, [120, 95], 1)).to.equal(false);
    expect(hitsShape(long, [120, 95], 1)).to.equal(true);
    expect(hitsShape(long, [1000, 95], 1)).to.equal(false);
  });
});

describe('client: hit testing, the shape under the pointer', () => {
  it('picks the shape drawn last where two overlap', () => {
    const lines = [target('first', 'polyline', [[0, 0], [100, 0]]), target('second', 'polyline', [[0, 1], [100, 1]])];

    expect(topmostHit(lines, [50, 0.5], 1)).to.equal('second');
  });

  it('picks a small mark inside a large region even when the region was drawn later', () => {
    const shapes = [target('particle', 'point', [[50, 50]]), target('grain', 'polygon', square)];

    expect(topmostHit(shapes, [51, 50], 1)).to.equal('particle');
  });

  it('picks the region when the pointer is inside it and on nothing else', () => {
    const shapes = [target('particle', 'point', [[10, 10]]), target('grain', 'polygon', square)];

    expect(topmostHit(shapes, [60, 60], 1)).to.equal('grain');
  });

  it('picks the region whose edge is under the pointer over one it is merely inside', () => {
    const shapes = [target('inner', 'polygon', [[20, 20], [80, 20], [80, 80], [20, 80]]), target('outer', 'polygon', square)];

    expect(topmostHit(shapes, [21, 50], 1)).to.equal('inner');
    expect(topmostHit(shapes, [99, 50], 1)).to.equal('outer');
  });

  it('finds nothing on empty ground', () => {
    expect(topmostHit([target('grain', 'polygon', square)], [300, 300], 1)).to.equal(null);
    expect(topmostHit([], [0, 0], 1)).to.equal(null);
  });
});

describe('client: hit testing, vertex handles', () => {
  it('finds the nearest vertex within 8 screen px', () => {
    expect(nearestVertex(square, [97, 2], 1)).to.equal(1);
    expect(nearestVertex([[0, 0], [4, 0]], [3, 0], 1)).to.equal(1);
  });

  it('finds none farther away, scaled by the zoom', () => {
    expect(nearestVertex(square, [50, 50], 1)).to.equal(-1);
    expect(nearestVertex(square, [10, 0], 1)).to.equal(-1);
    // Zoomed out 2×: 8 screen px reach 16 image px [C].
    expect(nearestVertex(square, [10, 0], 2)).to.equal(0);
  });
});
