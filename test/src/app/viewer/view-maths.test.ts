import { expect } from 'chai';
import { screenToImage, type Viewport } from '../../../../shared/viewer/viewport';
import { centreOn, keepInView, overviewRect, overviewToImage, pinch, resizeViewport, viewportForBounds, wheelZoomFactor } from '../../../../src/app/viewer/view-maths';

const image = { width: 2000, height: 1000 };
const view = (over: Partial<Viewport> = {}): Viewport => ({ scale: 1, x: 0, y: 0, width: 400, height: 300, ...over });
const centreOf = (v: Viewport) => screenToImage(v, v.width / 2, v.height / 2);

describe('client: view maths, the overview', () => {
  it('draws the view outline scaled to the overview box', () => {
    // Hand-computed: a 200 × 200 box shows 2000 × 1000 at 0.1; the view 500…900 × 250…550 becomes 50, 25, 40 × 30.
    expect(overviewRect(view({ x: 500, y: 250 }), image, 200, 200)).to.deep.equal({ x: 50, y: 25, width: 40, height: 30 });
  });

  it('clips the outline to the image when the view hangs over its edge', () => {
    // Hand-computed: the view −100…300 keeps 0…300 of the image, 30 px at 0.1.
    const r = overviewRect(view({ x: -100, y: 0 }), image, 200, 200);

    expect(r.x).to.equal(0);
    expect(r.width).to.be.closeTo(30, 1e-9);
  });

  it('gives an empty outline for a view entirely off the image', () => {
    const r = overviewRect(view({ x: 5000 }), image, 200, 200);

    expect(r.width).to.equal(0);
  });

  it('turns a click on the overview into the image point under it', () => {
    expect(overviewToImage(image, 200, 200, 50, 25)).to.deep.equal({ x: 500, y: 250 });
  });
});

describe('client: view maths, moving the view', () => {
  it('centres an image point on the screen at the same zoom', () => {
    const v = centreOn(view({ scale: 2 }), 1000, 500);

    expect(v.scale).to.equal(2);
    expect(centreOf(v)).to.deep.equal({ x: 1000, y: 500 });
  });

  it('fits a shape with a margin on the screen, centred', () => {
    // Hand-computed: 800 × 600 screen less 2 × 48 margin is 704 × 504; a 200 × 100 box fits at min(3.52, 5.04) = 3.52.
    const v = viewportForBounds(view({ width: 800, height: 600 }), { minX: 100, minY: 100, maxX: 300, maxY: 200 });

    expect(v.scale).to.be.closeTo(3.52, 1e-9);
    expect(centreOf(v).x).to.be.closeTo(200, 1e-9);
    expect(centreOf(v).y).to.be.closeTo(150, 1e-9);
  });

  it('does not zoom past the cap on a point', () => {
    const v = viewportForBounds(view({ width: 800, height: 600 }), { minX: 40, minY: 40, maxX: 40, maxY: 40 }, 48, 3);

    expect(v.scale).to.equal(3);
    expect(centreOf(v)).to.deep.equal({ x: 40, y: 40 });
  });

  it('keeps the image point at the centre when the screen is resized', () => {
    const v = resizeViewport(view({ x: 300, y: 200, scale: 1.5 }), 1000, 700);

    expect(v.scale).to.equal(1.5);
    expect([v.width, v.height]).to.deep.equal([1000, 700]);
    expect(centreOf(v).x).to.be.closeTo(300 + 200 / 1.5, 1e-9);
    expect(centreOf(v).y).to.be.closeTo(200 + 150 / 1.5, 1e-9);
  });
});

describe('client: view maths, not losing the image', () => {
  const overlapX = (v: Viewport) => Math.min(image.width, v.x + v.width / v.scale) - Math.max(0, v.x);

  it('leaves a view over the image where it is', () => {
    const v = view({ x: 800, y: 300 });

    expect(keepInView(v, image)).to.deep.equal(v);
  });

  it('pulls a view panned far off either side back until a quarter of it shows image', () => {
    // Hand-computed: a 400 px wide view keeps at least 100 px of image.
    const right = keepInView(view({ x: 9000 }), image);
    const left = keepInView(view({ x: -9000 }), image);

    expect(overlapX(right)).to.be.closeTo(100, 1e-9);
    expect(overlapX(left)).to.be.closeTo(100, 1e-9);
  });
});

describe('client: view maths, pinch and wheel', () => {
  it('zooms by the change in finger distance and keeps the point between the fingers still', () => {
    const v = view({ x: 100, y: 100 });
    const under = screenToImage(v, 200, 150);
    const next = pinch(v, image, [{ x: 150, y: 150 }, { x: 250, y: 150 }], [{ x: 100, y: 150 }, { x: 300, y: 150 }]);

    expect(next.scale).to.be.closeTo(2, 1e-9);
    expect(screenToImage(next, 200, 150).x).to.be.closeTo(under.x, 1e-9);
    expect(screenToImage(next, 200, 150).y).to.be.closeTo(under.y, 1e-9);
  });

  it('pans with two fingers moved together, without zooming', () => {
    const v = view({ x: 100, y: 100, scale: 2 });
    const next = pinch(v, image, [{ x: 100, y: 100 }, { x: 200, y: 100 }], [{ x: 150, y: 120 }, { x: 250, y: 120 }]);

    expect(next.scale).to.equal(2);
    expect(next.x).to.be.closeTo(100 - 50 / 2, 1e-9);
    expect(next.y).to.be.closeTo(100 - 20 / 2, 1e-9);
  });

  it('zooms in for a wheel turned away from the user and out for one turned back, by inverse amounts', () => {
    expect(wheelZoomFactor(-100, 0)).to.be.greaterThan(1);
    expect(wheelZoomFactor(100, 0)).to.be.lessThan(1);
    expect(wheelZoomFactor(100, 0) * wheelZoomFactor(-100, 0)).to.be.closeTo(1, 1e-12);
    expect(wheelZoomFactor(0, 0)).to.equal(1);
  });

  it('reads a wheel counting in lines like the same turn in pixels', () => {
    // Common practice, no source: one line of a wheel is about 16 px.
    expect(wheelZoomFactor(3, 1)).to.be.closeTo(wheelZoomFactor(48, 0), 1e-12);
  });

  it('zooms a mouse notch by about a fifth', () => {
    // Common practice, no source: a notch reports about 100 px; ≈ ×1.2 per notch.
    expect(wheelZoomFactor(-100, 0)).to.be.within(1.1, 1.3);
  });

  it('limits one huge flick to the zoom of a large one', () => {
    expect(wheelZoomFactor(-100_000, 0)).to.equal(wheelZoomFactor(-10_000, 0));
    expect(wheelZoomFactor(-100_000, 0)).to.be.lessThan(2);
  });
});
