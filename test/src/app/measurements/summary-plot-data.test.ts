import { expect } from 'chai';
import type { AcrossFields, InterceptSummary } from '../../../../shared/measurements/measurement-records';
import { distanceBars, interceptBars, layerRows, placeOfSubBand, rowLabel, subBandRows } from '../../../../src/app/measurements/summary-plot-data';

const across = (n: number, mean: number, ci95: number | null): AcrossFields => ({ n, mean, s: null, ci95, relativeAccuracyPct: null, relativeAccuracyWarning: false });
const row = (where: string, direction: InterceptSummary['direction'], meanIntercept: AcrossFields, phase: string | null = null): InterceptSummary => ({
  where,
  staleFields: 0,
  emptyFields: 0,
  warnings: [],
  direction,
  band: null,
  distanceUm: null,
  phase,
  meanIntercept,
  g: 6,
  gIso: 6,
  totalCount: 100,
  totalLineLengthUm: 4000,
  countSymbols: ['P'],
  anisotropyIndex: null,
});

describe('client: summary plot data', () => {
  it('labels a row by where, direction in words and phase', () => {
    expect(rowLabel({ where: 'band 2', direction: 'along', phase: null })).to.equal('band 2 · along');
    expect(rowLabel({ where: 'whole image', direction: 'all', phase: 'ferrite' })).to.equal('whole image · all directions · ferrite');
  });

  it('draws each row as its mean with the 95 % interval either side', () => {
    const bars = interceptBars([row('band 1', 'along', across(5, 40, 3.5))]);

    expect(bars).to.deep.equal([{ label: 'band 1 · along', mean: 40, low: 36.5, high: 43.5 }]);
  });

  it('draws a single field as its mean alone', () => {
    const [bar] = interceptBars([row('band 1', 'across', across(1, 20, null))]);

    expect(bar).to.include({ mean: 20, low: 20, high: 20 });
  });

  it('does not let an interval run below zero', () => {
    const [bar] = interceptBars([row('band 3', 'across', across(2, 5, 12))]);

    expect(bar!.low).to.equal(0);
    expect(bar!.high).to.equal(17);
  });

  it('leaves out rows with no counted field', () => {
    const bars = interceptBars([row('band 1', 'along', across(0, Number.NaN, null)), row('band 2', 'along', across(3, 30, 2))]);

    expect(bars.map((b) => b.label)).to.deep.equal(['band 2 · along']);
  });
});

describe('client: the plot across the distance from the interfaces', () => {
  it('keeps sub-band rows only, ordered outwards per place, with their 95 % intervals', () => {
    const sub = (where: string, min: number, max: number, mean: number, ci: number | null, band: number | null = 1): InterceptSummary => ({
      ...row(`${where}, ${min}–${max} µm from the nearest bond interface`, 'all', across(3, mean, ci)),
      band,
      distanceUm: { min, max },
    });
    const rows = [
      row('band 1', 'along', across(3, 30, 2)),
      sub('band 1', 20, 40, 25, 3),
      sub('band 1', 0, 20, 12, 1.5),
      sub('region “near bond”', 0, 20, 10, null, null),
    ];
    const bars = distanceBars(rows);
    expect(bars.map((b) => b.label)).to.deep.equal(['band 1 · 0–20 µm', 'band 1 · 20–40 µm', 'region “near bond” · 0–20 µm']);
    // Interval = mean ± CI (hand-computed): 12 ± 1.5 → 10.5–13.5 µm; a single-field row has no interval.
    expect(bars[0]).to.deep.include({ mean: 12, low: 10.5, high: 13.5 });
    expect(bars[2]).to.deep.include({ mean: 10, low: 10, high: 10 });
    expect(placeOfSubBand({ where: 'region “a, b”, 0–20 µm from the nearest bond interface' })).to.equal('region “a, b”');
  });
});

describe('client: the main table and the distance table of the summary', () => {
  it('puts each layer and direction in the main table and each sub-band in the distance table, none in both', () => {
    // A band counted whole with sub-bands comes back as its layer rows plus one row per sub-band (summary.service.ts).
    const sub = (min: number, max: number): InterceptSummary => ({
      ...row(`band 2, ${min}–${max} µm from the nearest bond interface`, 'all', across(2, 40 + min, 4)),
      band: 2,
      distanceUm: { min, max },
    });
    const rows = [{ ...row('band 2', 'along', across(3, 60, 5)), band: 2 }, { ...row('band 2', 'across', across(3, 45, 5)), band: 2 }, sub(0, 20), sub(20, 40)];

    const main = layerRows(rows).map(rowLabel);
    const byDistance = subBandRows(rows).map((r) => r.where);

    expect(main).to.deep.equal(['band 2 · along', 'band 2 · across']);
    expect(byDistance).to.deep.equal(['band 2, 0–20 µm from the nearest bond interface', 'band 2, 20–40 µm from the nearest bond interface']);
    expect(interceptBars(layerRows(rows)).map((b) => b.label)).to.deep.equal(main);
  });
});
