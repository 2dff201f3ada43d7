import { expect } from 'chai';
import { fieldResult } from '../../../../shared/measurements/e112';
import type { InterceptFigures, InterceptResult, PointCountResult, ThicknessResult } from '../../../../shared/measurements/measurement-records';
import { groupRows, historyLine, resultGist, resultRows } from '../../../../src/app/measurements/result-rows';

const NB = '\u00a0';

/** A field of 2.5 mm of test line with P = 62.5: P_L 25 mm⁻¹, l̄ 40 µm, G 6 (TRADE primer [C] anchor G 6 → 40.0 µm). */
const figures = (lineLengthUm = 2500, count = 62.5): InterceptFigures => {
  const f = fieldResult({ lineLengthUm, count });
  return { lineLengthUm, count, perMm: f.perMm, meanInterceptUm: f.meanInterceptUm, g: f.g, gIso: null };
};
const intercept = (over: Partial<InterceptResult> = {}): InterceptResult => ({
  kind: 'intercept',
  ...figures(),
  countSymbol: 'P',
  rules: { count: 'intersections', triplePoint: 1.5 },
  direction: 'along',
  byDirection: null,
  bins: null,
  twinsExcluded: true,
  phase: null,
  confirmedMarks: 60,
  suggestedMarks: 0,
  marksLeftOut: 0,
  statements: [],
  ...over,
});

describe('client: result rows, an intercept count', () => {
  it('reads length, P, P_L, l̄ and G with their units: 62.5 over 2.5 mm is l̄ 40 µm, G 6.0', () => {
    // TRADE primer [C]: P_L = P / L, l̄ = 1 / P_L, anchor G 6 → l̄ 40.0 µm.
    const rows = resultRows(intercept());

    expect(rows.map((r) => r.value)).to.deep.equal([`2.500${NB}mm`, '62.5', `25.0${NB}mm⁻¹`, `40.00${NB}µm`, '6.0']);
    expect(rows[2]).to.include({ label: 'P', sub: 'L' });
  });

  it('names intercepts N when N was counted', () => {
    const rows = resultRows(intercept({ countSymbol: 'N' }));

    expect(rows[1]!.label).to.match(/^N .*intercepts/);
    expect(rows[2]).to.include({ label: 'N', sub: 'L' });
  });

  it('shows dashes for a field where nothing was counted yet', () => {
    const rows = resultRows(intercept({ count: 0, perMm: null, meanInterceptUm: null, g: null }));

    expect(rows.slice(2).map((r) => r.value)).to.deep.equal(['—', '—', '—']);
  });

  it('adds along and across groups and the anisotropy index for lines laid both ways', () => {
    // TRADE primer [C]: along l̄ 40 µm (G 6), across l̄ 20 µm (G 8); l̄∥ / l̄⊥ = 2.00 (hand-computed).
    const rows = resultRows(intercept({ direction: 'all', byDirection: { along: figures(2500, 62.5), across: figures(2500, 125), anisotropyIndex: 2 } }));
    const groups = groupRows(rows);

    expect(groups.map((g) => g.title)).to.deep.equal(['', 'Along the interfaces', 'Across the interfaces']);
    expect(groups[1]!.rows.at(-1)!.value).to.equal('6.0');
    expect(groups[2]!.rows.at(-1)!.value).to.equal('8.0');
    expect(groups[0]!.rows.at(-1)).to.include({ value: '2.00' });
  });

  it('leaves the anisotropy index out when it cannot be worked out', () => {
    const rows = resultRows(intercept({ byDirection: { along: figures(), across: figures(), anisotropyIndex: null } }));

    expect(rows.some((r) => r.label.startsWith('Anisotropy'))).to.equal(false);
  });

  it('sums a count up in one line', () => {
    expect(resultGist(intercept())).to.equal(`P = 62.5, l̄ = 40.00${NB}µm, G = 6.0`);
  });
});

