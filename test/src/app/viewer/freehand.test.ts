import { expect } from 'chai';
import type { Point } from '../../../../shared/annotations/geometry';
import { appendIfApart, distanceToSegment, freehandOutline, simplifyPath, thinPath } from '../../../../src/app/viewer/freehand';

/** Farthest any of `points` lies from the closed ring. */
function worstDeviation(points: readonly Point[], ring: readonly Point[]): number {
  return Math.max(...points.map((p) => Math.min(...ring.map((a, i) => distanceToSegment(p, a, ring[(i + 1) % ring.length]!)))));
}

/** A dragged outline of a 100 px square, sampled every 0.5 px, ending where it began. */
function draggedSquare(): Point[] {
  const pts: Point[] = [];
  for (let t = 0; t < 100; t += 0.5) pts.push([t, 0]);
  for (let t = 0; t < 100; t += 0.5) pts.push([100, t]);
  for (let t = 0; t < 100; t += 0.5) pts.push([100 - t, 100]);
  for (let t = 0; t <= 100; t += 0.5) pts.push([0, 100 - t]);
  return pts;
}

describe('client: freehand, thinning the pointer samples', () => {
  it('keeps the first sample and then only those at least the spacing away from the last kept one', () => {
    const path: Point[] = [];

    expect(appendIfApart(path, [0, 0], 2)).to.equal(true);
    expect(appendIfApart(path, [1, 1], 2)).to.equal(false);
    expect(appendIfApart(path, [2, 0], 2)).to.equal(true);
    expect(path).to.deep.equal([[0, 0], [2, 0]]);
  });

  it('thins a path sampled every 0.5 px to one point every 2 px', () => {
    const samples: Point[] = Array.from({ length: 21 }, (_, i) => [i * 0.5, 0]);

    expect(thinPath(samples, 2)).to.deep.equal([[0, 0], [2, 0], [4, 0], [6, 0], [8, 0], [10, 0]]);
  });
});

describe('client: freehand, distance to a segment', () => {
  it('measures square to the segment when the foot falls on it', () => {
    // 3-4-5 triangle: (3, 4) lies 4 from the x axis [C].
    expect(distanceToSegment([3, 4], [0, 0], [10, 0])).to.equal(4);
  });

  it('measures to the nearer end beyond the segment', () => {
    // (13, 4) to (10, 0): √(9 + 16) = 5 [C].
    expect(distanceToSegment([13, 4], [0, 0], [10, 0])).to.equal(5);
    expect(distanceToSegment([-3, -4], [0, 0], [10, 0])).to.equal(5);
  });

  it('measures to the point when the segment has no length', () => {
    expect(distanceToSegment([3, 4], [0, 0], [0, 0])).to.equal(5);
  });
});

describe('client: freehand, Ramer–Douglas–Peucker simplification', () => {
  // Douglas & Peucker, The Canadian Cartographer 10 (1973) 112 (from memory): keep a point when it lies farther than the tolerance from the chord.
  it('drops points that lie on a straight line, keeping the ends', () => {
    expect(simplifyPath([[0, 0], [1, 0.2], [2, -0.2], [3, 0], [4, 0]], 1)).to.deep.equal([[0, 0], [4, 0]]);
  });

  it('keeps a corner that stands out more than the tolerance', () => {
    expect(simplifyPath([[0, 0], [5, 0.5], [10, 0], [10, 10]], 1)).to.deep.equal([[0, 0], [10, 0], [10, 10]]);
  });

  it('keeps a bump just over the tolerance and drops one just under it', () => {
    expect(simplifyPath([[0, 0], [5, 1.01], [10, 0]], 1)).to.have.length(3);
    expect(simplifyPath([[0, 0], [5, 0.99], [10, 0]], 1)).to.have.length(2);
  });

  it('leaves every original point within the tolerance of the result', () => {
    const wave: Point[] = Array.from({ length: 400 }, (_, i) => [i, 20 * Math.sin(i / 30)]);
    const simple = simplifyPath(wave, 0.5);

    const worst = Math.max(...wave.map((p) => Math.min(...simple.slice(1).map((b, i) => distanceToSegment(p, simple[i]!, b)))));
    expect(simple.length).to.be.below(wave.length / 5);
    expect(worst).to.be.at.most(0.5);
  });

  it('copies paths too short to simplify', () => {
    const two: Point[] = [[0, 0], [1, 1]];

    const copy = simplifyPath(two, 1);

    expect(copy).to.deep.equal(two);
    expect(copy).not.to.equal(two);
  });

  it('simplifies a long drag of 50 000 samples to a few hundred points', () => {
    const long: Point[] = Array.from({ length: 50_000 }, (_, i) => [i, 50 * Math.sin(i / 1000)]);

    const simple = simplifyPath(long, 1);

    expect(simple.length).to.be.within(10, 1000);
    expect(simple[0]).to.equal(long[0]);
    expect(simple.at(-1)).to.equal(long.at(-1));
  });
});

describe('client: freehand, closed outlines', () => {
  it('reduces a dragged square to its four corners, without repeating the start', () => {
    expect(freehandOutline(draggedSquare(), 2, 1)).to.deep.equal([[0, 0], [100, 0], [100, 100], [0, 100]]);
  });

  it('follows a dragged circle within the tolerance, enclosing nearly its area', () => {
    // Circle r = 100 px sampled every 0.5°; with a 1 px tolerance the ring keeps πr² within 1 % [C].
    const circle: Point[] = Array.from({ length: 721 }, (_, i) => [500 + 100 * Math.cos((i * Math.PI) / 360), 500 + 100 * Math.sin((i * Math.PI) / 360)]);
    const ring = freehandOutline(circle, 2, 1);

    expect(worstDeviation(circle, ring)).to.be.at.most(2);
    const twiceArea = ring.reduce((s, [x1, y1], i) => s + x1 * ring[(i + 1) % ring.length]![1] - ring[(i + 1) % ring.length]![0] * y1, 0);
    expect(Math.abs(twiceArea / 2)).to.be.closeTo(Math.PI * 100 ** 2, 0.01 * Math.PI * 100 ** 2);
  });

  it('gives back fewer than three points for a drag too small to outline anything', () => {
    expect(freehandOutline([[0, 0], [1, 0], [0, 1]], 2, 1)).to.deep.equal([[0, 0]]);
  });
});
