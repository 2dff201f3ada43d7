import { expect } from 'chai';
import type { ProcessingInfo } from '../../../../shared/images';
import {
  anyInProgress,
  fieldOfView,
  formatBytes,
  formatLengthUm,
  formatMagnification,
  formatPixelSize,
  formatPixelSizeXY,
  processingText,
} from '../../../../src/app/archive/image-display';

describe('client: image display, pixel size', () => {
  it('reads a stage-micrometer calibration of 100 µm over 412 px as 0.2427 µm/px', () => {
    // TRADE primer, Calibration: 100 µm / 412 px = 0.2427 µm/px [C].
    expect(formatPixelSize(100 / 412)).to.equal('0.2427 µm/px');
  });

  it('switches to nm/px below 0.1 µm/px, where SEM images live', () => {
    // 5 µm field over 1024 px = 4.883 nm/px [C]; 1 µm = 1000 nm.
    expect(formatPixelSize(5 / 1024)).to.equal('4.883 nm/px');
    expect(formatPixelSize(0.09999)).to.equal('99.99 nm/px');
  });

  it('stays in µm/px when the value rounds up to 0.1000', () => {
    expect(formatPixelSize(0.099_995)).to.equal('0.1000 µm/px');
  });

  it('calls a missing, zero or negative pixel size uncalibrated', () => {
    for (const um of [null, 0, -1, Number.NaN]) expect(formatPixelSize(um), String(um)).to.equal('uncalibrated');
  });

  it('reads square pixels as one value', () => {
    expect(formatPixelSizeXY(0.25, 0.25)).to.equal('0.2500 µm/px');
    expect(formatPixelSizeXY(0.25, 0.250_000_01)).to.equal('0.2500 µm/px');
  });

  it('reads non-square pixels as both values, x first', () => {
    const text = formatPixelSizeXY(0.25, 0.5);

    expect(text).to.match(/^x 0\.2500 .*y 0\.5000 µm\/px$/);
  });

  it('calls an image without a pixel size uncalibrated', () => {
    expect(formatPixelSizeXY(null, null)).to.equal('uncalibrated');
    expect(formatPixelSizeXY(null, 0.25)).to.equal('uncalibrated');
  });
});

describe('client: image display, lengths and field of view', () => {
  it('writes a length in nm below 1 µm, in µm up to 1000 µm, then in mm', () => {
    // 1 mm = 1000 µm = 10^6 nm [C].
    expect(formatLengthUm(0.5)).to.equal('500 nm');
    expect(formatLengthUm(46.9)).to.equal('46.9 µm');
    expect(formatLengthUm(1500)).to.equal('1.50 mm');
  });

  it('chooses the unit after rounding: 999.5 µm reads 1.00 mm', () => {
    expect(formatLengthUm(999.5)).to.equal('1.00 mm');
  });

  it('gives the field of view of a 2048 × 1536 image at 0.25 µm/px as 512 × 384 µm', () => {
    // 2048 × 0.25 = 512 µm, 1536 × 0.25 = 384 µm [C].
    expect(fieldOfView(2048, 1536, 0.25, 0.25)).to.equal('512 × 384 µm');
  });

  it('writes both sides in the unit of the longer one', () => {
    // 4096 × 0.25 = 1024 µm = 1.02 mm; 3072 × 0.25 = 768 µm = 0.768 mm [C].
    expect(fieldOfView(4096, 3072, 0.25, 0.25)).to.equal('1.02 × 0.768 mm');
    // 1024 px at 0.9766 nm/px = 1.00 µm; 768 px = 0.750 µm [C].
    expect(fieldOfView(1024, 768, 1 / 1024, 1 / 1024)).to.equal('1.00 × 0.750 µm');
  });

  it('uses the pixel size of each axis', () => {
    expect(fieldOfView(1000, 1000, 0.2, 0.4)).to.equal('200 × 400 µm');
  });

  it('gives no field of view for an uncalibrated image', () => {
    expect(fieldOfView(2048, 1536, null, null)).to.equal('');
    expect(fieldOfView(2048, 1536, 0.25, 0)).to.equal('');
  });
});

describe('client: image display, magnification, file size and processing', () => {
  it('writes a magnification with a times sign, and nothing when unknown', () => {
    expect(formatMagnification(500)).to.equal('500×');
    expect(formatMagnification(0.1 + 0.2)).to.equal('0.3×');
    expect(formatMagnification(null)).to.equal('');
  });

  it('writes file sizes in binary units with one decimal below 100', () => {
    // 1 KiB = 1024 B, 1 MiB = 1024 KiB (IEC 80000-13) [C].
    expect(formatBytes(1023)).to.equal('1023 B');
    expect(formatBytes(1024)).to.equal('1.0 KiB');
    expect(formatBytes(Math.round(12.4 * 1024 * 1024))).to.equal('12.4 MiB');
    expect(formatBytes(150 * 1024)).to.equal('150 KiB');
    expect(formatBytes(3 * 1024 ** 3)).to.equal('3.0 GiB');
  });

  it('writes one byte short of 1 MiB as 1.0 MiB, not 1024 KiB', () => {
    expect(formatBytes(1024 * 1024 - 1)).to.equal('1.0 MiB');
  });

  it('gives a dash for a size that is not a size', () => {
    expect(formatBytes(-1)).to.equal('–');
    expect(formatBytes(Number.NaN)).to.equal('–');
  });

  const processing = (change: Partial<ProcessingInfo>): { processing: ProcessingInfo } => ({
    processing: { state: 'ready', progress: 100, failureReason: null, attempts: 1, ...change },
  });

  it('says where an image is in processing, with whole percents and the failure reason', () => {
    expect(processingText(processing({ state: 'queued', progress: 0 }).processing)).to.equal('queued');
    expect(processingText(processing({ state: 'processing', progress: 39.6 }).processing)).to.equal('processing 40 %');
    expect(processingText(processing({}).processing)).to.equal('ready');
    expect(processingText(processing({ state: 'failed', failureReason: 'not a TIFF' }).processing)).to.equal('failed: not a TIFF');
    expect(processingText(processing({ state: 'failed' }).processing)).to.equal('failed');
  });

  it('looks again while any image is queued or processing, not for ready or failed ones', () => {
    expect(anyInProgress([processing({}), processing({ state: 'queued' })])).to.equal(true);
    expect(anyInProgress([processing({}), processing({ state: 'processing', progress: 10 })])).to.equal(true);
    expect(anyInProgress([processing({}), processing({ state: 'failed' })])).to.equal(false);
    expect(anyInProgress([])).to.equal(false);
  });
});
