import { expect } from 'chai';
import { pixelSizeFromLine } from '../../../shared/annotations/calibration';
import { angleDeg, polylineLength, ringArea, ringPerimeter, ringProblem, ringSelfIntersects, type Point } from '../../../shared/annotations/geometry';

/** A regular n-gon of circumradius r: area (n/2)·r²·sin(2π/n), perimeter 2·n·r·sin(π/n) (elementary geometry) [C]. */
function regularPolygon(n: number, r: number, cx = 500, cy = 400): Point[] {
  return Array.from({ length: n }, (_, i) => [cx + r * Math.cos((2 * Math.PI * i) / n), cy + r * Math.sin((2 * Math.PI * i) / n)] as const);
}

describe('annotations: geometry in image pixels', () => {
  it('measures a 3-4-5 polyline and a rectangle by hand', () => {
    // Hand-computed: legs 3 and 4 → 5; a 30 × 40 rectangle has area 1200 and perimeter 140.
    expect(polylineLength([[0, 0], [3, 0], [3, 4]])).to.equal(7);
    expect(polylineLength([[10, 10], [13, 14]])).to.equal(5);
    const rect: Point[] = [[0, 0], [30, 0], [30, 40], [0, 40]];
    expect(ringArea(rect)).to.equal(1200);
    expect(ringPerimeter(rect)).to.equal(140);
  });

  it('measures regular polygons against their closed forms, in either winding', () => {
    for (const n of [3, 6, 17, 360]) {
      const ring = regularPolygon(n, 100);
      expect(ringArea(ring)).to.be.closeTo((n / 2) * 100 ** 2 * Math.sin((2 * Math.PI) / n), 1e-6);
      expect(ringArea([...ring].reverse())).to.be.closeTo(ringArea(ring), 1e-9);
      expect(ringPerimeter(ring)).to.be.closeTo(2 * n * 100 * Math.sin(Math.PI / n), 1e-6);
    }
  });

  it('converts to µm² with the pixel size squared', () => {
    // 0.5 µm/px: a 30 × 40 px rectangle is 15 × 20 µm = 300 µm² (hand-computed).
    expect(ringArea([[0, 0], [30, 0], [30, 40], [0, 40]]) * 0.5 ** 2).to.equal(300);
  });

  it('finds self-crossing and degenerate outlines', () => {
    const bowtie: Point[] = [[0, 0], [10, 10], [10, 0], [0, 10]];
    expect(ringSelfIntersects(bowtie)).to.equal(true);
    expect(ringProblem(bowtie)).to.contain('crosses itself');
    expect(ringProblem([[0, 0], [5, 5], [10, 10]])).to.contain('no area');
    expect(ringProblem([[0, 0], [0, 0], [1, 1]])).to.contain('three distinct');
    expect(ringProblem(regularPolygon(12, 50))).to.equal(null);
  });

  it('measures angles', () => {
    expect(angleDeg([10, 0], [0, 0], [0, 10])).to.be.closeTo(90, 1e-9);
    expect(angleDeg([10, 0], [0, 0], [10, 10])).to.be.closeTo(45, 1e-9);
    expect(angleDeg([10, 0], [0, 0], [-10, 0])).to.be.closeTo(180, 1e-9);
  });
});

describe('annotations: calibration from a drawn line', () => {
  it('gives 0.2427 µm/px for 100 µm over 412 px', () => {
    // TRADE primer, calibration section: 100 µm over 412 px = 0.2427 µm/px [C].
    const { umPerPx, warning } = pixelSizeFromLine([100, 200], [512, 200], 100);
    expect(umPerPx).to.be.closeTo(0.2427, 5e-5);
    expect(warning).to.equal(null);
  });

  it('uses the true length of a slanted line', () => {
    // A 3-4-5 line scaled ×100 is 500 px long; 50 µm over it → 0.1 µm/px (hand-computed).
    expect(pixelSizeFromLine([0, 0], [300, 400], 50).umPerPx).to.be.closeTo(0.1, 1e-12);
  });

  it('refuses a zero-length line and a non-positive length, and warns outside 0.1 nm–1 mm', () => {
    expect(() => pixelSizeFromLine([5, 5], [5, 5], 10)).to.throw(RangeError);
    expect(() => pixelSizeFromLine([0, 0], [100, 0], 0)).to.throw(RangeError);
    expect(() => pixelSizeFromLine([0, 0], [100, 0], -3)).to.throw(RangeError);
    expect(pixelSizeFromLine([0, 0], [100, 0], 1e6).warning).to.contain('outside');
    expect(pixelSizeFromLine([0, 0], [100, 0], 1e-6).warning).to.contain('outside');
  });
});
