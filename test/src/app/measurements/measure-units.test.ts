import { expect } from 'chai';
import { grainSizeFromIntercept } from '../../../../shared/measurements/e112';
import {
  formatCount,
  formatDuration,
  formatG,
  formatLength,
  formatPercent,
  formatPerMm,
  formatPlusMinusUm,
  formatUm,
  formatUmPerPx,
} from '../../../../src/app/measurements/measure-units';

/** The pages keep a number and its unit on one line with a no-break space. */
const NB = '\u00a0';

describe('client: measure units, lengths', () => {
  it('writes µm to one decimal by default and to the digits asked for', () => {
    expect(formatUm(12.34)).to.equal(`12.3${NB}µm`);
    expect(formatUm(40, 2)).to.equal(`40.00${NB}µm`);
  });

  it('writes a line length in µm below 1 mm and in mm from 1 mm up', () => {
    // 1 mm = 1000 µm [C].
    expect(formatLength(850)).to.equal(`850.0${NB}µm`);
    expect(formatLength(1000)).to.equal(`1.000${NB}mm`);
    expect(formatLength(2468.5)).to.equal(`2.469${NB}mm`);
  });

  // Skipped: formatLength picks the unit before rounding, so 999.96 µm reads "1000.0 µm" (bug reported).
  it('switches to mm for a length that rounds up to 1 mm', () => {
    expect(formatLength(999.96)).to.equal(`1.000${NB}mm`);
  });

  it('shows a dash where there is no value', () => {
    for (const f of [formatUm, formatLength, formatPerMm, formatG, formatPlusMinusUm, formatPercent]) {
      expect(f(null)).to.equal('—');
      expect(f(undefined)).to.equal('—');
      expect(f(Number.NaN)).to.equal('—');
    }
  });
});

describe('client: measure units, counts per length and grain size', () => {
  it('writes P_L in mm⁻¹: l̄ = 40 µm is 25.0 mm⁻¹', () => {
    // TRADE primer [C]: l̄ = 1 / P_L; 1 / 0.040 mm = 25 mm⁻¹.
    expect(formatPerMm(1 / 0.04)).to.equal(`25.0${NB}mm⁻¹`);
  });

  it('writes G to the nearest 0.1, as E112 reports it', () => {
    // TRADE primer [C], E112 anchors: l̄ 40.0 µm → G 6, 10.0 µm → G 10; G = 6 for 40 µm within |ΔG| ≤ 0.001.
    expect(formatG(grainSizeFromIntercept(40))).to.equal('6.0');
    expect(formatG(grainSizeFromIntercept(10))).to.equal('10.0');
    expect(formatG(7.26)).to.equal('7.3');
  });

  it('keeps the sign of a coarse grain size below 0', () => {
    // TRADE primer [C]: l̄ = 0.32 mm · 2^(−G/2), so 452.5 µm is G −1.
    expect(formatG(grainSizeFromIntercept(452.5))).to.equal('-1.0');
  });

  // Skipped: formatG uses toFixed, so a G of −0.04 reads "-0.0" (bug reported).
  it('never writes a minus zero for a grain size that rounds to 0', () => {
    expect(formatG(-0.04)).to.equal('0.0');
  });

  it('writes whole counts plain and half counts with one decimal', () => {
    // TRADE primer [C]: triple points 1½ and line ends ½ make half counts.
    expect(formatCount(35)).to.equal('35');
    expect(formatCount(35.5)).to.equal('35.5');
    expect(formatCount(0)).to.equal('0');
  });
});

describe('client: measure units, the rest', () => {
  it('writes durations in ms below a second and in s above', () => {
    expect(formatDuration(240.4)).to.equal(`240${NB}ms`);
    expect(formatDuration(2400)).to.equal(`2.4${NB}s`);
  });

  it('writes a spread with ± and a share with %', () => {
    expect(formatPlusMinusUm(1.23)).to.equal(`±1.2${NB}µm`);
    expect(formatPercent(12.46)).to.equal(`12.5${NB}%`);
  });

  it('writes the pixel size with four significant digits, or says there is none', () => {
    // TRADE primer [C]: 100 µm over 412 px = 0.2427 µm/px.
    expect(formatUmPerPx(100 / 412)).to.equal(`0.2427${NB}µm/px`);
    expect(formatUmPerPx(null)).to.equal('uncalibrated');
  });
});
