import { expect } from 'chai';
import type { Point } from '../../../shared/annotations/geometry';
import { clipSegmentToBand, distanceToPolyline, inBand, interfaceAxis, layerBands, layerThickness, samplesAlong } from '../../../shared/measurements/layers';

const sampled = (f: (x: number) => number, x0: number, x1: number, n: number): Point[] =>
  Array.from({ length: n + 1 }, (_, i) => {
    const x = x0 + ((x1 - x0) * i) / n;
    return [x, f(x)] as const;
  });

describe('measurements: layer bands from interface lines', () => {
  const lines = [sampled(() => 600, 0, 2000, 4), sampled(() => 200, 0, 2000, 4), sampled((x) => 1000 + 40 * Math.sin(x / 150), 0, 2000, 80)];

  it('numbers the bands across the interfaces, including the two beyond them', () => {
    const bands = layerBands(lines);
    expect(bands).to.have.length(4);
    expect(interfaceAxis(lines)).to.equal('x');
    expect(inBand(bands[0]!, [500, 100], 'x')).to.equal(true);
    expect(inBand(bands[1]!, [500, 400], 'x')).to.equal(true);
    expect(inBand(bands[2]!, [500, 800], 'x')).to.equal(true);
    expect(inBand(bands[3]!, [500, 1200], 'x')).to.equal(true);
    expect(inBand(bands[1]!, [500, 800], 'x')).to.equal(false);
  });

  it('finds vertical interfaces too', () => {
    const vertical = [[[300, 0], [310, 1500]], [[900, 0], [880, 1500]]] as Point[][];
    expect(interfaceAxis(vertical)).to.equal('y');
    const bands = layerBands(vertical);
    expect(inBand(bands[1]!, [600, 700], 'y')).to.equal(true);
    expect(inBand(bands[1]!, [100, 700], 'y')).to.equal(false);
  });

  it('clips a test line to a band by the exact crossing points', () => {
    // Band between y = 200 and the wavy interface; a horizontal test line at y = 1000 lies inside where the wave is above it...
    // ...reference: the fraction of 200 000 points along the line that fall inside (dense numeric reference computed here).
    const band = layerBands(lines)[2]!;
    const clipped = clipSegmentToBand([0, 1000], [2000, 1000], band, 'x');
    const length = clipped.reduce((a, [p, q]) => a + Math.hypot(q[0] - p[0], q[1] - p[1]), 0);
    let inside = 0;
    const n = 200_000;
    for (let i = 0; i < n; i++) if (inBand(band, [(2000 * (i + 0.5)) / n, 1000], 'x')) inside++;
    expect(length).to.be.closeTo((2000 * inside) / n, 0.05);
    expect(clipped.length).to.be.greaterThan(1);
  });

  it('keeps a test line wholly inside a band whole, and drops one wholly outside', () => {
    const band = layerBands(lines)[1]!;
    expect(clipSegmentToBand([100, 400], [1900, 400], band, 'x')).to.deep.equal([[[100, 400], [1900, 400]]]);
    expect(clipSegmentToBand([100, 100], [1900, 100], band, 'x')).to.deep.equal([]);
  });
});

describe('measurements: layer thickness', () => {
  it('is exact for parallel straight lines', () => {
    // Two horizontal lines 200 px apart at 0.5 µm/px: 100 µm everywhere (hand-computed).
    const t = layerThickness([[0, 100], [4000, 100]], [[0, 300], [4000, 300]], 0.5, 50);
    expect(t.meanUm).to.equal(100);
    expect(t.sUm).to.equal(0);
    expect(t.samplesUm).to.have.length(41); // 2000 µm of line every 50 µm, both ends (hand-computed)
    // Slanted parallels y = 0.2x + c, 200 px apart vertically: perpendicular distance 200/√(1 + 0.2²) px [C].
    const s = layerThickness([[0, 100], [3000, 700]], [[-1000, 100], [5000, 1300]], 1, 100);
    expect(s.meanUm).to.be.closeTo(200 / Math.sqrt(1.04), 1e-9);
  });

  it('matches a dense numeric reference for wavy interfaces', () => {
    const f1 = (x: number) => 300 + 25 * Math.sin(x / 120);
    const f2 = (x: number) => 700 + 30 * Math.sin(x / 90 + 1);
    const coarse1 = sampled(f1, 0, 3000, 600);
    const coarse2 = sampled(f2, -200, 3200, 700);
    const profile = layerThickness(coarse1, coarse2, 0.8, 20);
    // Reference: for each sample point, the minimum distance to 200 000 points of the exact second curve (computed here).
    const dense = sampled(f2, -200, 3200, 200_000);
    const reference = samplesAlong(coarse1, 20 / 0.8).map((p) => dense.reduce((best, q) => Math.min(best, Math.hypot(q[0] - p[0], q[1] - p[1])), Infinity) * 0.8);
    const refMean = reference.reduce((a, b) => a + b, 0) / reference.length;
    expect(profile.meanUm).to.be.closeTo(refMean, refMean * 0.002);
    expect(profile.minUm).to.be.lessThan(profile.meanUm);
    expect(profile.maxUm).to.be.greaterThan(profile.meanUm);
  });

  it('measures distance to a polyline, ends included', () => {
    expect(distanceToPolyline([5, 5], [[0, 0], [10, 0]])).to.equal(5);
    expect(distanceToPolyline([13, 4], [[0, 0], [10, 0]])).to.equal(5);
  });
});
