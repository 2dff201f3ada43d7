import { expect } from 'chai';
import { actualPixels, fitViewport, imageToScreen, levelForScale, panBy, screenToImage, visibleTiles, zoomAround } from '../../../shared/viewer/viewport';

const big = { width: 20000, height: 20000 };

describe('viewer: viewport maths', () => {
  it('fits the whole image and centres it', () => {
    const v = fitViewport({ width: 4000, height: 2000 }, 800, 800);
    expect(v.scale).to.equal(0.2);
    const centre = screenToImage(v, 400, 400);
    expect(centre.x).to.be.closeTo(2000, 1e-9);
    expect(centre.y).to.be.closeTo(1000, 1e-9);
  });

  it('zooming around the cursor keeps the image point under the cursor', () => {
    const v = fitViewport(big, 1000, 800);
    const before = screenToImage(v, 731, 122);
    const z = zoomAround(v, big, 3.7, 731, 122);
    const after = screenToImage(z, 731, 122);
    expect(after.x).to.be.closeTo(before.x, 1e-6);
    expect(after.y).to.be.closeTo(before.y, 1e-6);
    expect(z.scale).to.be.closeTo(v.scale * 3.7, 1e-12);
  });

  it('screen and image coordinates are inverse maps, and a pan moves by the drag', () => {
    const v = { scale: 2.5, x: 100, y: 50, width: 800, height: 600 };
    const s = imageToScreen(v, 333, 444);
    const back = screenToImage(v, s.x, s.y);
    expect(back.x).to.be.closeTo(333, 1e-9);
    expect(back.y).to.be.closeTo(444, 1e-9);
    const p = panBy(v, 50, -25);
    expect(imageToScreen(p, 333, 444).x).to.be.closeTo(s.x + 50, 1e-9);
  });

  it('clamps zoom between half the fit and 32 screen px per image px', () => {
    const v = fitViewport(big, 1000, 1000);
    expect(zoomAround(v, big, 1e-6, 0, 0).scale).to.be.closeTo(v.scale / 2, 1e-12);
    expect(zoomAround(v, big, 1e9, 0, 0).scale).to.equal(32);
  });

  it('1:1 keeps the centre', () => {
    const v = fitViewport(big, 1000, 800);
    const a = actualPixels(v);
    expect(a.scale).to.equal(1);
    expect(screenToImage(a, 500, 400).x).to.be.closeTo(10000, 1e-9);
  });

  it('chooses the level whose pixels are not coarser than the screen', () => {
    // Deep Zoom: top level = ⌈log2(20000)⌉ = 15 (TRADE primer); each level below halves [C].
    expect(levelForScale(big, 1)).to.equal(15);
    expect(levelForScale(big, 2)).to.equal(15);
    expect(levelForScale(big, 0.5)).to.equal(14);
    expect(levelForScale(big, 0.4)).to.equal(14);
    expect(levelForScale(big, 0.25)).to.equal(13);
    expect(levelForScale(big, 1e-9)).to.equal(0);
  });

  it('lists exactly the tiles in view', () => {
    // 1000×800 screen at scale 1 starting at (300, 300): image x 300…1300, y 300…1100 → columns 1…5, rows 1…4 of 256 px tiles [C].
    const tiles = visibleTiles({ scale: 1, x: 300, y: 300, width: 1000, height: 800 }, big, 15);
    expect(tiles).to.have.length(5 * 4);
    expect(tiles[0]).to.deep.equal({ level: 15, col: 1, row: 1 });
    expect(tiles.at(-1)).to.deep.equal({ level: 15, col: 5, row: 4 });
  });

  it('lists the whole small level when the view covers it, and nothing outside', () => {
    const fit = fitViewport(big, 1000, 1000);
    const level = levelForScale(big, fit.scale); // 0.05 → 4 levels down → 11, 1250 px wide → 5×5 tiles [C]
    expect(level).to.equal(11);
    expect(visibleTiles(fit, big, level)).to.have.length(25);
    expect(visibleTiles({ scale: 1, x: -5000, y: -5000, width: 100, height: 100 }, big, 15)).to.have.length(0);
  });
});
