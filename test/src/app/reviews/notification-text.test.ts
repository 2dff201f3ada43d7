import { expect } from 'chai';
import { deliveryExplanation, digestTime } from '../../../../src/app/reviews/notification-text';

describe('client: notification text, the digest hour', () => {
  it('writes the hour with two digits and UTC', () => {
    expect(digestTime(7)).to.equal('07:00 UTC');
    expect(digestTime(0)).to.equal('00:00 UTC');
    expect(digestTime(23)).to.equal('23:00 UTC');
  });

  it('keeps an hour out of range or with a fraction inside the day', () => {
    expect(digestTime(-3)).to.equal('00:00 UTC');
    expect(digestTime(30)).to.equal('23:00 UTC');
    expect(digestTime(7.9)).to.equal('07:00 UTC');
  });
});

describe('client: notification text, what a delivery mode means', () => {
  it('names the digest hour only for the daily mode', () => {
    expect(deliveryExplanation('daily', 18)).to.include('18:00 UTC');
    expect(deliveryExplanation('immediate', 18)).to.not.include('18:00');
    expect(deliveryExplanation('off', 18)).to.not.include('18:00');
  });

  it('explains each mode differently', () => {
    const texts = (['immediate', 'daily', 'off'] as const).map((m) => deliveryExplanation(m, 7));

    expect(new Set(texts).size).to.equal(3);
  });
});
