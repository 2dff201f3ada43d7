import { expect } from 'chai';
import { clipToRect, patternLines, spacingForCount, THREE_CIRCLE_RATIOS } from '../../../shared/measurements/patterns';

describe('measurements: test patterns', () => {
  it('lays parallel horizontal lines at the given spacing in µm, centred', () => {
    // 5 lines 100 µm apart at 0.5 µm/px ⇒ 200 px apart, centred on a 2000 × 1500 image: y = 350, 550, 750, 950, 1150 (hand-computed).
    const lines = patternLines({ type: 'lines', direction: 'horizontal', spacingUm: 100, count: 5 }, 2000, 1500, 0.5);
    expect(lines.map((l) => (l.kind === 'segment' ? l.a[1] : NaN))).to.deep.equal([350, 550, 750, 950, 1150]);
    expect(lines.every((l) => l.kind === 'segment' && l.b[0] - l.a[0] === 2000)).to.equal(true);
  });

  it('gives both families for "both" and clips angled lines to the image', () => {
    expect(patternLines({ type: 'lines', direction: 'both', spacingUm: 100, count: 3 }, 1000, 1000, 1)).to.have.length(6);
    const angled = patternLines({ type: 'lines', direction: 'angle', angleDeg: 45, spacingUm: 100, count: 1 }, 1000, 1000, 1);
    expect(angled).to.have.length(1);
    const l = angled[0]!;
    // The 45° diagonal through the centre of a 1000 px square runs corner to corner: 1000·√2 px (hand-computed).
    if (l.kind === 'segment') expect(Math.hypot(l.b[0] - l.a[0], l.b[1] - l.a[1])).to.be.closeTo(1000 * Math.SQRT2, 1e-6);
  });

  it('sizes three concentric circles 3 : 2 : 1 (E112)', () => {
    // TRADE primer: the three-circle pattern's diameters are in ratio 79.58 : 53.05 : 26.53 ≈ 3 : 2 : 1 [C].
    expect(THREE_CIRCLE_RATIOS[1] * 79.58).to.be.closeTo(53.05, 0.01);
    expect(THREE_CIRCLE_RATIOS[2] * 79.58).to.be.closeTo(26.53, 0.01);
    const circles = patternLines({ type: 'three_circles', largestDiameterUm: 300 }, 2000, 2000, 0.5);
    expect(circles.map((c) => (c.kind === 'circle' ? c.radius : NaN))).to.deep.equal([300, 200, 100]);
  });

  it('clips segments to the image and drops those that miss it', () => {
    expect(clipToRect([-100, 50], [300, 50], 200, 100)).to.deep.equal([[0, 50], [200, 50]]);
    expect(clipToRect([-100, -50], [300, -50], 200, 100)).to.equal(null);
  });

  it('spaces lines evenly to reach a target count', () => {
    expect(spacingForCount(9, 1000, 0.5)).to.equal(50);
  });
});
