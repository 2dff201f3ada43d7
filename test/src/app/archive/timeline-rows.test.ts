import { expect } from 'chai';
import { routeStates, type ProcessStep, type StackLayer } from '../../../../shared/archive/process-route';
import { afterStepLabel, impliedText, timelineRows } from '../../../../src/app/archive/timeline-rows';

/** Two 1.5 mm sheets of two alloys, bottom to top, as a roll-bonding route starts. */
const stack: StackLayer[] = [
  { materialId: 'm-twip', thicknessMm: 1.5 },
  { materialId: 'm-trip', thicknessMm: 1.5 },
];
const names = ['KV-T22', 'KV-M9'];

const pass = (id: string): ProcessStep => ({ id, type: 'roll_bonding', date: '2026-03-14', params: { reductionPct: 50 }, notes: '' });
const cut = (id: string): ProcessStep => ({ id, type: 'cut_and_stack', date: null, params: { pieces: 2 }, notes: '' });

describe('client: timeline rows, what the route implies', () => {
  it('starts with the stack as recorded, unchanged and without a step number', () => {
    const [first] = timelineRows(names, [], routeStates(stack, []));

    expect(first).to.include({ index: 0, stepNumber: null, stepId: null, typeLabel: 'As stacked', changesLayers: false, changesThickness: false });
    expect(first!.implied).to.deep.equal({
      layerCount: 2,
      layerThicknesses: [
        { designation: 'KV-T22', text: '1.50 mm' },
        { designation: 'KV-M9', text: '1.50 mm' },
      ],
      totalThickness: '3.00 mm',
      totalReduction: '0 %',
      strain: '0.00',
    });
  });

  it('after pass, cut and pass of 50 % each: 4 layers of 0.375 mm, 75 % reduction, strain 1.60', () => {
    // Saito et al., Acta Mater. 47 (1999) 579: t0/2^N per original layer, reduction 1 − 1/2^N,
    // ε = N · 0.8004; for N = 2: 1.5/4 = 0.375 mm, 75 %, 1.60 [C].
    const route = [pass('s1'), cut('s2'), pass('s3')];
    const rows = timelineRows(names, route, routeStates(stack, route));

    expect(rows).to.have.length(4);
    const last = rows[3]!;
    expect(last.implied.layerCount).to.equal(4);
    expect(last.implied.layerThicknesses.map((l) => l.text)).to.deep.equal(['0.375 mm', '0.375 mm']);
    expect(last.implied.totalThickness).to.equal('1.50 mm');
    expect(last.implied.totalReduction).to.equal('75 %');
    expect(last.implied.strain).to.equal('1.60');
  });

  it('numbers steps from 1 and carries their id, label, date, parameters and notes', () => {
    const anneal: ProcessStep = { id: 's2', type: 'anneal', date: null, params: { temperatureC: 800, timeMin: 30 }, notes: 'in argon' };
    const route = [pass('s1'), anneal];
    const rows = timelineRows(names, route, routeStates(stack, route));

    expect(rows[1]).to.include({ index: 1, stepNumber: 1, stepId: 's1', typeLabel: 'Roll-bonding pass', date: '2026-03-14', notes: '' });
    expect(rows[1]!.params).to.deep.equal(['50 % reduction']);
    expect(rows[2]).to.include({ index: 2, stepNumber: 2, stepId: 's2', typeLabel: 'Anneal', date: null, notes: 'in argon' });
    expect(rows[2]!.params).to.deep.equal(['800 °C', '30 min']);
  });

  it('marks a pass as thinning, a cut-and-stack as adding layers, an anneal as neither', () => {
    const route = [pass('s1'), cut('s2'), { ...pass('s3'), type: 'anneal' as const, params: { temperatureC: 600, timeMin: 60 } }];
    const rows = timelineRows(names, route, routeStates(stack, route));

    expect(rows.slice(1).map((r) => [r.changesThickness, r.changesLayers])).to.deep.equal([
      [true, false],
      [false, true],
      [false, false],
    ]);
  });

  it('gives steps not saved yet no id', () => {
    const route = [{ type: 'cold_rolling' as const, params: { reductionPct: 20 } }];
    const rows = timelineRows(names, route, routeStates(stack, route));

    expect(rows[1]).to.include({ stepId: null, date: null, notes: '' });
  });

  it('leaves out steps that have no state, and gives no rows without states', () => {
    const route = [pass('s1'), pass('s2')];
    const states = routeStates(stack, route).slice(0, 2);

    expect(timelineRows(names, route, states).map((r) => r.index)).to.deep.equal([0, 1]);
    expect(timelineRows(names, route, [])).to.deep.equal([]);
  });
});

describe('client: timeline rows, implied text', () => {
  it('names layers without a designation by their place in the stack', () => {
    const text = impliedText(['KV-T22'], routeStates(stack, [])[0]!);

    expect(text.layerThicknesses.map((l) => l.designation)).to.deep.equal(['KV-T22', 'layer 2']);
  });

  it('switches a layer thinned below 0.1 mm to µm', () => {
    // Six 50 % passes: 1.5 mm / 64 = 0.0234 mm = 23.4 µm (Saito et al. 1999, t0/2^N) [C].
    const route = Array.from({ length: 6 }, (_, i) => pass(`s${i}`));
    const text = impliedText(names, routeStates(stack, route).at(-1)!);

    expect(text.layerThicknesses[0]!.text).to.equal('23.4 µm');
    expect(text.strain).to.equal('4.80');
  });
});

describe('client: timeline rows, label of the step a specimen was cut after', () => {
  const route = [pass('s1'), cut('s2'), { id: 's3', type: 'anneal' as const }];

  it('names the step by its number and type', () => {
    expect(afterStepLabel(route, 's3')).to.equal('after step 3: Anneal');
    expect(afterStepLabel(route, 's1')).to.equal('after step 1: Roll-bonding pass');
  });

  it('says "as stacked" for a specimen cut before any step', () => {
    expect(afterStepLabel(route, null)).to.equal('as stacked, before any step');
  });

  it('says so when the step has since been removed from the route', () => {
    expect(afterStepLabel(route, 'gone')).to.equal('after a step no longer in the route');
  });
});
