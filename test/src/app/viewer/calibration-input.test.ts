import { expect } from 'chai';
import { formatPixelSize, previewCalibration, toMicrometres } from '../../../../src/app/viewer/calibration-input';

describe('client: calibration input, units', () => {
  it('turns nm, µm and mm into µm', () => {
    // 1 µm = 1000 nm, 1 mm = 1000 µm [C].
    expect(toMicrometres(500, 'nm')).to.be.closeTo(0.5, 1e-12);
    expect(toMicrometres(100, 'µm')).to.equal(100);
    expect(toMicrometres(0.1, 'mm')).to.be.closeTo(100, 1e-9);
  });
});

describe('client: calibration input, the preview', () => {
  it('gives 0.2427 µm/px for 100 µm over 412 px', () => {
    // TRADE primer [C]: 100 µm over 412 px = 0.2427 µm/px.
    const out = previewCalibration([0, 0], [412, 0], 100, 'µm');

    expect(out.ok).to.equal(true);
    if (!out.ok) return;
    expect(out.umPerPx).to.be.closeTo(0.2427, 5e-5);
    expect(out.trueLengthUm).to.equal(100);
    expect(out.warning).to.equal(null);
  });

  it('gives the same pixel size when the length is typed as 0.1 mm or 100000 nm', () => {
    // TRADE primer [C]; 0.1 mm = 100 µm = 100000 nm.
    const mm = previewCalibration([0, 0], [412, 0], 0.1, 'mm');
    const nm = previewCalibration([0, 0], [412, 0], 100_000, 'nm');

    expect(mm.ok && mm.umPerPx).to.be.closeTo(0.2427, 5e-5);
    expect(nm.ok && nm.umPerPx).to.be.closeTo(0.2427, 5e-5);
  });

  it('measures a slanted line by its true length in pixels', () => {
    // Hand-computed: a 3-4-5 line of 300 × 400 px is 500 px; 50 µm / 500 px = 0.1 µm/px.
    const out = previewCalibration([100, 100], [400, 500], 50, 'µm');

    expect(out.ok && out.umPerPx).to.be.closeTo(0.1, 1e-12);
  });

  it('asks for a length when none is typed or it is not a number', () => {
    const empty = previewCalibration([0, 0], [412, 0], null, 'µm');
    const nan = previewCalibration([0, 0], [412, 0], Number.NaN, 'µm');

    expect(empty.ok).to.equal(false);
    expect(nan.ok).to.equal(false);
    expect(!empty.ok && empty.problem).to.match(/length/i);
  });

  it('refuses a zero or negative length', () => {
    expect(previewCalibration([0, 0], [412, 0], 0, 'µm').ok).to.equal(false);
    expect(previewCalibration([0, 0], [412, 0], -5, 'mm').ok).to.equal(false);
  });

  it('refuses a line shorter than a pixel instead of throwing', () => {
    const out = previewCalibration([10, 10], [10.5, 10], 100, 'µm');

    expect(out.ok).to.equal(false);
    expect(!out.ok && out.problem).to.match(/pixel/i);
  });

  it('warns, but still previews, when the unit was most likely mistyped', () => {
    // Hand-computed: 1000 mm over 412 px = 2427 µm/px, beyond any light or electron micrograph
    // (common practice, no source: well under 1 mm per pixel) — a unit typed as mm instead of µm.
    const out = previewCalibration([0, 0], [412, 0], 1000, 'mm');

    expect(out.ok).to.equal(true);
    expect(out.ok && out.warning).to.be.a('string');
  });
});

describe('client: calibration input, how the pixel size reads', () => {
  it('writes four significant digits with the unit', () => {
    // TRADE primer [C]: 100 / 412 = 0.24271… → 0.2427.
    expect(formatPixelSize(100 / 412)).to.equal('0.2427 µm/px');
    expect(formatPixelSize(1.5)).to.equal('1.5 µm/px');
    expect(formatPixelSize(12.3456)).to.equal('12.35 µm/px');
  });
});
