import { expect } from 'chai';
import { mountApp } from '../../support/api-client';
import { crossingsAlongColumn, draw, expectStatus, measureScene, measurementsPath } from './measurement-fixtures';

interface Row {
  where: string;
  direction: string;
  distanceUm: { min: number; max: number } | null;
  meanIntercept: { n: number; mean: number };
  totalCount: number;
  totalLineLengthUm: number;
}

/**
 * The specimen summary keeps layers and sub-bands apart: a field counts once in its layer row with its
 * whole-band totals, and each sub-band row pools every field's part at that distance (all directions),
 * whether the sub-band came from a whole field or was measured alone.
 *
 * Scene (hand-computed): 2000 × 1500 px at 0.5 µm/px, bond interfaces at y = 500 and y = 1000 + 0.1·x, so
 * band 2 lies between them. Five vertical lines 200 µm (400 px) apart at x = 200 … 1800; line 2 is x = 1000,
 * where band 2 runs from y = 500 to y = 1100. Each line keeps 40 px below y = 500 and 40·√1.01 px above the
 * slanted interface per 20 µm of distance, so a 20 µm sub-band holds 5·(40 + 40·√1.01)·0.5 µm of line.
 */
describe('measurements: specimen summary rows per layer and per sub-band', () => {
  let app: Awaited<ReturnType<typeof mountApp>>;
  before(async () => (app = await mountApp()));
  after(() => app.close());

  const vertical = { type: 'lines', direction: 'vertical', spacingUm: 200, count: 5 } as const;
  const subBandLengthUm = 5 * (40 + 40 * Math.sqrt(1.01)) * 0.5; // 200.499 µm

  it('when a band is counted whole with sub-bands and one sub-band is also measured alone, then the layer row has the whole field once and each sub-band one pooled row', async () => {
    const s = await measureScene(app.url);
    await draw(s, s.imageId, 'Bond interface', 'polyline', [[0, 1000], [2000, 1200]]);
    await draw(s, s.imageId, 'Bond interface', 'polyline', [[0, 500], [2000, 500]]);
    // Whole band 2 with sub-bands 0-20-40 µm; marks on line 2 at 5, 15, 30 and 50 µm below the straight interface.
    const whole = await s.researcher.post(measurementsPath(s, s.imageId), {
      kind: 'intercept', pattern: vertical, where: { type: 'band', band: 2 }, distanceBinsUm: [0, 20, 40],
      marks: [510, 530, 560, 600].map((y) => ({ x: 1000, y, line: 2, kind: 'crossing' })),
    });
    expectStatus(whole, 201);
    // The 0–20 µm sub-band of band 2 alone, four marks within 20 µm (40 px) of y = 500.
    const alone = await s.researcher.post(measurementsPath(s, s.imageId), {
      kind: 'intercept', pattern: vertical, where: { type: 'band', band: 2, distanceUm: { min: 0, max: 20 } }, marks: crossingsAlongColumn(2, 1000, 500, 540, 4),
    });
    expectStatus(alone, 201);
    expect(alone.body.result.direction, 'vertical lines cross horizontal interfaces').to.equal('across');

    const summary = await s.guest.get(`/api/projects/${s.projectId}/specimens/${s.specimenId}/measurements/summary`);
    expectStatus(summary, 200);
    const rows = summary.body.intercepts as Row[];
    expect(rows.map((r) => `${r.where} · ${r.direction}`)).to.deep.equal([
      'band 2 · across',
      'band 2, 0–20 µm from the nearest bond interface · all',
      'band 2, 20–40 µm from the nearest bond interface · all',
    ]);
    const [layer, near, far] = rows as [Row, Row, Row];
    // Layer: the whole field only, 1500 µm of line (bands test), P = 4, l̄ = 1500 / 4 = 375 µm (l̄ = L / P, ASTM E112).
    expect(layer).to.deep.include({ distanceUm: null, totalCount: 4 });
    expect(layer.meanIntercept.n).to.equal(1);
    expect(layer.totalLineLengthUm).to.be.closeTo(1500, 1e-6);
    expect(layer.meanIntercept.mean).to.be.closeTo(375, 1e-6);
    // 0–20 µm: the whole field's part (P = 2, l̄ = 200.499 / 2) and the sub-band alone (P = 4, l̄ = 200.499 / 4), mean of the two l̄.
    expect(near).to.deep.include({ distanceUm: { min: 0, max: 20 }, totalCount: 6 });
    expect(near.meanIntercept.n).to.equal(2);
    expect(near.totalLineLengthUm).to.be.closeTo(2 * subBandLengthUm, 1e-4);
    expect(near.meanIntercept.mean).to.be.closeTo((subBandLengthUm / 2 + subBandLengthUm / 4) / 2, 1e-4);
    // 20–40 µm: the whole field's part alone, P = 1 (the mark 30 µm out; the one at 50 µm lies beyond the last edge).
    expect(far).to.deep.include({ distanceUm: { min: 20, max: 40 }, totalCount: 1 });
    expect(far.meanIntercept.mean).to.be.closeTo(subBandLengthUm, 1e-4);

    // The summary CSV has the same rows as the two tables: one per layer and direction, one per sub-band.
    const csv = await s.guest.get(`/api/projects/${s.projectId}/specimens/${s.specimenId}/measurements/summary.csv`);
    expectStatus(csv, 200);
    // Cells 3 and 4 are Where and Direction (header of measurements-csv.ts); a Where with a comma is quoted (RFC 4180).
    const cells = String(csv.body).split('\r\n').filter((l) => l.includes('mean lineal intercept')).map((l) => l.match(/^[^,]*,[^,]*,("[^"]*"|[^,]*),([^,]*),/)!);
    const where = cells.map((c) => `${c[1]!.replace(/^"|"$/g, '')} · ${c[2]}`);
    expect(where).to.deep.equal(['band 2 · across', 'band 2, 0–20 µm from the nearest bond interface · all', 'band 2, 20–40 µm from the nearest bond interface · all']);
  });
});
