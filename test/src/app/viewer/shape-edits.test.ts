import { expect } from 'chai';
import type { Coordinates } from '../../../../shared/annotations/annotations';
import { canReshape, clampToImage, edgeMidpoints, insertVertex, moveVertex, removeVertex, samePoints, translateShape } from '../../../../src/app/viewer/shape-edits';

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

describe('client: shape edits, adding and removing vertices', () => {
  const tri: Coordinates = [[0, 0], [100, 0], [50, 80]];
  const line: Coordinates = [[10, 10], [110, 10], [110, 60]];

  it('offers the middle of every edge, the closing edge of an outline included', () => {
    // Hand-computed midpoints: (0+100)/2, (100+50)/2 and (50+0)/2 along x; 0, 40, 40 along y.
    expect(edgeMidpoints('polygon', tri)).to.deep.equal([[50, 0], [75, 40], [25, 40]]);
    // An open line has one edge fewer.
    expect(edgeMidpoints('polyline', line)).to.deep.equal([[60, 10], [110, 35]]);
  });

  it('offers no edge handles on shapes with a fixed number of points', () => {
    expect(edgeMidpoints('rectangle', rect)).to.deep.equal([]);
    expect(edgeMidpoints('ruler', [[0, 0], [10, 0]])).to.deep.equal([]);
    expect(canReshape('angle')).to.equal(false);
    expect(canReshape('polyline')).to.equal(true);
  });

  it('inserts a new vertex after the edge it was pulled from, kept on the image', () => {
    expect(insertVertex(tri, 1, [80, 45], image)).to.deep.equal([[0, 0], [100, 0], [80, 45], [50, 80]]);
    expect(insertVertex(tri, 2, [-10, 40], image)).to.deep.equal([[0, 0], [100, 0], [50, 80], [0, 40]]);
    expect(tri).to.have.length(3);
  });

  it('removes a vertex while enough remain', () => {
    const square: Coordinates = [[0, 0], [10, 0], [10, 10], [0, 10]];

    expect(removeVertex('polygon', square, 1)).to.deep.equal([[0, 0], [10, 10], [0, 10]]);
    expect(removeVertex('polyline', line, 0)).to.deep.equal([[110, 10], [110, 60]]);
  });

  it('refuses to take an outline below three vertices or a line below two, saying what to do instead', () => {
    expect(removeVertex('polygon', tri, 0)).to.be.a('string').and.match(/at least 3 vertices/);
    expect(removeVertex('polyline', [[0, 0], [5, 5]], 0)).to.be.a('string').and.match(/at least 2 vertices/);
    expect(removeVertex('rectangle', rect, 0)).to.be.a('string').and.match(/fixed number of points/);
  });
});
