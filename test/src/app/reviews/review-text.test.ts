import { expect } from 'chai';
import { REVIEW_STATES, REVIEW_TRANSITIONS, type ReviewSnapshot } from '../../../../shared/reviews';
import {
  centreAnchor,
  clearedFileLine,
  clearingBlocker,
  countOf,
  describeAnchor,
  historyLine,
  moveLabel,
  moveSegment,
  reviewStateHint,
  reviewStateLabel,
  snapshotCounts,
  typedPoint,
} from '../../../../src/app/reviews/review-text';

describe('client: review text, states and moves', () => {
  it('gives every state its own badge text and hint', () => {
    const labels = REVIEW_STATES.map(reviewStateLabel);
    const hints = REVIEW_STATES.map((s) => reviewStateHint(s));

    expect(new Set(labels).size).to.equal(REVIEW_STATES.length);
    expect(new Set(hints).size).to.equal(REVIEW_STATES.length);
    expect(labels.every((l) => l.length > 0) && hints.every((h) => h.length > 0)).to.equal(true);
  });

  it('tells people on a cleared image that an edit sends it back to draft', () => {
    expect(reviewStateHint('cleared')).to.match(/edit/i);
    expect(reviewStateHint('cleared')).to.match(/draft/i);
  });

  it('gives every move its own button text', () => {
    const labels = REVIEW_TRANSITIONS.map(moveLabel);

    expect(new Set(labels).size).to.equal(REVIEW_TRANSITIONS.length);
  });

  it('posts each move to the address the server routes it on', () => {
    // server/reviews/reviews.routes.ts: …/review/submit, /request-changes, /clear, /reopen.
    expect(moveSegment('submit')).to.equal('submit');
    expect(moveSegment('requestChanges')).to.equal('request-changes');
    expect(moveSegment('clear')).to.equal('clear');
    expect(moveSegment('reopen')).to.equal('reopen');
  });
});

describe('client: review text, where a thread is pinned', () => {
  it('reads a point in whole pixels', () => {
    expect(describeAnchor({ kind: 'point', at: [812.4, 439.6] })).to.equal('point at 812, 440 px');
  });

  it('never writes a minus zero for a point at the very edge', () => {
    expect(describeAnchor({ kind: 'point', at: [-0.2, 0] })).to.equal('point at 0, 0 px');
  });

  it('reads a region by its number of points and the mean of its corners', () => {
    // Hand-computed: mean of (0,0), (100,0), (100,50), (0,50) is (50, 25).
    expect(describeAnchor({ kind: 'region', ring: [[0, 0], [100, 0], [100, 50], [0, 50]] })).to.equal('region of 4 points around 50, 25 px');
  });

  it('says when the measurement a thread is pinned to has been deleted', () => {
    const anchor = { kind: 'measurement' as const, measurementId: '00000000-0000-4000-8000-000000000001' };

    expect(describeAnchor(anchor)).to.equal('measurement');
    expect(describeAnchor(anchor, false)).to.match(/deleted/);
  });

  it('pins a thread to the middle pixel of the image by default', () => {
    expect(centreAnchor(2048, 1536)).to.deep.equal({ kind: 'point', at: [1024, 768] });
    expect(centreAnchor(1001, 501)).to.deep.equal({ kind: 'point', at: [501, 251] });
  });
});

describe('client: review text, a typed point checked against the image', () => {
  it('makes an anchor of a point inside the image', () => {
    expect(typedPoint(120, 80, 2048, 1536)).to.deep.equal({ kind: 'point', at: [120, 80] });
  });

  it('accepts the corners of the image', () => {
    expect(typedPoint(0, 0, 2048, 1536)).to.deep.equal({ kind: 'point', at: [0, 0] });
    expect(typedPoint(2048, 1536, 2048, 1536)).to.deep.equal({ kind: 'point', at: [2048, 1536] });
  });

  it('names the coordinate that lies outside, against its own side of the image', () => {
    const wide = typedPoint(3000, 80, 2048, 1536);
    const tall = typedPoint(120, 1600, 2048, 1536);

    expect(wide).to.deep.equal({ x: 'Between 0 and 2048 px.', y: null });
    expect(tall).to.deep.equal({ x: null, y: 'Between 0 and 1536 px.' });
  });

  it('refuses a negative coordinate', () => {
    expect(typedPoint(-1, 10, 100, 100)).to.have.property('x').that.is.a('string');
  });

  it('asks for both numbers when they are missing or not numbers', () => {
    const out = typedPoint(null, Number.NaN, 100, 100);

    expect(out).to.have.property('x').that.is.a('string');
    expect(out).to.have.property('y').that.is.a('string');
  });
});

describe('client: review text, history and counts', () => {
  it('writes each move of the history as its own line', () => {
    const lines = REVIEW_TRANSITIONS.map((reason) => historyLine({ reason, to: 'draft' }));

    expect(new Set(lines).size).to.equal(REVIEW_TRANSITIONS.length);
  });

  it('names the state an edit sent the image back to', () => {
    expect(historyLine({ reason: 'edited', to: 'draft' })).to.equal('Back to draft after an edit');
  });

  it('counts in words: none, one, several', () => {
    expect(countOf(0, 'annotation')).to.equal('no annotations');
    expect(countOf(1, 'annotation')).to.equal('1 annotation');
    expect(countOf(3, 'measurement')).to.equal('3 measurements');
    expect(countOf(2, 'analysis', 'analyses')).to.equal('2 analyses');
  });

  it('sums up what a clearing froze', () => {
    // Only the lengths are read; the items themselves do not matter here.
    const frozen = { annotations: new Array(18).fill({}), measurements: [{}, {}] } as unknown as Pick<ReviewSnapshot, 'annotations' | 'measurements'>;

    expect(snapshotCounts(frozen)).to.equal('18 annotations, 2 measurements');
  });

  it('blocks clearing while threads are open and names how many', () => {
    expect(clearingBlocker(0)).to.equal('');
    expect(clearingBlocker(1)).to.equal('1 open thread on this image; resolve it before clearing.');
    expect(clearingBlocker(3)).to.equal('3 open threads on this image; resolve them before clearing.');
  });

  it('names figure pins by the panel letter, or by place when a panel has no letter or is gone', () => {
    expect(describeAnchor({ kind: 'figure' })).to.equal('whole figure');
    expect(describeAnchor({ kind: 'panel', panel: 1 }, true, ['a', 'b'])).to.equal('panel b');
    expect(describeAnchor({ kind: 'panel', panel: 1 }, true, ['a', ' '])).to.equal('panel 2');
    expect(describeAnchor({ kind: 'panel', panel: 3 }, true, ['a', 'b'])).to.equal('panel 4');
    expect(clearingBlocker(2, 'figure')).to.equal('2 open threads on this figure; resolve them before clearing.');
  });

  it('describes a kept cleared file with its pixels, print size and bytes', () => {
    const line = clearedFileLine({ format: 'tiff', width: 236, height: 90, widthMm: 40, dpi: 150, byteSize: 1_234_567 });
    expect(line).to.equal('TIFF, 236 × 90 px, 40 mm at 150 dpi, 1.2 MB');
    expect(clearedFileLine({ format: 'png', width: 10, height: 10, widthMm: 20, dpi: 72, byteSize: 420 })).to.equal('PNG, 10 × 10 px, 20 mm at 72 dpi, 1 kB');
  });
});
