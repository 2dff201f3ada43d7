import { expect } from 'chai';
import type { CommentThread } from '../../../../shared/reviews';
import { anchorFromDraft, pinFrame, pinsFromThreads, pinUnder } from '../../../../src/app/viewer/review-pins';
import { ShapeDraft } from '../../../../src/app/viewer/shape-draft';

const person = { id: 'u1', name: 'Ines Varga' };

function thread(id: string, createdAt: string, anchor: CommentThread['anchor'], status: 'open' | 'resolved' = 'open'): CommentThread {
  return {
    id,
    projectId: 'p',
    imageId: 'i',
    figureId: null,
    anchor,
    anchorPresent: true,
    status,
    createdBy: person,
    createdAt,
    resolvedBy: null,
    resolvedAt: null,
    comments: [],
  } as CommentThread;
}

describe('client: comment pins on the viewer', () => {
  const threads = [
    thread('b', '2026-03-02T10:00:00Z', { kind: 'region', ring: [[300, 220], [400, 200], [420, 300], [310, 310]] }, 'resolved'),
    thread('a', '2026-03-01T10:00:00Z', { kind: 'point', at: [100, 80] }),
    thread('c', '2026-03-03T10:00:00Z', { kind: 'measurement', measurementId: '00000000-0000-4000-8000-000000000001' }),
  ];

  it('numbers point and region threads oldest first and leaves measurement threads to their measurement', () => {
    const pins = pinsFromThreads(threads);

    expect(pins.map((p) => [p.threadId, p.number, p.open])).to.deep.equal([
      ['a', 1, true],
      ['b', 2, false],
    ]);
  });

  it("puts a region's marker on its topmost vertex, where it covers least of the region", () => {
    const [, region] = pinsFromThreads(threads);

    expect(region!.at).to.deep.equal([400, 200]);
    expect(region!.ring).to.have.length(4);
  });

  it('finds the pin under the pointer within the marker radius in screen pixels at any zoom', () => {
    const pins = pinsFromThreads(threads);

    // Marker radius 10 screen px: at 1:1 a point 9 px away hits, 12 px away misses.
    expect(pinUnder(pins, [109, 80], 1)).to.equal('a');
    expect(pinUnder(pins, [112, 80], 1)).to.equal(null);
    // Zoomed out to 1:4 (4 image px per screen px) the same 12 image px are 3 screen px: a hit.
    expect(pinUnder(pins, [112, 80], 4)).to.equal('a');
  });

  it('finds a region by its inside, the smallest of nested regions first', () => {
    const nested = pinsFromThreads([
      thread('big', '2026-03-01T00:00:00Z', { kind: 'region', ring: [[0, 0], [1000, 0], [1000, 1000], [0, 1000]] }),
      thread('small', '2026-03-02T00:00:00Z', { kind: 'region', ring: [[400, 400], [600, 400], [600, 600], [400, 600]] }),
    ]);

    expect(pinUnder(nested, [500, 500], 1)).to.equal('small');
    expect(pinUnder(nested, [800, 800], 1)).to.equal('big');
    expect(pinUnder(nested, [1500, 800], 1)).to.equal(null);
  });

  it('frames a region by its bounds and a point by a box of a tenth of the shorter image side', () => {
    const [point, region] = pinsFromThreads(threads);

    expect(pinFrame(region!, { width: 2000, height: 1000 })).to.deep.equal({ minX: 300, minY: 200, maxX: 420, maxY: 310 });
    // Hand-computed: 1000 / 20 = 50 px either side of (100, 80).
    expect(pinFrame(point!, { width: 2000, height: 1000 })).to.deep.equal({ minX: 50, minY: 30, maxX: 150, maxY: 130 });
  });

  it('turns a click into a point anchor and a dragged box into a region anchor, rounded to tenths of a pixel', () => {
    expect(anchorFromDraft([[12.345, 67.891]])).to.deep.equal({ kind: 'point', at: [12.3, 67.9] });
    expect(anchorFromDraft([[0, 0], [10, 0], [10, 5], [0, 5]])).to.deep.equal({ kind: 'region', ring: [[0, 0], [10, 0], [10, 5], [0, 5]] });
  });

  it('gives the pin tool a point for a click and a box for a drag', () => {
    const click = new ShapeDraft('pin');
    click.press([50, 60]);
    expect(click.release([51, 60], false, 1)).to.deep.equal({ tool: 'pin', points: [[50, 60]] });

    const drag = new ShapeDraft('pin');
    drag.press([50, 60]);
    drag.drag([150, 20], 1);
    expect(drag.release([150, 20], true, 1)).to.deep.equal({ tool: 'pin', points: [[50, 20], [150, 20], [150, 60], [50, 60]] });
  });
});
