import { expect } from 'chai';
import { alignedViewport, overlayMatrix, overlayTileView } from '../../../../src/app/viewer/linked-view';
import { apply, invert, type Affine } from '../../../../shared/viewer/alignment';

/** Other image px → main image px: twice the size, shifted by (100, 200). */
const doubled: Affine = { a: 2, b: 0, c: 0, d: 2, e: 100, f: 200 };

describe('viewer: linked and overlaid views of aligned images', () => {
  it('the overlay matrix carries an other-image point through the alignment and the main view to the screen', () => {
    const v = { scale: 2, x: 100, y: 50, width: 800, height: 600 };
    const m = overlayMatrix(v, doubled);
    // Hand-computed: other (0,0) → main (100,200) → screen ((100−100)·2, (200−50)·2) = (0, 300); one other px is 2·2 = 4 screen px.
    expect(apply(m, [0, 0])).to.deep.equal([0, 300]);
    expect(m.a).to.equal(4);
    expect(m.d).to.equal(4);
  });

  it('the overlay tiles are chosen for the box of the other image the main screen covers', () => {
    const v = { scale: 1, x: 0, y: 0, width: 400, height: 300 };
    // Hand-computed: main (0,0) is other (−50, −100) and main (400,300) is other (150, 50); 2 screen px per other px.
    const t = overlayTileView(v, doubled);
    expect(t).to.deep.equal({ scale: 2, x: -50, y: -100, width: 400, height: 300 });
  });

  it('an aligned compared view is centred on the matching point at the matching zoom', () => {
    const v = { scale: 1, x: 0, y: 0, width: 400, height: 300 };
    // Hand-computed: the main centre (200,150) is other ((200−100)/2, (150−200)/2) = (50, −25); zoom 1 / 0.5 = 2;
    // so the other view's top-left is (50 − 200/2, −25 − 150/2) = (−50, −100).
    const w = alignedViewport(v, invert(doubled), { width: 400, height: 300 });
    expect(w.scale).to.be.closeTo(2, 1e-12);
    expect(w.x).to.be.closeTo(-50, 1e-9);
    expect(w.y).to.be.closeTo(-100, 1e-9);
  });
});
