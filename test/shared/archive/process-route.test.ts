import { expect } from 'chai';
import { routeStates, vonMisesStrainOfPass, type ProcessStep } from '../../../shared/archive/process-route';

type Step = Pick<ProcessStep, 'type' | 'params'>;
const bond = (reductionPct: number): Step => ({ type: 'roll_bonding', params: { reductionPct } });
const stack = (pieces = 2): Step => ({ type: 'cut_and_stack', params: { pieces } });
const anneal: Step = { type: 'anneal', params: { temperatureC: 700, timeMin: 30 } };

/** ARB as published: a two-sheet stack bonded, then (cut, stack, bond) again for each further cycle. */
function arbRoute(cycles: number, reductionPct = 50): Step[] {
  const steps: Step[] = [bond(reductionPct)];
  for (let n = 2; n <= cycles; n++) steps.push(stack(2), bond(reductionPct));
  return steps;
}

describe('process route: von Mises strain of a rolling pass', () => {
  it('gives 0.80 per 50 % pass', () => {
    // TRADE primer, computed from ε = (2/√3)·ln(1/(1−r)) [C]; the same 0.80 per cycle is quoted by Saito et al., Acta Mater. 47 (1999) 579.
    expect(vonMisesStrainOfPass(0.5)).to.be.closeTo(0.8004, 5e-5);
  });

  it('gives the published 1.06 and 1.86 for 60 % and 80 % passes', () => {
    // Tsuji et al., Adv. Eng. Mater. 5 (2003) 338: equivalent strain per cycle 1.06-1.86 for 60-80 % reduction [S].
    expect(vonMisesStrainOfPass(0.6)).to.be.closeTo(1.058, 5e-4);
    expect(vonMisesStrainOfPass(0.8)).to.be.closeTo(1.858, 5e-4);
  });

  it('refuses reductions outside [0, 1)', () => {
    expect(() => vonMisesStrainOfPass(1)).to.throw(RangeError);
    expect(() => vonMisesStrainOfPass(-0.1)).to.throw(RangeError);
  });
});

describe('process route: what the route implies', () => {
  const twoSheets = [
    { materialId: 'a', thicknessMm: 1 },
    { materialId: 'b', thicknessMm: 1 },
  ];

  for (const cycles of [1, 2, 3, 5, 8]) {
    it(`after ${cycles} ARB cycle(s) at 50 %: 2^N layers, t0/2^N each, reduction 1 − 1/2^N, strain N·0.80`, () => {
      // Saito, Utsunomiya, Tsuji, Sakai, Acta Mater. 47 (1999) 579: relations for N cycles at r = 0.5 [S].
      const final = routeStates(twoSheets, arbRoute(cycles)).at(-1)!;
      expect(final.layerCount).to.equal(2 ** cycles);
      expect(final.originalLayerThicknessMm[0]).to.be.closeTo(1 / 2 ** cycles, 1e-12);
      expect(final.totalReduction).to.be.closeTo(1 - 1 / 2 ** cycles, 1e-12);
      expect(final.vonMisesStrain).to.be.closeTo(cycles * 0.8004, cycles * 5e-5);
      // ARB keeps the sheet's thickness from cycle to cycle (same source): 2 mm stays 2 mm, reduced by one bond.
      expect(final.totalThicknessMm).to.be.closeTo(1, 1e-12);
    });
  }

  it('starts with the recorded stack and leaves geometry alone across anneals', () => {
    const states = routeStates(
      [
        { materialId: 'a', thicknessMm: 1.5 },
        { materialId: 'b', thicknessMm: 0.5 },
        { materialId: 'a', thicknessMm: 1.5 },
      ],
      [bond(60), anneal],
    );
    expect(states).to.have.length(3);
    expect(states[0]).to.deep.include({ layerCount: 3, totalThicknessMm: 3.5, totalReduction: 0, vonMisesStrain: 0 });
    // 60 % reduction leaves 40 % of each layer [C].
    expect(states[1]!.originalLayerThicknessMm.map((t) => +t.toFixed(6))).to.deep.equal([0.6, 0.2, 0.6]);
    expect(states[2]).to.deep.equal(states[1]);
  });

  it('multiplies layers by the pieces stacked, not only by two', () => {
    const final = routeStates(twoSheets, [bond(50), stack(4), bond(75)]).at(-1)!;
    expect(final.layerCount).to.equal(8);
    // Cumulative reduction: 1 − (1 − 0.5)(1 − 0.75) = 0.875 [C].
    expect(final.totalReduction).to.be.closeTo(0.875, 1e-12);
  });
});
