import { expect } from 'chai';
import { vonMisesStrainOfPass } from '../../../../shared/archive/process-route';
import {
  formatEtchingTime,
  formatPercent,
  formatPosition,
  formatStepParams,
  formatStrain,
  formatThickness,
  significant,
} from '../../../../src/app/archive/quantities';

describe('client: quantities, significant figures', () => {
  it('keeps three significant figures, padding with zeros', () => {
    expect(significant(1.5)).to.equal('1.50');
    expect(significant(0.1875)).to.equal('0.188');
    expect(significant(0.0042)).to.equal('0.00420');
  });

  it('rounds before choosing the decimals, so 0.9996 reads 1.00 and 99.96 reads 100', () => {
    expect(significant(0.9996)).to.equal('1.00');
    expect(significant(99.96)).to.equal('100');
  });

  it('writes large and small values without exponent notation', () => {
    expect(significant(123_456)).to.equal('123000');
    expect(significant(1500)).to.equal('1500');
    expect(significant(0.000_123_45)).to.equal('0.000123');
  });

  it('honours another number of figures and keeps the sign', () => {
    expect(significant(0.242_71, 4)).to.equal('0.2427');
    expect(significant(-0.0123)).to.equal('-0.0123');
  });

  it('reads zero as "0" and anything not finite as a dash', () => {
    expect(significant(0)).to.equal('0');
    expect(significant(Number.NaN)).to.equal('–');
    expect(significant(Number.POSITIVE_INFINITY)).to.equal('–');
  });
});

describe('client: quantities, thickness in the unit that suits it', () => {
  it('keeps mm from 0.1 mm up', () => {
    expect(formatThickness(1.5)).to.equal('1.50 mm');
    expect(formatThickness(0.1875)).to.equal('0.188 mm');
    expect(formatThickness(0.1)).to.equal('0.100 mm');
  });

  it('switches to µm below 0.1 mm: 0.0469 mm is 46.9 µm and 0.0042 mm is 4.20 µm', () => {
    // 1 mm = 1000 µm [C].
    expect(formatThickness(0.0999)).to.equal('99.9 µm');
    expect(formatThickness(0.0469)).to.equal('46.9 µm');
    expect(formatThickness(0.0042)).to.equal('4.20 µm');
  });

  it('switches to nm below 1 µm: 0.000366 mm is 366 nm', () => {
    // 1 mm = 10^6 nm [C].
    expect(formatThickness(0.000366)).to.equal('366 nm');
    expect(formatThickness(0.000999)).to.equal('999 nm');
  });

  it('chooses the unit after rounding, so 0.09999 mm reads 0.100 mm and 0.00099951 mm reads 1.00 µm', () => {
    expect(formatThickness(0.09999)).to.equal('0.100 mm');
    expect(formatThickness(0.000_999_51)).to.equal('1.00 µm');
  });

  it('reads 0.09995 mm as 0.100 mm, not 100 µm (one rounding decides unit and text)', () => {
    expect(formatThickness(0.09995)).to.equal('0.100 mm');
    expect(formatThickness(0.0009995)).to.equal('1.00 µm');
  });

  it('reads the thickness of one layer after ten 50 % passes of a 1.5 mm sheet in µm', () => {
    // Saito et al., Acta Mater. 47 (1999) 579: one original layer is t0 / 2^N; 1.5 / 1024 = 0.001465 mm [C].
    expect(formatThickness(1.5 / 2 ** 10)).to.equal('1.46 µm');
  });

  it('reads zero as 0 mm and a missing number as a dash', () => {
    expect(formatThickness(0)).to.equal('0 mm');
    expect(formatThickness(Number.NaN)).to.equal('–');
  });
});

describe('client: quantities, percentages and strain', () => {
  it('formats a fraction as a percentage with one decimal, dropping ".0" on whole numbers', () => {
    // hand-computed.
    expect(formatPercent(0.875)).to.equal('87.5 %');
    expect(formatPercent(0.123_45)).to.equal('12.3 %');
    expect(formatPercent(0.5)).to.equal('50 %');
    expect(formatPercent(1)).to.equal('100 %');
  });

  it('never prints a negative zero for a tiny negative fraction', () => {
    expect(formatPercent(-0.0001)).to.equal('0 %');
  });

  it('gives a dash for a missing fraction', () => {
    expect(formatPercent(Number.NaN)).to.equal('–');
  });

  it('shows the strain of one 50 % pass as 0.80', () => {
    // Saito et al., Acta Mater. 47 (1999) 579: ε = (2/√3)·ln 2 = 0.8004 per 50 % pass.
    expect(formatStrain(vonMisesStrainOfPass(0.5))).to.equal('0.80');
  });

  it('shows 60 % and 80 % passes as 1.06 and 1.86', () => {
    // Tsuji et al., Adv. Eng. Mater. 5 (2003) 338: 1.06 and 1.86.
    expect(formatStrain(vonMisesStrainOfPass(0.6))).to.equal('1.06');
    expect(formatStrain(vonMisesStrainOfPass(0.8))).to.equal('1.86');
  });

  it('shows three 50 % passes as 2.40 and a missing strain as a dash', () => {
    // 3 × 0.8004 = 2.401 (Saito et al. 1999) [C].
    expect(formatStrain(3 * vonMisesStrainOfPass(0.5))).to.equal('2.40');
    expect(formatStrain(Number.NaN)).to.equal('–');
  });
});

describe('client: quantities, step parameters', () => {
  it('reads a roll-bonding pass as its reduction, then free details', () => {
    expect(formatStepParams('roll_bonding', { reductionPct: 50, details: 'wire-brushed' })).to.deep.equal(['50 % reduction', 'wire-brushed']);
  });

  it('reads an anneal as temperature, time, atmosphere, then details', () => {
    expect(formatStepParams('anneal', { details: 'furnace cooled', atmosphere: 'argon', timeMin: 30, temperatureC: 800 })).to.deep.equal([
      '800 °C',
      '30 min',
      'argon',
      'furnace cooled',
    ]);
  });

  it('says a cut-and-stack without a piece count stacks two pieces', () => {
    // Saito et al. (1999): the route cuts the sheet in two and stacks the halves.
    expect(formatStepParams('cut_and_stack', {})).to.deep.equal(['2 pieces']);
    expect(formatStepParams('cut_and_stack', { pieces: 4 })).to.deep.equal(['4 pieces']);
  });

  it('does not show the binary noise of a typed value', () => {
    expect(formatStepParams('cold_rolling', { reductionPct: 0.1 + 0.2 })).to.deep.equal(['0.3 % reduction']);
  });

  it('shows nothing for a step without parameters', () => {
    expect(formatStepParams('surface_preparation', {})).to.deep.equal([]);
  });
});

describe('client: quantities, etching time and position', () => {
  it('formats an etching time in seconds and leaves it empty when not recorded', () => {
    expect(formatEtchingTime(8)).to.equal('8 s');
    expect(formatEtchingTime(0.1 + 0.2)).to.equal('0.3 s');
    expect(formatEtchingTime(null)).to.equal('');
  });

  it('formats both coordinates of a position in mm', () => {
    expect(formatPosition(2, 0.5)).to.equal('x 2 mm, y 0.5 mm');
  });

  it('shows only the coordinate that is known, including zero', () => {
    expect(formatPosition(null, 0)).to.equal('y 0 mm');
    expect(formatPosition(3.25, null)).to.equal('x 3.25 mm');
    expect(formatPosition(null, null)).to.equal('');
  });
});
