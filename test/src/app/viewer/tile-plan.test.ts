import { expect } from 'chai';
import type { Viewport } from '../../../../shared/viewer/viewport';
import { parentTile, planTiles, tileKey, tileRect } from '../../../../src/app/viewer/tile-plan';

// Deep Zoom (DZI) layout, from memory: levels 0 … ceil(log2(max side)); the top level is full size,
// each level below halves it; 256 px tiles without overlap here. A 2048 × 1536 image has top level 11.
const image = { width: 2048, height: 1536 };
const view = (over: Partial<Viewport> = {}): Viewport => ({ scale: 1, x: 0, y: 0, width: 512, height: 512, ...over });

describe('client: tile plan, where a tile sits', () => {
  it('names a tile by level, column and row', () => {
    expect(tileKey({ level: 11, col: 7, row: 5 })).to.equal('11/7_5');
  });

  it('places a full-resolution tile at 256 px steps', () => {
    // Hand-computed: column 7 starts at 7 × 256 = 1792, row 5 at 1280.
    expect(tileRect(image, { level: 11, col: 7, row: 5 })).to.deep.equal({ x: 1792, y: 1280, width: 256, height: 256 });
  });

  it('lets a tile one level down cover twice the image pixels each way', () => {
    // Hand-computed: at level 10 a tile spans 512 image px; column 3 starts at 1536, row 2 at 1024.
    expect(tileRect(image, { level: 10, col: 3, row: 2 })).to.deep.equal({ x: 1536, y: 1024, width: 512, height: 512 });
  });

  it('clips the last tiles at the right and bottom edges of the image', () => {
    // Hand-computed: 2000 × 1500 still has top level 11; 2000 − 1792 = 208, 1500 − 1280 = 220.
    expect(tileRect({ width: 2000, height: 1500 }, { level: 11, col: 7, row: 5 })).to.deep.equal({ x: 1792, y: 1280, width: 208, height: 220 });
  });

  it('finds the coarser tile that contains a tile, and none above level 0', () => {
    expect(parentTile({ level: 11, col: 7, row: 5 })).to.deep.equal({ level: 10, col: 3, row: 2 });
    expect(parentTile({ level: 1, col: 1, row: 0 })).to.deep.equal({ level: 0, col: 0, row: 0 });
    expect(parentTile({ level: 0, col: 0, row: 0 })).to.equal(null);
  });
});

describe('client: tile plan, what to draw and fetch', () => {
  it('draws full-resolution tiles at one image pixel per screen pixel and fetches nothing when all are loaded', () => {
    const plan = planTiles(view(), image, () => true);

    expect(plan.level).to.equal(11);
    expect(plan.fetch).to.deep.equal([]);
    expect(plan.draw.map(tileKey)).to.include.members(['11/0_0', '11/1_0', '11/0_1', '11/1_1']);
    expect(plan.draw.every((t) => t.level === 11)).to.equal(true);
  });

  it('picks the level a step down at half scale, and back up on a screen with two device pixels per pixel', () => {
    expect(planTiles(view({ scale: 0.5 }), image, () => true).level).to.equal(10);
    expect(planTiles(view({ scale: 0.5 }), image, () => true, 2).level).to.equal(11);
  });

  it('fetches the tile at the centre of the view first', () => {
    // Hand-computed: a 512 px view from (384, 384) has its centre at (640, 640), inside tile 2_2.
    const plan = planTiles(view({ x: 384, y: 384 }), image, () => false);

    expect(tileKey(plan.fetch[0]!)).to.equal('11/2_2');
    expect(plan.fetch.length).to.be.greaterThan(1);
  });

  it('shows a loaded coarser tile once in place of the missing tiles it covers, before the loaded fine ones', () => {
    // Tiles 11/0_0 … 11/1_1 all lie inside 10/0_0; 11/0_0 itself is loaded.
    const loaded = new Set(['10/0_0', '11/0_0']);
    const plan = planTiles(view({ width: 500, height: 500 }), image, (k) => loaded.has(k));

    expect(plan.draw.map(tileKey)).to.deep.equal(['10/0_0', '11/0_0']);
    expect(plan.fetch.map(tileKey)).to.not.include('11/0_0');
    expect(plan.fetch.map(tileKey)).to.include.members(['11/1_0', '11/0_1', '11/1_1']);
  });

  it('borrows the nearest loaded ancestor, not a coarser one', () => {
    const loaded = new Set(['9/0_0', '10/0_0']);
    const plan = planTiles(view({ width: 200, height: 200 }), image, (k) => loaded.has(k));

    expect(plan.draw.map(tileKey)).to.deep.equal(['10/0_0']);
  });

  it('does not stretch the one-pixel top of the pyramid over a full-resolution view', () => {
    const plan = planTiles(view({ width: 200, height: 200 }), image, (k) => k === '0/0_0');

    expect(plan.draw).to.deep.equal([]);
  });
});
