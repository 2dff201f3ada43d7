import { expect } from 'chai';
import { compositionSchema, formatComposition } from '../../../shared/archive/composition';
import { ELEMENT_SYMBOLS, isElementSymbol } from '../../../shared/archive/elements';

describe('archive: element symbols and compositions', () => {
  it('knows all 118 elements, from H to Og, each once', () => {
    // IUPAC periodic table (2016 names of elements 113, 115, 117, 118) [S].
    expect(ELEMENT_SYMBOLS).to.have.length(118);
    expect(new Set(ELEMENT_SYMBOLS).size).to.equal(118);
    expect(ELEMENT_SYMBOLS[25]).to.equal('Fe'); // Z = 26
    expect(ELEMENT_SYMBOLS[41]).to.equal('Mo'); // Z = 42
    expect(ELEMENT_SYMBOLS[117]).to.equal('Og'); // Z = 118
  });

  it('is case-sensitive, as symbols are', () => {
    expect(isElementSymbol('Mn')).to.equal(true);
    expect(isElementSymbol('MN')).to.equal(false);
    expect(isElementSymbol('mn')).to.equal(false);
  });

  it('accepts up to 100.5 wt.% listed, and refuses more', () => {
    expect(compositionSchema.safeParse({ wtPct: { Cr: 60, Ni: 40.5 }, balance: null }).success).to.equal(true);
    const over = compositionSchema.safeParse({ wtPct: { Cr: 60, Ni: 40.51 }, balance: null });
    expect(over.success).to.equal(false);
  });

  it('refuses an element that is both listed and the balance', () => {
    const res = compositionSchema.safeParse({ wtPct: { Fe: 70, Cr: 18 }, balance: 'Fe' });
    expect(res.success).to.equal(false);
    expect(res.error!.issues[0]!.path).to.deep.equal(['balance']);
  });

  it('writes the balance first, then the rest by falling content', () => {
    // Common practice in alloy datasheets, no source.
    expect(formatComposition({ wtPct: { C: 0.6, Mn: 22, Al: 0.3 }, balance: 'Fe' })).to.equal('Fe bal., Mn 22, C 0.6, Al 0.3');
  });
});
