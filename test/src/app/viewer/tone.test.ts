import { expect } from 'chai';
import { applyTone, isNeutralTone, toneTransfer, type Tone } from '../../../../src/app/viewer/tone';

const tone = (over: Partial<Tone>): Tone => ({ brightness: 0, contrast: 1, gamma: 1, ...over });

describe('client: tone, the display curve', () => {
  it('leaves every value as it is at neutral settings', () => {
    for (const v of [0, 0.2, 0.5, 0.9, 1]) expect(applyTone(tone({}), v)).to.be.closeTo(v, 1e-12);
    expect(isNeutralTone(tone({}))).to.equal(true);
  });

  it('adds brightness to every value and clips at white', () => {
    expect(applyTone(tone({ brightness: 0.2 }), 0.5)).to.be.closeTo(0.7, 1e-12);
    expect(applyTone(tone({ brightness: 0.2 }), 0.95)).to.equal(1);
    expect(isNeutralTone(tone({ brightness: 0.2 }))).to.equal(false);
  });

  it('steepens around mid-grey with contrast, keeping mid-grey and clipping at black and white', () => {
    // Hand-computed: contrast 2 maps 0.5 → 0.5, 0.6 → 0.7, 0.4 → 0.3, 0.1 → 0 (clipped).
    const t = tone({ contrast: 2 });

    expect(applyTone(t, 0.5)).to.be.closeTo(0.5, 1e-12);
    expect(applyTone(t, 0.6)).to.be.closeTo(0.7, 1e-12);
    expect(applyTone(t, 0.4)).to.be.closeTo(0.3, 1e-12);
    expect(applyTone(t, 0.1)).to.equal(0);
  });

  it('lightens the mid-tones for a gamma above 1 and keeps black and white', () => {
    // Hand-computed: gamma 2 shows 0.25 as 0.25^(1/2) = 0.5.
    const t = tone({ gamma: 2 });

    expect(applyTone(t, 0.25)).to.be.closeTo(0.5, 1e-12);
    expect(applyTone(t, 0)).to.equal(0);
    expect(applyTone(t, 1)).to.equal(1);
  });

  it('gives the three numbers of an SVG gamma transfer that draw the same curve', () => {
    // SVG 1.1 feComponentTransfer type="gamma": C' = amplitude · C^exponent + offset.
    const t = tone({ brightness: 0.1, contrast: 1.5, gamma: 0.8 });
    const { amplitude, exponent, offset } = toneTransfer(t);

    for (const v of [0.2, 0.4, 0.6]) expect(Math.min(1, amplitude * v ** exponent + offset)).to.be.closeTo(applyTone(t, v), 1e-12);
  });

  it('keeps settings typed past the sliders inside their range and reads a non-number as neutral', () => {
    expect(toneTransfer(tone({ contrast: 99 }))).to.deep.equal(toneTransfer(tone({ contrast: 3 })));
    expect(toneTransfer(tone({ gamma: 0 })).exponent).to.be.finite;
    expect(toneTransfer(tone({ brightness: Number.NaN }))).to.deep.equal(toneTransfer(tone({})));
  });
});
