import { expect } from 'chai';
import { routeStates, type ProcessStep } from '../../../../shared/archive/process-route';
import { impliedStack, stackPicture, type PictureLayer } from '../../../../src/app/archive/stack-geometry';

const twip = { materialId: 'm-twip', designation: 'KV-T22' };
const trip = { materialId: 'm-trip', designation: 'KV-M9' };
const layer = (m: typeof twip, thicknessMm: number): PictureLayer => ({ ...m, thicknessMm });

describe('client: stack picture, bands', () => {
  it('draws the first layer at the bottom, each band as tall as its share of the thickness', () => {
    // 1.5 of 2.0 mm = 75 % of 200 units; 0.5 mm = 25 % [C].
    const { bands } = stackPicture([layer(twip, 1.5), layer(trip, 0.5)], 200);

    expect(bands.map((b) => [b.position, b.y, b.height])).to.deep.equal([
      [0, 50, 150],
      [1, 0, 50],
    ]);
  });

  it('labels a band with its thickness only when it is tall enough to carry the text', () => {
    // 0.1 of 10.1 mm in 200 units is 1.98 units high, too small for a line of text (common practice, no source).
    const { bands } = stackPicture([layer(twip, 10), layer(trip, 0.1)], 200);

    expect(bands[0]!.label).to.equal('10.0 mm');
    expect(bands[1]!.label).to.equal(null);
    expect(bands[1]!.thickness).to.equal('0.100 mm');
  });

  it('gives every band a tooltip naming its place, material and thickness', () => {
    const { bands } = stackPicture([layer(twip, 0.375), layer(trip, 0.375), layer(twip, 0.375), layer(trip, 0.375)], 200);

    expect(bands[1]!.title).to.equal('layer 2 of 4: KV-M9, 0.375 mm');
  });

  it('colours by material in order of first appearance, so repeated materials share a colour', () => {
    const { bands } = stackPicture([layer(trip, 1), layer(twip, 1), layer(trip, 1)], 90);

    expect(bands.map((b) => b.colourIndex)).to.deep.equal([0, 1, 0]);
  });

  it('draws a layer of no thickness as a flat band without moving the others', () => {
    const { bands } = stackPicture([layer(twip, 1), layer(trip, 0), layer(twip, 1)], 100);

    expect(bands.map((b) => b.height)).to.deep.equal([50, 0, 50]);
    expect(bands[2]!.y).to.equal(0);
  });
});

describe('client: stack picture, legend and limits', () => {
  it('lists each material once with its layer count and summed thickness', () => {
    // 0.25 + 0.25 = 0.5 mm; 0.75 + 0.75 = 1.5 mm; total 2.0 mm [C].
    const picture = stackPicture([layer(twip, 0.25), layer(trip, 0.75), layer(twip, 0.25), layer(trip, 0.75)], 200);

    expect(picture.legend).to.deep.equal([
      { materialId: 'm-twip', designation: 'KV-T22', colourIndex: 0, layerCount: 2, totalThickness: '0.500 mm' },
      { materialId: 'm-trip', designation: 'KV-M9', colourIndex: 1, layerCount: 2, totalThickness: '1.50 mm' },
    ]);
    expect(picture.totalThickness).to.equal('2.00 mm');
    expect(picture.layerCount).to.equal(4);
  });

  it('draws 512 layers band by band but says "too many" for 1024, keeping the legend', () => {
    // Ten 50 % cycles of a two-sheet stack give 2^10 = 1024 layers (Saito et al., Acta Mater. 47 (1999) 579).
    const alternating = (n: number) => Array.from({ length: n }, (_, i) => layer(i % 2 ? trip : twip, 3 / n));

    const drawable = stackPicture(alternating(512), 300);
    const crowded = stackPicture(alternating(1024), 300);

    expect(drawable.tooMany).to.equal(false);
    expect(drawable.bands).to.have.length(512);
    expect(crowded.tooMany).to.equal(true);
    expect(crowded.bands).to.deep.equal([]);
    expect(crowded.legend.map((l) => l.layerCount)).to.deep.equal([512, 512]);
    expect(crowded.totalThickness).to.equal('3.00 mm');
  });

  it('draws nothing, without claiming too many layers, when the stack has no thickness', () => {
    const picture = stackPicture([layer(twip, 0)], 200);

    expect(picture).to.include({ tooMany: false, totalThickness: '0 mm', layerCount: 1 });
    expect(picture.bands).to.deep.equal([]);
  });

  it('draws an empty stack as nothing', () => {
    expect(stackPicture([], 200)).to.deep.equal({ bands: [], legend: [], totalThickness: '0 mm', layerCount: 0, tooMany: false });
  });
});

describe('client: stack implied by a route state', () => {
  const pass: ProcessStep = { id: 'p', type: 'roll_bonding', date: null, params: { reductionPct: 50 }, notes: '' };
  const cut = (pieces: number): ProcessStep => ({ id: 'c', type: 'cut_and_stack', date: null, params: { pieces }, notes: '' });
  const stack = [
    { materialId: twip.materialId, thicknessMm: 1.5 },
    { materialId: trip.materialId, thicknessMm: 1 },
  ];

  it('thins the recorded layers after a pass', () => {
    // 50 % reduction halves every layer [C].
    const state = routeStates(stack, [pass]).at(-1)!;

    expect(impliedStack([twip, trip], state)).to.deep.equal([layer(twip, 0.75), layer(trip, 0.5)]);
  });

  it('repeats the thinned stack once per stacked piece, bottom to top', () => {
    const state = routeStates(stack, [pass, cut(3)]).at(-1)!;

    expect(impliedStack([twip, trip], state).map((l) => [l.designation, l.thicknessMm])).to.deep.equal([
      ['KV-T22', 0.75],
      ['KV-M9', 0.5],
      ['KV-T22', 0.75],
      ['KV-M9', 0.5],
      ['KV-T22', 0.75],
      ['KV-M9', 0.5],
    ]);
  });

  it('gives no layers when the state holds more than can be drawn, or the stack is empty', () => {
    // Two sheets after nine doublings: 2 · 2^9 = 1024 layers [C].
    const route = Array.from({ length: 9 }, () => cut(2));
    const state = routeStates(stack, route).at(-1)!;

    expect(state.layerCount).to.equal(1024);
    expect(impliedStack([twip, trip], state)).to.deep.equal([]);
    expect(impliedStack([], routeStates([], [])[0]!)).to.deep.equal([]);
  });
});
