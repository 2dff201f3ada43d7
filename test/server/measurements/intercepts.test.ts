import { expect } from 'chai';
import { mountApp } from '../../support/api-client';
import { sql } from '../db-state';
import { crossingsAlongColumn, crossingsAlongRow, draw, expectStatus, marksOnCircle, measureScene, measurementsPath } from './measurement-fixtures';

/** E112 lineal relation with the printed constants, written out here: G = −6.643856·log10(l̄ / mm) − 3.288. */
const g112 = (meanInterceptUm: number) => -6.643856 * Math.log10(meanInterceptUm / 1000) - 3.288;

describe('measurements: intercept counts → l̄ → G, recomputed by the server', () => {
  let app: Awaited<ReturnType<typeof mountApp>>;
  before(async () => (app = await mountApp()));
  after(() => app.close());

  // 2000 × 1500 px at 0.5 µm/px; five horizontal lines 100 µm apart lie at y = 350 … 1150, each 2000 px = 1000 µm (hand-computed).
  const fiveLines = { type: 'lines', direction: 'horizontal', spacingUm: 100, count: 5 } as const;
  const rows = [350, 550, 750, 950, 1150];

  it('when 5 lines of 1000 µm carry P = 250 (crossings, triple points 1½, tangents), then P_L = 50 mm⁻¹, l̄ = 20.0 µm and G = 8.0', async () => {
    const s = await measureScene(app.url);
    // Per line: 46 crossings + 2 triple points (1½ each on lines, E112) + 1 tangent = 50 (hand-computed).
    const marks = rows.flatMap((y, line) => [
      ...crossingsAlongRow(line, y, 0, 1800, 46),
      ...crossingsAlongRow(line, y, 1800, 1900, 2, 'triple_point'),
      ...crossingsAlongRow(line, y, 1900, 2000, 1, 'tangent'),
    ]);
    const suggested = crossingsAlongRow(0, 350, 10, 20, 3).map((m) => ({ ...m, status: 'suggested' as const }));
    const res = await s.researcher.post(measurementsPath(s, s.imageId), { kind: 'intercept', pattern: fiveLines, marks: [...marks, ...suggested] });
    expectStatus(res, 201);
    const r = res.body.result;
    expect(r.lineLengthUm).to.be.closeTo(5000, 1e-9); // 5 × 2000 px × 0.5 µm/px (hand-computed)
    expect(r.count).to.equal(250);
    expect(r.countSymbol).to.equal('P');
    expect(r.rules).to.deep.equal({ count: 'intersections', triplePoint: 1.5 });
    expect(r.perMm).to.be.closeTo(50, 1e-9); // 250 / 5 mm (hand-computed)
    expect(r.meanInterceptUm).to.be.closeTo(20, 1e-9); // 1 / P_L
    expect(r.g).to.be.closeTo(8, 0.001); // ASTM E112 anchor G 8 → 20.0 µm (TRADE primer [C], |ΔG| ≤ 0.001 for the printed constants)
    expect(r.gIso).to.be.closeTo(8 - 0.0458, 0.001); // ISO 643: G_ISO = G_ASTM + log2(15.5/16) (TRADE primer [C])
    expect(r).to.include({ confirmedMarks: 49 * 5, suggestedMarks: 3, direction: 'along', twinsExcluded: true });
    expect(r.statements.join(' ')).to.match(/twin boundaries were excluded/).and.match(/3 suggested marks are not counted/);
    expect(res.body.pixelSize).to.deep.equal({ umPerPx: 0.5, source: 'user' });
    expect(res.body.testLines.map((t: { lengthPx: number }) => t.lengthPx)).to.deep.equal([2000, 2000, 2000, 2000, 2000]);
    expect(res.body).to.include({ version: 1, whereLabel: 'whole image', stale: null });
    const [event] = await sql<{ action: string; summary: string }>('SELECT action, summary FROM activity_events WHERE image_id = $1', [s.imageId]);
    expect(event).to.deep.equal({ action: 'measurement.created', summary: 'measured grain size by intercepts on whole image: l̄ 20.0 µm, G 8.0' });
  });

  it('when a client sends a result of its own, then 422: results are never taken from the client', async () => {
    const s = await measureScene(app.url);
    const res = await s.researcher.post(measurementsPath(s, s.imageId), { kind: 'intercept', pattern: fiveLines, result: { meanInterceptUm: 1 } });
    expectStatus(res, 422);
    expect(res.body.error.details.map((d: { message: string }) => d.message).join(' ')).to.contain('result');
  });

  it('when one circle of 500 µm carries 36 crossings and 2 triple points, then P = 40 with triple points 2, and 39 with 1½ when configured', async () => {
    const s = await measureScene(app.url);
    const centre: [number, number] = [1000, 750];
    const marks = [...marksOnCircle(0, centre, 500, 36), ...marksOnCircle(0, centre, 500, 2, 'triple_point', 0.05)];
    const circle = { type: 'circle', diameterUm: 500 } as const;
    const res = await s.researcher.post(measurementsPath(s, s.imageId), { kind: 'intercept', pattern: circle, marks });
    expectStatus(res, 201);
    const r = res.body.result;
    // L = π·500 µm = 1570.796 µm; P = 36 + 2·2 = 40 (circle rule, TRADE primer); l̄ = L / P = 39.270 µm (hand-computed).
    expect(r.lineLengthUm).to.be.closeTo(Math.PI * 500, 1e-6);
    expect(r.rules).to.deep.equal({ count: 'intersections', triplePoint: 2 });
    expect(r.count).to.equal(40);
    expect(r.perMm).to.be.closeTo(25.4648, 1e-4);
    expect(r.meanInterceptUm).to.be.closeTo(39.2699, 1e-4);
    expect(r.g).to.be.closeTo(g112(39.2699), 1e-4); // E112 lineal relation = 6.053 (hand-computed)
    expect(r.g).to.be.closeTo(6.053, 0.001);
    expect(r.direction).to.equal('all');

    const configured = await s.researcher.post(measurementsPath(s, s.imageId), { kind: 'intercept', pattern: circle, marks, rules: { count: 'intersections', triplePoint: 1.5 } });
    expectStatus(configured, 201);
    expect(configured.body.result.count).to.equal(39);
    expect(configured.body.result.meanInterceptUm).to.be.closeTo(40.2768, 1e-4); // π·500 / 39 (hand-computed)
    expect(configured.body.result.statements[0]).to.contain('a triple point counts 1.5');
  });

  it('when three circles (600, 400, 200 µm) carry 60 crossings, then L = π·1200 µm and l̄ = 20π µm', async () => {
    const s = await measureScene(app.url);
    const c: [number, number] = [1000, 750];
    const marks = [...marksOnCircle(0, c, 600, 30), ...marksOnCircle(1, c, 400, 20), ...marksOnCircle(2, c, 200, 10)];
    const res = await s.researcher.post(measurementsPath(s, s.imageId), { kind: 'intercept', pattern: { type: 'three_circles', largestDiameterUm: 600 }, marks });
    expectStatus(res, 201);
    // Diameters 3 : 2 : 1 (E112 three-circle pattern); L = π(600 + 400 + 200) µm; l̄ = L / 60 = 62.832 µm; G = 4.697 (hand-computed).
    expect(res.body.result.lineLengthUm).to.be.closeTo(Math.PI * 1200, 1e-6);
    expect(res.body.result.meanInterceptUm).to.be.closeTo(20 * Math.PI, 1e-6);
    expect(res.body.result.g).to.be.closeTo(4.697, 0.001);
  });

  it('when lines run both ways, then l̄ along and across and the anisotropy index l̄∥/l̄⊥ follow the interfaces (or image x when none are drawn)', async () => {
    const s = await measureScene(app.url);
    // Three lines each way, 200 µm apart: horizontal y = 350, 750, 1150 (1000 µm each), vertical x = 600, 1000, 1400 (750 µm each) (hand-computed).
    const both = { type: 'lines', direction: 'both', spacingUm: 200, count: 3 } as const;
    const marks = [
      ...[350, 750, 1150].flatMap((y, i) => crossingsAlongRow(i, y, 0, 2000, 30)),
      ...[600, 1000, 1400].flatMap((x, i) => crossingsAlongColumn(3 + i, x, 0, 1500, 45)),
    ];
    const plain = await s.researcher.post(measurementsPath(s, s.imageId), { kind: 'intercept', pattern: both, marks });
    expectStatus(plain, 201);
    const r = plain.body.result;
    // Along (horizontal, no interfaces): 3000 µm / 90 = 33.33 µm; across: 2250 µm / 135 = 16.67 µm; AI = 2.0; pooled 5250 / 225 = 23.33 µm (hand-computed).
    expect(r.byDirection.along.meanInterceptUm).to.be.closeTo(100 / 3, 1e-9);
    expect(r.byDirection.across.meanInterceptUm).to.be.closeTo(50 / 3, 1e-9);
    expect(r.byDirection.anisotropyIndex).to.be.closeTo(2, 1e-9);
    expect(r.meanInterceptUm).to.be.closeTo(70 / 3, 1e-9);
    expect(r.g).to.be.closeTo(g112(70 / 3), 1e-9);
    expect(r.statements.join(' ')).to.contain('image x axis');

    // Vertical bond interfaces turn "along" to the vertical lines: AI becomes 0.5.
    const other = await measureScene(app.url);
    await draw(other, other.imageId, 'Bond interface', 'polyline', [[300, 0], [300, 1500]]);
    await draw(other, other.imageId, 'Bond interface', 'polyline', [[1700, 0], [1700, 1500]]);
    const crossed = await other.researcher.post(measurementsPath(other, other.imageId), { kind: 'intercept', pattern: both, marks });
    expectStatus(crossed, 201);
    expect(crossed.body.result.byDirection.along.meanInterceptUm).to.be.closeTo(50 / 3, 1e-9);
    expect(crossed.body.result.byDirection.anisotropyIndex).to.be.closeTo(0.5, 1e-9);
    expect(crossed.body.result.statements.join(' ')).to.contain('follows the bond interfaces');
  });

  it('when a two-phase field counts N = 100 intercepts of α with V_V = 0.4, then l̄α = V_V·L / N = 20 µm and G = 8.0', async () => {
    const s = await measureScene(app.url);
    // Per line 19 intercepts + 2 line ends inside a grain (½ each, intercept count) = 20; five lines → N = 100 (hand-computed).
    const marks = rows.flatMap((y, line) => [
      ...crossingsAlongRow(line, y, 100, 1900, 19),
      { x: 0, y, line, kind: 'line_end' as const, status: 'confirmed' as const },
      { x: 2000, y, line, kind: 'line_end' as const, status: 'confirmed' as const },
    ]);
    const res = await s.researcher.post(measurementsPath(s, s.imageId), {
      kind: 'intercept', pattern: fiveLines, marks, rules: { count: 'intercepts', triplePoint: 1.5 }, phase: { name: 'austenite', volumeFraction: 0.4 }, twinsExcluded: false,
    });
    expectStatus(res, 201);
    const r = res.body.result;
    expect(r.countSymbol).to.equal('N');
    expect(r.count).to.equal(100);
    expect(r.meanInterceptUm).to.be.closeTo(20, 1e-9); // 0.4 · 5000 µm / 100 (E112 two-phase relation, TRADE primer)
    expect(r.g).to.be.closeTo(8, 0.001); // E112 anchor
    expect(r.statements.join(' ')).to.contain('counted as boundaries').and.contain('V_V = 0.4');
  });

  it('when nothing is confirmed yet, then the field is saved with its line length and no l̄ or G', async () => {
    const s = await measureScene(app.url);
    const suggested = crossingsAlongRow(0, 350, 0, 2000, 10).map((m) => ({ ...m, status: 'suggested' as const }));
    const res = await s.researcher.post(measurementsPath(s, s.imageId), { kind: 'intercept', pattern: fiveLines, marks: suggested });
    expectStatus(res, 201);
    expect(res.body.result).to.include({ count: 0, perMm: null, meanInterceptUm: null, g: null, suggestedMarks: 10 });
  });

  it('when a researcher confirms marks with the version they loaded, then the result follows and the old one is in the history', async () => {
    const s = await measureScene(app.url);
    const marks = crossingsAlongRow(0, 350, 0, 2000, 50).map((m) => ({ ...m, status: 'suggested' as const }));
    const created = (await s.researcher.post(measurementsPath(s, s.imageId), { kind: 'intercept', pattern: fiveLines, marks })).body;
    const confirmed = marks.map((m) => ({ ...m, status: 'confirmed' }));
    const res = await s.lead.patch(`${measurementsPath(s, s.imageId)}/${created.id}`, { version: 1, marks: confirmed, note: 'checked' });
    expectStatus(res, 200);
    expect(res.body.version).to.equal(2);
    expect(res.body.result.count).to.equal(50);
    expect(res.body.result.meanInterceptUm).to.be.closeTo(100, 1e-9); // 5000 µm / 50 (hand-computed)
    const detail = (await s.guest.get(`${measurementsPath(s, s.imageId)}/${created.id}`)).body;
    expect(detail.definition.note).to.equal('checked');
    expect(detail.history).to.have.length(1);
    expect(detail.history[0]).to.include({ version: 1, reason: 'edited' });
    expect(detail.history[0].result.count).to.equal(0);
  });
});
