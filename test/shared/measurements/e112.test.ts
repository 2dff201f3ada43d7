import { expect } from 'chai';
import {
  fieldResult,
  grainSizeFromAreaDensity,
  grainSizeFromIntercept,
  interceptForGrainSize,
  isoIndexFromAstm,
  LINE_RULES,
  CIRCLE_RULES,
  markValue,
  phaseIntercept,
} from '../../../shared/measurements/e112';

describe('measurements: ASTM E112 relations', () => {
  // ASTM E112 lineal relation with its printed constants, anchored at l̄ = 0.320 mm for G = 0; anchor values from the
  // TRADE primer [C from the exact form l̄ = 0.32 mm·2^(−G/2)], which E112's Table 4 lists (from memory).
  const anchors: [number, number][] = [[0, 320], [6, 40.0], [8, 20.0], [10, 10.0], [12, 5.0], [14, 2.5]];

  for (const [g, um] of anchors) {
    it(`gives G ${g} for l̄ ${um} µm within 0.001`, () => {
      expect(grainSizeFromIntercept(um)).to.be.closeTo(g, 0.001);
      expect(interceptForGrainSize(g)).to.be.closeTo(um, um * 1e-12);
    });
  }

  it('divides l̄ by √2 for each step of G', () => {
    // TRADE primer: "Each +1 in G divides l̄ by √2" [C].
    for (let g = -2; g < 15; g += 0.5) expect(interceptForGrainSize(g) / interceptForGrainSize(g + 1)).to.be.closeTo(Math.SQRT2, 1e-12);
  });

  it('gives G from grains per mm² by the planimetric relation', () => {
    // E112 §3 definition: n = 2^(G−1) grains per in² at 100x ⇒ N_A = 15.50·2^(G−1) per mm² at 1x [S]; printed constants shift G by < 0.001.
    for (const g of [1, 4, 8, 12]) expect(grainSizeFromAreaDensity(15.5 * 2 ** (g - 1))).to.be.closeTo(g, 0.001);
  });

  it('converts to the ISO 643 index by −0.046', () => {
    // TRADE primer: m = 8·2^G (ISO 643) vs N_A = 15.50·2^(G−1) (E112) ⇒ G_ISO = G_ASTM − 0.046 [C].
    expect(isoIndexFromAstm(8) - 8).to.be.closeTo(-0.046, 0.0005);
  });

  it('weighs marks per E112: crossing and tangent 1, triple point 1½ on lines and 2 on circles, line end ½ for intercepts only', () => {
    // TRADE primer, counting rules (E112, from memory; circle value from secondary sources and configurable).
    expect(markValue('crossing', LINE_RULES)).to.equal(1);
    expect(markValue('tangent', LINE_RULES)).to.equal(1);
    expect(markValue('triple_point', LINE_RULES)).to.equal(1.5);
    expect(markValue('triple_point', CIRCLE_RULES)).to.equal(2);
    expect(markValue('line_end', LINE_RULES)).to.equal(0);
    expect(markValue('line_end', { count: 'intercepts', triplePoint: 1.5 })).to.equal(0.5);
  });

  it('goes from counts to l̄ and G for five parallel lines at a known pixel size', () => {
    // Five lines of 2000 px at 0.25 µm/px = 2500 µm of test line; P = 125 ⇒ P_L = 50 mm⁻¹, l̄ = 20 µm, G = 8 (hand-computed).
    const r = fieldResult({ lineLengthUm: 5 * 2000 * 0.25, count: 125 });
    expect(r.perMm).to.equal(50);
    expect(r.meanInterceptUm).to.equal(20);
    expect(r.g).to.be.closeTo(8, 0.001);
  });

  it('goes from counts to G for the three-circle pattern at 100x', () => {
    // E112 three concentric circles, 500 mm total circumference at print scale: diameters 79.58, 53.05, 26.53 mm (TRADE primer) [C];
    // at 100x that is 5.000 mm of true line; 250 intersections ⇒ P_L = 50 mm⁻¹, G = 8.
    const printedMm = Math.PI * (79.58 + 53.05 + 26.53);
    expect(printedMm).to.be.closeTo(500, 0.05);
    expect(fieldResult({ lineLengthUm: (printedMm / 100) * 1000, count: 250 }).g).to.be.closeTo(8, 0.002);
  });

  it('divides a phase’s intercepts by its volume fraction', () => {
    // TRADE primer: l̄α = V_Vα·L / Nα; 40 % α, 1000 µm of line, 20 α intercepts ⇒ 20 µm (hand-computed).
    expect(phaseIntercept(0.4, 1000, 20)).to.equal(20);
    expect(() => phaseIntercept(0, 1000, 20)).to.throw(RangeError);
  });

  it('refuses fields without counts or length, and non-positive intercepts', () => {
    expect(() => fieldResult({ lineLengthUm: 100, count: 0 })).to.throw(RangeError);
    expect(() => fieldResult({ lineLengthUm: 0, count: 5 })).to.throw(RangeError);
    expect(() => grainSizeFromIntercept(0)).to.throw(RangeError);
  });
});
