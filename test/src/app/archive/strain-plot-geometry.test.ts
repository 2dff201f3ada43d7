import { expect } from 'chai';
import { routeStates, type ProcessStep } from '../../../../shared/archive/process-route';
import { niceCeiling, strainPlot, type PlotBox } from '../../../../src/app/archive/strain-plot-geometry';

/** Plot area 250 × 160 units, from x 40 to 290 and from y 170 (bottom) to 10 (top). */
const box: PlotBox = { width: 300, height: 200, left: 40, right: 10, top: 10, bottom: 30 };
const stack = [
  { materialId: 'a', thicknessMm: 1.5 },
  { materialId: 'b', thicknessMm: 1.5 },
];
const pass: ProcessStep = { id: 'p', type: 'roll_bonding', date: null, params: { reductionPct: 50 }, notes: '' };
const cut: ProcessStep = { id: 'c', type: 'cut_and_stack', date: null, params: { pieces: 2 }, notes: '' };

describe('client: strain plot, nice axis top', () => {
  it('rounds up to 1, 2, 2.5 or 5 times a power of ten', () => {
    // common practice, no source; values are strains of 1, 2, 3 and 6 passes of 50 % (0.8004 each, Saito et al. 1999).
    expect(niceCeiling(0.8004)).to.equal(1);
    expect(niceCeiling(1.6008)).to.equal(2);
    expect(niceCeiling(2.4012)).to.equal(2.5);
    expect(niceCeiling(4.8024)).to.equal(5);
    expect(niceCeiling(5.1)).to.equal(10);
    expect(niceCeiling(0.03)).to.be.closeTo(0.05, 1e-15);
  });

  it('keeps a value that is already nice', () => {
    expect(niceCeiling(2)).to.equal(2);
    expect(niceCeiling(10)).to.equal(10);
    expect(niceCeiling(0.25)).to.be.closeTo(0.25, 1e-15);
  });

  it('falls back to 1 for zero or no value', () => {
    expect(niceCeiling(0)).to.equal(1);
    expect(niceCeiling(Number.NaN)).to.equal(1);
  });
});

describe('client: strain plot, geometry', () => {
  const states = routeStates(stack, [pass, cut, pass]);

  it('spreads the states evenly from left to right, as stacked first', () => {
    // 250 units over 3 steps = 83.33 units per step [C].
    const plot = strainPlot(states, box);

    expect(plot.points.map((p) => p.x)).to.deep.equal([40, 123.33, 206.67, 290]);
  });

  it('plots strain from 0 at the bottom to the nice ceiling at the top', () => {
    // ε = 0, 0.8004, 0.8004, 1.6008 (Saito et al., Acta Mater. 47 (1999) 579); axis top 2;
    // y = 10 + 160·(1 − ε/2): 170, 105.97, 105.97, 41.94 [C].
    const plot = strainPlot(states, box);

    expect(plot.points.map((p) => p.strainY)).to.deep.equal([170, 105.97, 105.97, 41.94]);
    expect(plot.strainPath).to.equal('M40 170 L123.33 105.97 L206.67 105.97 L290 41.94');
    expect(plot.strainTicks).to.deep.equal([
      { at: 170, label: '0.00' },
      { at: 90, label: '1.00' },
      { at: 10, label: '2.00' },
    ]);
  });

  it('draws the layer count as steps on a linear axis while it stays at 8 or below', () => {
    // 2, 2, 4, 4 layers on an axis to 4: y = 10 + 160·(1 − n/4) = 90, 90, 10, 10 [C].
    const plot = strainPlot(states, box);

    expect(plot.logLayers).to.equal(false);
    expect(plot.points.map((p) => p.layersY)).to.deep.equal([90, 90, 10, 10]);
    expect(plot.layersPath).to.equal('M40 90 H123.33 V90 H206.67 V10 H290 V10');
    expect(plot.layerTicks.map((t) => t.label)).to.deep.equal(['0', '2', '4']);
  });

  it('switches the layer axis to powers of two past 8 layers, thinning crowded ticks', () => {
    // Six doublings of 2 sheets: 2^7 = 128 layers; log2 axis 1…128, every other power shown plus the top.
    const many = routeStates(stack, Array.from({ length: 6 }, () => cut));
    const plot = strainPlot(many, box);

    expect(plot.logLayers).to.equal(true);
    expect(plot.layerTicks.map((t) => t.label)).to.deep.equal(['1', '4', '16', '64', '128']);
    // 2 layers sit at log2(2)/log2(128) = 1/7 of the height: 170 − 160/7 = 147.14 [C].
    expect(plot.points[0]!.layersY).to.equal(147.14);
    expect(plot.points.at(-1)!.layersY).to.equal(10);
  });

  it('keeps the largest strain inside the plot area', () => {
    const route = Array.from({ length: 7 }, () => ({ ...pass, params: { reductionPct: 80 } }));
    const plot = strainPlot(routeStates(stack, route), box);

    // 7 × 1.858 = 13.0 (Tsuji et al., Adv. Eng. Mater. 5 (2003) 338: 1.86 per 80 % pass); axis top 20.
    expect(plot.strainTicks.at(-1)!.label).to.equal('20.00');
    for (const p of plot.points) expect(p.strainY).to.be.within(box.top, box.height - box.bottom);
  });

  it('labels at most about twelve steps but always the last one', () => {
    const long = routeStates(stack, Array.from({ length: 29 }, () => pass));
    const plot = strainPlot(long, box);

    // 30 states: every 3rd step, 0…27, then step 29 [C].
    expect(plot.stepTicks.map((t) => t.label)).to.deep.equal(['0', '3', '6', '9', '12', '15', '18', '21', '24', '27', '29']);
  });

  it('places a lone initial state at the left edge without failing', () => {
    const plot = strainPlot(routeStates(stack, []), box);

    expect(plot.points).to.have.length(1);
    expect(plot.points[0]).to.include({ x: 40, strainY: 170 });
    expect(plot.strainPath).to.equal('M40 170');
    expect(plot.stepTicks).to.deep.equal([{ at: 40, label: '0' }]);
  });
});
