import { expect } from 'chai';
import {
  compositionFromRows,
  compositionRows,
  formatSum,
  listedSum,
  normaliseSymbol,
  repeatedElements,
  sumWarning,
  symbolProblem,
  type CompositionRow,
} from '../../../../src/app/archive/composition-rows';

const row = (element: string, wtPct: number | null): CompositionRow => ({ element, wtPct });

describe('client: composition rows, editing', () => {
  it('lists elements largest content first, as a composition is written', () => {
    const rows = compositionRows({ wtPct: { C: 0.6, Mn: 22, Si: 0.25 }, balance: 'Fe' });

    expect(rows).to.deep.equal([row('Mn', 22), row('C', 0.6), row('Si', 0.25)]);
  });

  it('gives no rows for a material without a composition', () => {
    expect(compositionRows({ wtPct: {}, balance: null })).to.deep.equal([]);
  });
});

describe('client: composition rows, the live sum', () => {
  it('adds the filled-in contents and skips rows still empty', () => {
    // 22 + 0.6 + 0.25 = 22.85 wt.% (hand-computed).
    expect(listedSum([row('Mn', 22), row('C', 0.6), row('Si', null), row('Al', 0.25)])).to.be.closeTo(22.85, 1e-12);
    expect(listedSum([row('Mn', Number.NaN), row('C', 1)])).to.equal(1);
    expect(listedSum([])).to.equal(0);
  });

  it('formats the sum with two decimals in wt.%', () => {
    expect(formatSum(22.85)).to.equal('22.85 wt.%');
    expect(formatSum(0.1 + 0.2)).to.equal('0.30 wt.%');
    expect(formatSum(18)).to.equal('18.00 wt.%');
  });

  it('accepts a sum up to 100.5 wt.%, the rounding an analysis may carry', () => {
    expect(sumWarning(100)).to.equal(null);
    expect(sumWarning(100.5)).to.equal(null);
  });

  it('warns about a sum above 100.5 wt.%, naming the sum', () => {
    // Mn typed as 220 instead of 22: 220 + 0.6 = 220.6 wt.%.
    const warning = sumWarning(220.6);

    expect(warning).to.contain('220.60 wt.%');
    expect(warning).to.contain('typing error');
  });
});

describe('client: composition rows, element symbols', () => {
  it('writes a symbol as IUPAC does, whatever case it was typed in', () => {
    expect(normaliseSymbol('mn ')).to.equal('Mn');
    expect(normaliseSymbol('MN')).to.equal('Mn');
    expect(normaliseSymbol(' c')).to.equal('C');
    expect(normaliseSymbol('   ')).to.equal('');
  });

  it('accepts element symbols in any case', () => {
    expect(symbolProblem('Mn')).to.equal(null);
    expect(symbolProblem('nb')).to.equal(null);
    expect(symbolProblem('W')).to.equal(null);
  });

  it('names a symbol that is no element, as it was typed', () => {
    expect(symbolProblem(' Xx ')).to.equal('Xx is not a chemical element symbol.');
    expect(symbolProblem('Mnn')).to.equal('Mnn is not a chemical element symbol.');
  });

  it('asks for a symbol when the field is blank', () => {
    expect(symbolProblem('  ')).to.equal('Enter an element symbol.');
  });

  it('finds elements listed twice, even in another case, and ignores blank rows', () => {
    const repeated = repeatedElements([row('Mn', 22), row('C', 0.6), row('mn', 1), row('', 1), row(' ', 2)]);

    expect([...repeated]).to.deep.equal(['Mn']);
  });

  it('finds none when every element is listed once', () => {
    expect(repeatedElements([row('Mn', 22), row('C', 0.6)]).size).to.equal(0);
  });
});

describe('client: composition rows, what is sent', () => {
  it('sends rows with a symbol and a content, symbols normalised, and the balance', () => {
    const sent = compositionFromRows([row('mn', 22), row('C', 0.6), row('Si', null), row('', 3)], 'Fe');

    expect(sent).to.deep.equal({ wtPct: { Mn: 22, C: 0.6 }, balance: 'Fe' });
  });

  it('sends no balance when none was chosen', () => {
    expect(compositionFromRows([row('Al', 99.5)], '')).to.deep.equal({ wtPct: { Al: 99.5 }, balance: null });
  });

  it('keeps a content of zero, which is a recorded value', () => {
    expect(compositionFromRows([row('Ni', 0)], 'Fe').wtPct).to.deep.equal({ Ni: 0 });
  });

  it('round-trips a stored composition through the editor rows', () => {
    const stored = { wtPct: { Mn: 16, Cr: 13, Ni: 2.5, C: 0.1 }, balance: 'Fe' };

    expect(compositionFromRows(compositionRows(stored), 'Fe')).to.deep.equal(stored);
  });
});
