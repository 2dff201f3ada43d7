import { expect } from 'chai';
import { fitAlignment } from '../../../../shared/viewer/alignment';
import { summariseAlignment } from '../../../../src/app/viewer/alignment-summary';

describe('viewer: alignment summary in words', () => {
  it('two pairs: exact fit, scale and turn, compared with the pixel sizes', () => {
    // Hand-computed: (0,0)→(10,20) and (100,0)→(10,220): twice the size, turned 90°.
    const fit = fitAlignment([{ image: [10, 20], other: [0, 0] }, { image: [10, 220], other: [100, 0] }]);
    const s = summariseAlignment(fit, 0.5, 1.0);
    expect(s.what).to.equal('Scale, rotation and shift from 2 point pairs');
    expect(s.agreement).to.contain('Two pairs fit exactly');
    // Hand-computed: 1.0 / 0.5 = 2 expected, 2 fitted.
    expect(s.scale).to.equal('Compared image drawn at 2.000 ×, turned 90.0°; the pixel sizes say 2.000 × (0.0 % apart)');
    expect(s.warning).to.equal('');
    expect(summariseAlignment(fit, 0.5, 1.2).warning, 'expected 2.4 ×, fitted 2 ×: 17 % apart').to.contain('more than 5 %');
  });

  it('three pairs: the similarity residuals in µm when the main image is calibrated, in px when not', () => {
    // Hand-computed in test/shared/viewer/alignment.test.ts: residuals 0.5·√2, 0.5 and 0.5 px.
    const fit = fitAlignment([{ image: [0, 0], other: [0, 0] }, { image: [10, 0], other: [10, 0] }, { image: [0, 12], other: [0, 10] }]);
    // 0.7071 px × 2 µm/px = 1.414 µm; 0.5 px × 2 µm/px = 1 µm.
    expect(summariseAlignment(fit, 2, null).agreement).to.equal('Off by, with scale, rotation and shift only: 1: 1.41 µm · 2: 1 µm · 3: 1 µm');
    expect(summariseAlignment(fit, null, null).agreement).to.equal('Off by, with scale, rotation and shift only: 1: 0.707 px · 2: 0.5 px · 3: 0.5 px');
    expect(summariseAlignment(fit, null, null).scale).to.equal('Compared image drawn at 1.200 × by 1.000 ×, turned 0.0°');
  });
});
