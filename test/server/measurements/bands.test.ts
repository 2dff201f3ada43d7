import { expect } from 'chai';
import { mountApp } from '../../support/api-client';
import { crossingsAlongColumn, draw, expectStatus, measureScene, measurementsPath, type MeasureScene } from './measurement-fixtures';

describe('measurements: layer bands, sub-bands, regions and thickness', () => {
  let app: Awaited<ReturnType<typeof mountApp>>;
  before(async () => (app = await mountApp()));
  after(() => app.close());

  // Two bond interfaces on a 2000 × 1500 px image at 0.5 µm/px: a straight one at y = 500 and a slanted one y = 1000 + 0.1·x.
  async function laminate(): Promise<MeasureScene> {
    const s = await measureScene(app.url);
    await draw(s, s.imageId, 'Bond interface', 'polyline', [[0, 1000], [2000, 1200]]);
    await draw(s, s.imageId, 'Bond interface', 'polyline', [[0, 500], [2000, 500]]);
    return s;
  }
  // Five vertical lines 200 µm (400 px) apart, centred: x = 200, 600, 1000, 1400, 1800 (hand-computed).
  const vertical = { type: 'lines', direction: 'vertical', spacingUm: 200, count: 5 } as const;

  it('when vertical lines are clipped to band 2, then the line length is the analytic Σ(500 + 0.1·x) px', async () => {
    const s = await laminate();
    const res = await s.researcher.post(measurementsPath(s, s.imageId), { kind: 'intercept', pattern: vertical, where: { type: 'band', band: 2 } });
    expectStatus(res, 201);
    // Band 2 runs from y = 500 to y = 1000 + 0.1·x: 520 + 560 + 600 + 640 + 680 = 3000 px = 1500 µm (hand-computed).
    [520, 560, 600, 640, 680].forEach((v, i) => expect(res.body.testLines[i].lengthPx).to.be.closeTo(v, 1e-9));
    expect(res.body.result.lineLengthUm).to.be.closeTo(1500, 1e-6);
    expect(res.body.whereLabel).to.equal('band 2');
  });

  it('when a horizontal line crosses the slanted interface, then only its part inside band 2 counts', async () => {
    const s = await laminate();
    // One horizontal line at y = 750 + 350 = 1100 (offset): inside band 2 where 1100 ≤ 1000 + 0.1·x, i.e. x ≥ 1000 → 1000 px = 500 µm (hand-computed).
    const pattern = { type: 'lines', direction: 'horizontal', spacingUm: 100, count: 1 } as const;
    const res = await s.researcher.post(measurementsPath(s, s.imageId), { kind: 'intercept', pattern, placement: { offsetPx: [0, 350] }, where: { type: 'band', band: 2 } });
    expectStatus(res, 201);
    expect(res.body.result.lineLengthUm).to.be.closeTo(500, 1e-6);
    expect(res.body.testLines[0].pieces[0][0][0]).to.be.closeTo(1000, 1e-6);
  });

  it('when the band is narrowed to 0–20 µm from the nearest interface, then each line keeps 40 px + 40·√1.01 px', async () => {
    const s = await laminate();
    const res = await s.researcher.post(measurementsPath(s, s.imageId), { kind: 'intercept', pattern: vertical, where: { type: 'band', band: 2, distanceUm: { min: 0, max: 20 } } });
    expectStatus(res, 201);
    // 20 µm = 40 px. Below y = 500 a vertical line is within 40 px for 40 px; above the slanted line the perpendicular distance
    // is Δy/√1.01, so 40·√1.01 px of it. Five lines: 5·(40 + 40·√1.01)·0.5 µm = 200.499 µm (hand-computed).
    expect(res.body.result.lineLengthUm).to.be.closeTo(5 * (40 + 40 * Math.sqrt(1.01)) * 0.5, 1e-4);
    expect(res.body.whereLabel).to.equal('band 2, 0–20 µm from the nearest bond interface');
    for (const t of res.body.testLines) expect(t.pieces).to.have.length(2);
  });

  it('when a crossing lies on the counted part of band 2, then it counts; on the line outside the band, then 422', async () => {
    const s = await laminate();
    const inBand = crossingsAlongColumn(2, 1000, 520, 1080, 8); // line 2 is x = 1000, band 2 there is y 500-1100
    const ok = await s.researcher.post(measurementsPath(s, s.imageId), { kind: 'intercept', pattern: vertical, where: { type: 'band', band: 2 }, marks: inBand });
    expectStatus(ok, 201);
    // l̄ = 1500 µm / 8 = 187.5 µm (hand-computed).
    expect(ok.body.result.meanInterceptUm).to.be.closeTo(187.5, 1e-9);
    const outside = await s.researcher.post(measurementsPath(s, s.imageId), {
      kind: 'intercept', pattern: vertical, where: { type: 'band', band: 2 }, marks: [...inBand, { x: 1000, y: 300, line: 2, kind: 'crossing' }],
    });
    expectStatus(outside, 422);
    expect(outside.body.error.details[0]).to.deep.equal({ field: 'body.marks.8', message: 'Mark 9 at (1000, 300) lies on test line 2 but outside band 2; only the counted part of a line takes marks.' });
  });

  it('when lines and a circle are clipped to a rectangle region, then the lengths are the analytic ones', async () => {
    const s = await measureScene(app.url);
    const zone = await draw(s, s.imageId, 'Deformation zone', 'rectangle', [[500, 400], [1500, 400], [1500, 1100], [500, 1100]], 'brushed zone');
    const lines = await s.researcher.post(measurementsPath(s, s.imageId), {
      kind: 'intercept', pattern: { type: 'lines', direction: 'horizontal', spacingUm: 100, count: 5 }, where: { type: 'region', annotationId: zone },
    });
    expectStatus(lines, 201);
    // Lines at y = 550, 750, 950 cross the 1000 px wide zone; y = 350 and 1150 miss it: 3000 px = 1500 µm (hand-computed).
    expect(lines.body.result.lineLengthUm).to.be.closeTo(1500, 1e-9);
    expect(lines.body.whereLabel).to.equal('region “brushed zone”');
    const circle = await s.researcher.post(measurementsPath(s, s.imageId), { kind: 'intercept', pattern: { type: 'circle', diameterUm: 500 }, where: { type: 'region', annotationId: zone } });
    expectStatus(circle, 201);
    // r = 500 px about (1000, 750); the zone keeps |y − 750| ≤ 350, i.e. |sin θ| ≤ 0.7: arc = 4·r·asin(0.7) px (hand-computed).
    const arcUm = 4 * 500 * Math.asin(0.7) * 0.5;
    expect(circle.body.result.lineLengthUm).to.be.closeTo(arcUm, arcUm * 1e-4);
    expect(circle.body.testLines[0].pieces).to.have.length(2);
  });

  it('when the layer between two straight interfaces 400 px apart is measured, then its thickness is 200 µm everywhere', async () => {
    const s = await measureScene(app.url);
    await draw(s, s.imageId, 'Bond interface', 'polyline', [[0, 500], [2000, 500]]);
    await draw(s, s.imageId, 'Bond interface', 'polyline', [[0, 900], [1000, 900], [2000, 900]]);
    const res = await s.researcher.post(measurementsPath(s, s.imageId), { kind: 'thickness', where: { type: 'band', band: 2 }, spacingUm: 50 });
    expectStatus(res, 201);
    const r = res.body.result;
    // 400 px × 0.5 µm/px = 200 µm; samples every 50 µm along 1000 µm of interface, both ends: 21 (hand-computed).
    expect(r).to.include({ meanUm: 200, sUm: 0, minUm: 200, maxUm: 200, band: 2 });
    expect(r.samplesUm).to.have.length(21);
  });
});
