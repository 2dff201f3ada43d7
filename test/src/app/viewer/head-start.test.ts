import { expect } from 'chai';
import { firstViewTiles } from '../../../../src/app/viewer/head-start';

const RECORD = '/api/projects/p1/images/i1';
/** The Deep Zoom tile path the server serves (server/images routes) under an image's record. */
const tileUrl = (_p: string, _i: string, level: number, col: number, row: number) => `${RECORD}/tiles/${level}/${col}_${row}.jpg`;

describe('client: tiles fetched before the viewer starts', () => {
  it('asks for the tiles of the fitted view of a 20000 px square image on a 1280 × 860 window, the centre tile first', () => {
    // Hand-computed: the canvas is about 1280 − 416 by 860 − 112 px, so the fit scale is 748 / 20000 = 0.0374,
    // 2^4 < 1 / 0.0374 < 2^5: four levels below the top (15), level 11 is 20000 / 16 = 1250 px, 5 × 5 tiles of 256 px.
    const urls = firstViewTiles(RECORD, { width: 20000, height: 20000 }, { width: 1280, height: 860, pixelRatio: 1 });

    expect(urls).to.have.length(25);
    expect(urls[0]).to.equal(tileUrl('p1', 'i1', 11, 2, 2));
    expect(new Set(urls).size).to.equal(25);
    expect(urls).to.include(tileUrl('p1', 'i1', 11, 4, 4));
  });

  it('takes one finer level on a screen with two device pixels per CSS pixel', () => {
    const urls = firstViewTiles(RECORD, { width: 20000, height: 20000 }, { width: 1280, height: 860, pixelRatio: 2 });

    // Level 12 is 2500 px wide: 10 × 10 = 100 tiles, over the limit of 64, so the page is left to ask for them itself.
    expect(urls).to.deep.equal([]);
  });

  it('asks for the single tile of a small image', () => {
    expect(firstViewTiles(RECORD, { width: 200, height: 150 }, { width: 1280, height: 860, pixelRatio: 1 })).to.deep.equal([tileUrl('p1', 'i1', 8, 0, 0)]);
  });
});