describe('client: result rows, a point count and a thickness', () => {
  const points: PointCountResult = {
    kind: 'point_count',
    phaseName: 'oxide',
    gridPoints: 100,
    inside: 20,
    onBoundary: 5,
    // ASTM E562 [C]: P_p = (inside + ½ boundary) / P_T = 22.5 / 100.
    pointFraction: 0.225,
    confirmedMarks: 25,
    suggestedMarks: 0,
    marksLeftOut: 0,
    statements: [],
  };
  const thickness: ThicknessResult = { kind: 'thickness', band: 2, spacingUm: 10, meanUm: 48.256, sUm: 3.1, minUm: 41.04, maxUm: 55.96, samplesUm: [41, 48, 56], statements: [] };

  it('reads a point count as grid points, hits and the point fraction in per cent', () => {
    const rows = resultRows(points);

    expect(rows.map((r) => r.value)).to.deep.equal(['100', '20 / 5', '22.5 %']);
    expect(rows[2]!.label).to.include('oxide');
    expect(resultGist(points)).to.equal('point fraction 22.5 % oxide');
  });

  it('reads a thickness as mean, spread, range and samples in µm', () => {
    const rows = resultRows(thickness);

    expect(rows[0]).to.deep.equal({ label: 'Mean thickness of band 2', value: `48.26${NB}µm` });
    expect(rows[2]!.value).to.equal(`41.0${NB}µm – 56.0${NB}µm`);
    expect(rows[3]!.value).to.equal(`3, every 10.0${NB}µm`);
    expect(resultGist(thickness)).to.equal(`thickness 48.26${NB}µm ± 3.10${NB}µm`);
  });

  it('puts rows without a group into one untitled group', () => {
    expect(groupRows(resultRows(thickness))).to.have.length(1);
  });
});

describe('client: result rows, sub-bands and a phase volume fraction', () => {
  it('adds one titled group per sub-band with its own length, count, l̄ and marks', () => {
    // 0–20 µm: P = 10 on 0.5 mm → l̄ 50 µm; 20–40 µm: P = 25 on 0.5 mm → l̄ 20 µm (hand-computed, l̄ = L / P).
    const bins = [
      { minUm: 0, maxUm: 20, marks: 10, ...figures(500, 10) },
      { minUm: 20, maxUm: 40, marks: 25, ...figures(500, 25) },
    ];
    const groups = groupRows(resultRows(intercept({ bins })));
    expect(groups.map((g) => g.title)).to.deep.equal(['', `Sub-band 0–20${NB}µm from the nearest interface`, `Sub-band 20–40${NB}µm from the nearest interface`]);
    expect(groups[1]!.rows.find((r) => r.label === 'Mean lineal intercept l̄')!.value).to.equal(`50.00${NB}µm`);
    expect(groups[2]!.rows.find((r) => r.label === 'Mean lineal intercept l̄')!.value).to.equal(`20.00${NB}µm`);
    expect(groups[2]!.rows.find((r) => r.label === 'Confirmed marks in this sub-band')!.value).to.equal('25');
  });

  it('states the volume fraction and the point count it came from', () => {
    const phase = { name: 'ferrite', volumeFraction: 1 / 3, pointCount: { id: 'pc', version: 2, phaseName: 'ferrite', whereLabel: 'band 1', pointFraction: 1 / 3 } };
    const row = resultRows(intercept({ countSymbol: 'N', phase })).find((r) => r.sub === 'V')!;
    expect(row.label).to.equal('Volume fraction of ferrite V');
    expect(row.value).to.equal('0.333 (from the point count of ferrite on band 1, version 2)');
    const typed = resultRows(intercept({ countSymbol: 'N', phase: { ...phase, volumeFraction: 0.4, pointCount: null } })).find((r) => r.sub === 'V')!;
    expect(typed.value).to.equal('0.400 (typed in)');
  });
});

describe('client: result rows, the history of a measurement', () => {
  it('reads an earlier result with why it was replaced, by whom, and at which pixel size', () => {
    const line = historyLine({ version: 1, reason: 'recomputed', umPerPx: 0.25, pixelSizeSource: 'user', result: intercept(), replacedAt: '2026-01-01T00:00:00Z', replacedByName: 'Ana' });
    // 62.5 over 2.5 mm: l̄ 40 µm, G 6.0 (TRADE primer [C] anchor).
    expect(line).to.equal(`Version 1, replaced by a recompute (Ana): P = 62.5, l̄ = 40.00${NB}µm, G = 6.0 at 0.25${NB}µm/px`);
  });
});
