import { expect } from 'chai';
import type { Coordinates } from '../../../../shared/annotations/annotations';
import { clampToImage, moveVertex, samePoints, translateShape } from '../../../../src/app/viewer/shape-edits';

const image = { width: 1000, height: 800 };
const rect: Coordinates = [[100, 100], [300, 100], [300, 200], [100, 200]];

describe('client: shape edits, staying on the image', () => {
  it('moves a point off the image onto its nearest edge', () => {
    expect(clampToImage([-5, 900], image)).to.deep.equal([0, 800]);
    expect(clampToImage([500, 400], image)).to.deep.equal([500, 400]);
  });

  it('shifts a whole shape by the drag', () => {
    expect(translateShape(rect, 10, -20, image)).to.deep.equal([[110, 80], [310, 80], [310, 180], [110, 180]]);
  });

  it('shortens a drag that would push the shape off the image, keeping its form', () => {
    // Hand-computed: the right edge at 300 can move 700 px at most; the top at 100 can move up 100.
    const moved = translateShape(rect, 5000, -5000, image);

    expect(moved).to.deep.equal([[800, 0], [1000, 0], [1000, 100], [800, 100]]);
  });

  it('leaves the shape it was given alone', () => {
    const copy = structuredClone(rect);
    translateShape(rect, 10, 10, image);
    moveVertex('rectangle', rect, 0, [50, 50], image);

    expect(rect).to.deep.equal(copy);
  });
});

describe('client: shape edits, dragging a vertex', () => {
  it('moves only that vertex of a polygon', () => {
    const tri: Coordinates = [[0, 0], [100, 0], [50, 80]];

    expect(moveVertex('polygon', tri, 2, [60, 90], image)).to.deep.equal([[0, 0], [100, 0], [60, 90]]);
  });

  it('keeps a rectangle a rectangle: the opposite corner holds and the neighbours follow', () => {
    const moved = moveVertex('rectangle', rect, 2, [400, 260], image);

    expect(moved).to.deep.equal([[100, 100], [400, 100], [400, 260], [100, 260]]);
  });

  it('keeps a rectangle whose corners run the other way round a rectangle too', () => {
    const other: Coordinates = [[100, 100], [100, 200], [300, 200], [300, 100]];
    const moved = moveVertex('rectangle', other, 0, [50, 40], image);

    expect(moved).to.deep.equal([[50, 40], [50, 200], [300, 200], [300, 40]]);
  });

  it('keeps a rectangle when a corner is dragged past the opposite one', () => {
    // Hand-computed: corner 2 taken from (300, 200) to (50, 50); (100, 100) holds still.
    const moved = moveVertex('rectangle', rect, 2, [50, 50], image);

    expect(moved).to.deep.equal([[100, 100], [50, 100], [50, 50], [100, 50]]);
  });

  it('stops a dragged vertex at the image edge', () => {
    expect(moveVertex('polyline', [[10, 10], [20, 20]], 1, [2000, -30], image)).to.deep.equal([[10, 10], [1000, 0]]);
  });
});

describe('client: shape edits, comparing shapes', () => {
  it('sees equal lists as the same and any moved point or extra point as a change', () => {
    expect(samePoints(rect, structuredClone(rect))).to.equal(true);
    expect(samePoints(rect, translateShape(rect, 1, 0, image))).to.equal(false);
    expect(samePoints(rect, rect.slice(0, 3))).to.equal(false);
  });
});
