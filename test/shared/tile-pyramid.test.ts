import { expect } from 'chai';
import { deepZoomLevelCount, iiifScaleFactors, levelSize, pyramidLevels, totalTileCount } from '../../shared/tile-pyramid';

describe('tile pyramid: Deep Zoom levels', () => {
  it('counts ⌈log2(max(W, H))⌉ + 1 levels', () => {
    // TRADE primer, Open standards: level 0 is 1×1, top level ⌈log2(max(W,H))⌉ [C].
    expect(deepZoomLevelCount(1, 1)).to.equal(1);
    expect(deepZoomLevelCount(2, 1)).to.equal(2);
    expect(deepZoomLevelCount(256, 256)).to.equal(9);
    expect(deepZoomLevelCount(257, 100)).to.equal(10);
    expect(deepZoomLevelCount(1000, 601)).to.equal(11);
    expect(deepZoomLevelCount(10_000, 10_000)).to.equal(15);
    expect(deepZoomLevelCount(20_000, 20_000)).to.equal(16);
  });

  it('puts powers of two exactly on a level, with no extra level from rounding', () => {
    // ⌈log2(8192)⌉ = 13 exactly, so 14 levels [C].
    expect(deepZoomLevelCount(8192, 10)).to.equal(14);
    expect(deepZoomLevelCount(8193, 10)).to.equal(15);
  });

  it('halves each level, rounding up, with 256 px tiles', () => {
    // Deep Zoom: level size = ⌈W / 2^(top − level)⌉; tiles = ⌈size / 256⌉ per axis [C].
    expect(levelSize(1000, 601, 10)).to.deep.equal({ level: 10, width: 1000, height: 601, columns: 4, rows: 3 });
    expect(levelSize(1000, 601, 9)).to.deep.equal({ level: 9, width: 500, height: 301, columns: 2, rows: 2 });
    expect(levelSize(1000, 601, 8)).to.deep.equal({ level: 8, width: 250, height: 151, columns: 1, rows: 1 });
    expect(levelSize(1000, 601, 0)).to.deep.equal({ level: 0, width: 1, height: 1, columns: 1, rows: 1 });
  });

  it('counts the tiles of a 10000 px square: 40×40 on top and 2147 in all', () => {
    // ⌈10000/256⌉ = 40 columns on the top level [C].
    const levels = pyramidLevels(10_000, 10_000);
    expect(levels.at(-1)).to.include({ width: 10_000, columns: 40, rows: 40 });
    // Level widths 10000, 5000, 2500, 1250, 625, 313, 157, 79, … → columns 40, 20, 10, 5, 3, 2, 1, 1, …
    expect(levels.slice(-7).map((l) => l.columns)).to.deep.equal([1, 2, 3, 5, 10, 20, 40]);
    // 40² + 20² + 10² + 5² + 3² + 2² + 9 single tiles (levels 0-8) = 1600+400+100+25+9+4+9 = 2147 [C].
    expect(totalTileCount(10_000, 10_000)).to.equal(2147);
  });

  it('refuses sizes that are not whole positive pixels and levels outside the pyramid', () => {
    expect(() => deepZoomLevelCount(0, 10)).to.throw(RangeError);
    expect(() => deepZoomLevelCount(10.5, 10)).to.throw(RangeError);
    expect(() => levelSize(100, 100, 8)).to.throw(RangeError);
  });
});

describe('tile pyramid: IIIF scale factors', () => {
  it('lists 1, 2, 4… until the image fits one tile', () => {
    // IIIF Image API 3.0, tiles.scaleFactors: the factors a level-0 server has tiles for [S]; 1000 px fits 256 at 1/4 [C].
    expect(iiifScaleFactors(1000, 601)).to.deep.equal([1, 2, 4]);
    expect(iiifScaleFactors(200, 100)).to.deep.equal([1]);
    expect(iiifScaleFactors(10_000, 10_000)).to.deep.equal([1, 2, 4, 8, 16, 32, 64]);
  });
});
