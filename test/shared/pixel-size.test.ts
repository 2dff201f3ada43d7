import { expect } from 'chai';
import {
  isWriterDefaultResolution,
  micrometresPerPixel,
  omeLengthToMicrometres,
  pixelSizeFromTiffResolution,
} from '../../shared/pixel-size';

describe('pixel size: TIFF resolution tags', () => {
  it('converts pixels per centimetre with 10000 / XRes', () => {
    // TIFF 6.0, Section 8: ResolutionUnit 3 = centimetre; TRADE primer: µm/px = 10000/XRes for cm [C].
    expect(micrometresPerPixel(41_203, 3)).to.be.closeTo(0.2427, 5e-5);
    expect(micrometresPerPixel(10_000, 3)).to.equal(1);
  });

  it('converts pixels per inch with 25400 / XRes', () => {
    // TIFF 6.0, Section 8: ResolutionUnit 2 = inch; TRADE primer: µm/px = 25400/XRes for inch [C].
    expect(micrometresPerPixel(25_400, 2)).to.equal(1);
    expect(micrometresPerPixel(104_656, 2)).to.be.closeTo(0.2427, 5e-5);
  });

  it('gives no length when the unit is "none" or the value is unusable', () => {
    // TIFF 6.0, Section 8: ResolutionUnit 1 = no absolute unit of measurement.
    expect(micrometresPerPixel(1000, 1)).to.equal(null);
    expect(micrometresPerPixel(0, 3)).to.equal(null);
    expect(micrometresPerPixel(Number.NaN, 2)).to.equal(null);
  });

  it('treats 72, 96 and 300 dpi as writers’ defaults, in inches or converted to centimetres', () => {
    // TRADE primer, Calibration: 72, 96 or 300 dpi is a writer's default, not a calibration [P].
    for (const dpi of [72, 96, 300]) {
      expect(isWriterDefaultResolution(dpi, 2), `${dpi} dpi`).to.equal(true);
      expect(isWriterDefaultResolution(dpi / 2.54, 3), `${dpi} dpi as px/cm`).to.equal(true);
    }
  });

  it('treats the 1 px/mm libvips writes when no resolution is set as uncalibrated', () => {
    // libvips writes 1 pixel per mm by default (seen on this stack: XResolution 25.4 dpi, or 10 px/cm) [P].
    expect(isWriterDefaultResolution(25.4, 2)).to.equal(true);
    expect(isWriterDefaultResolution(10, 3)).to.equal(true);
  });

  it('accepts a real calibration that happens to be near a default only when it is not one', () => {
    expect(isWriterDefaultResolution(72.5, 2)).to.equal(false);
    expect(isWriterDefaultResolution(41_203, 3)).to.equal(false);
  });

  it('reads a calibrated pair with its source and a sentence naming the tags', () => {
    const r = pixelSizeFromTiffResolution(20_000, 10_000, 3);
    // 10000/20000 = 0.5 µm/px and 10000/10000 = 1 µm/px [C].
    expect(r).to.include({ xUm: 0.5, yUm: 1, source: 'tiff_resolution' });
    expect(r.note).to.contain('20000 px per cm');
  });

  it('defaults a missing ResolutionUnit to inch', () => {
    // TIFF 6.0, Section 8: ResolutionUnit default = 2 (inch).
    expect(pixelSizeFromTiffResolution(25_400, undefined, undefined)).to.include({ xUm: 1, yUm: 1, source: 'tiff_resolution' });
  });

  it('reports 72 dpi as uncalibrated and says why', () => {
    const r = pixelSizeFromTiffResolution(72, 72, 2);
    expect(r).to.include({ xUm: null, yUm: null, source: 'none' });
    expect(r.note).to.match(/default/);
  });

  it('reports a file without resolution tags as uncalibrated', () => {
    expect(pixelSizeFromTiffResolution(undefined, undefined, undefined)).to.include({ xUm: null, source: 'none' });
  });
});

describe('pixel size: OME PhysicalSize units', () => {
  it('takes µm as the default unit', () => {
    // OME schema: PhysicalSizeXUnit default "µm".
    expect(omeLengthToMicrometres(0.65, undefined)).to.equal(0.65);
  });

  it('accepts both the micro sign and the Greek mu, and "um"', () => {
    // OME schema UnitsLength spells it with U+00B5; TRADE primer: accept "µm", "μm", "um".
    expect(omeLengthToMicrometres(0.5, '\u00b5m')).to.equal(0.5);
    expect(omeLengthToMicrometres(0.5, '\u03bcm')).to.equal(0.5);
    expect(omeLengthToMicrometres(0.5, 'um')).to.equal(0.5);
  });

  it('converts nm, mm and m to µm', () => {
    // SI prefixes: 1 nm = 1e-3 µm, 1 mm = 1e3 µm, 1 m = 1e6 µm [C].
    expect(omeLengthToMicrometres(250, 'nm')).to.be.closeTo(0.25, 1e-12);
    expect(omeLengthToMicrometres(0.002, 'mm')).to.be.closeTo(2, 1e-12);
    expect(omeLengthToMicrometres(1e-6, 'm')).to.be.closeTo(1, 1e-12);
  });

  it('refuses units it does not know and values that are not positive', () => {
    expect(omeLengthToMicrometres(1, 'furlong')).to.equal(null);
    expect(omeLengthToMicrometres(0, 'µm')).to.equal(null);
    expect(omeLengthToMicrometres(-1, 'µm')).to.equal(null);
  });
});
