import { expect } from 'chai';
import { mountApp } from '../../support/api-client';
import { sql } from '../db-state';
import { draw, expectStatus, measureScene, measurementsPath, measurementState, type MeasureScene } from './measurement-fixtures';

/**
 * Sub-bands by distance from the interfaces, two-phase results from a saved point count, and results that
 * say so when the interfaces, region or point count they used change afterwards.
 *
 * Scene (all hand-computed): a 2000 × 1500 px image at 0.5 µm/px, one bond interface straight across at
 * y = 750, a rectangle region x 150–1850, y 560–940. Three vertical lines 200 µm (400 px) apart, centred:
 * x = 600, 1000, 1400; each crosses the region over 380 px (190 µm), 190 px (95 µm) each side of the interface.
 */
describe('measurements: sub-bands by distance, V_V from a point count, stale after the shapes change', () => {
  let app: Awaited<ReturnType<typeof mountApp>>;
  before(async () => (app = await mountApp()));
  after(() => app.close());

  const vertical = { type: 'lines', direction: 'vertical', spacingUm: 200, count: 3 } as const;
  const bins = [0, 25, 50, 75];
  // On the middle line (x = 1000): 10 px (5 µm) from the interface, 50 px (25 µm, on an edge: the farther sub-band),
  // 130 px (65 µm) and 130 px on the other side (65 µm).
  const marks = [760, 700, 880, 620].map((y) => ({ x: 1000, y, line: 1, kind: 'crossing' as const, status: 'confirmed' as const }));

  async function scene(): Promise<{ s: MeasureScene; interfaceId: string; zone: string }> {
    const s = await measureScene(app.url, { width: 2000, height: 1500 }, 0.5);
    const interfaceId = await draw(s, s.imageId, 'Bond interface', 'polyline', [[0, 750], [2000, 750]]);
    const zone = await draw(s, s.imageId, 'Deformation zone', 'rectangle', [[150, 560], [1850, 560], [1850, 940], [150, 940]], 'near bond');
    return { s, interfaceId, zone };
  }

  it('when intercepts are counted in an outlined region with sub-bands 0-25-50-75 µm, then each sub-band has its own line length, count and l̄, and the summary has a row per sub-band', async () => {
    const { s, zone } = await scene();
    const res = await s.researcher.post(measurementsPath(s, s.imageId), { kind: 'intercept', pattern: vertical, where: { type: 'region', annotationId: zone }, marks, distanceBinsUm: bins });
    expectStatus(res, 201);
    const r = res.body.result;
    expect(res.body.whereLabel).to.equal('region “near bond”');
    // Whole field: 3 × 380 px × 0.5 = 570 µm, P = 4, l̄ = 142.5 µm (hand-computed: l̄ = L / P, ASTM E112 lineal intercept).
    expect(r.lineLengthUm).to.be.closeTo(570, 1e-6);
    expect(r.count).to.equal(4);
    // Each sub-band: 3 lines × 2 sides × 50 px × 0.5 = 150 µm; counts 1, 1, 2 (hand-computed from the mark distances above).
    expect(r.bins.map((b: { minUm: number; maxUm: number }) => [b.minUm, b.maxUm])).to.deep.equal([[0, 25], [25, 50], [50, 75]]);
    for (const b of r.bins) expect(b.lineLengthUm).to.be.closeTo(150, 0.01);
    expect(r.bins.map((b: { count: number }) => b.count)).to.deep.equal([1, 1, 2]);
    expect(r.bins[0].meanInterceptUm).to.be.closeTo(150, 0.01);
    expect(r.bins[2].meanInterceptUm).to.be.closeTo(75, 0.01);
    // P_L = P / L = 2 / 0.150 mm = 13.33 mm⁻¹ (hand-computed).
    expect(r.bins[2].perMm).to.be.closeTo(2 / 0.15, 0.001);

    const summary = (await s.guest.get(`/api/projects/${s.projectId}/specimens/${s.specimenId}/measurements/summary`)).body;
    const near = summary.intercepts.find((row: { where: string }) => row.where === 'region “near bond”, 50–75 µm from the nearest bond interface');
    expect(near, JSON.stringify(summary.intercepts.map((row: { where: string }) => row.where))).to.not.equal(undefined);
    expect(near).to.deep.include({ band: null, distanceUm: { min: 50, max: 75 }, direction: 'all', totalCount: 2 });
    expect(near.meanIntercept.mean).to.be.closeTo(75, 0.01);

    const csv = await s.guest.get(`/api/projects/${s.projectId}/specimens/${s.specimenId}/measurements.csv`);
    expectStatus(csv, 200);
    const lines = String(csv.body).split(/\r?\n/).filter((l) => l.includes('µm from the nearest bond interface'));
    expect(lines, 'one field-data row per sub-band').to.have.length(3);
    expect(lines[2]).to.contain('50–75 µm from the nearest bond interface');
  });

  it('when sub-bands are asked for on an image without bond interfaces, or their edges do not rise, then 422 and nothing is stored', async () => {
    const s = await measureScene(app.url, { width: 2000, height: 1500 }, 0.5);
    const before = await measurementState(s.imageId);
    const none = await s.researcher.post(measurementsPath(s, s.imageId), { kind: 'intercept', pattern: vertical, distanceBinsUm: bins });
    expectStatus(none, 422);
    expect(none.body.error.details[0].field).to.equal('body.distanceBinsUm');
    expect(none.body.error.details[0].message).to.contain('this image has none');
    const falling = await s.researcher.post(measurementsPath(s, s.imageId), { kind: 'intercept', pattern: vertical, distanceBinsUm: [0, 40, 20] });
    expectStatus(falling, 422);
    expect(falling.body.error.details[0].message).to.contain('farther from the interface than the one before');
    expect(await measurementState(s.imageId)).to.deep.equal(before);
  });

  it('when a two-phase count takes V_V from a saved point count of the same region, then l̄ = V_V·L / N names that count, and a count of another place is refused', async () => {
    const { s, zone } = await scene();
    // Grid 50 µm = 100 px centred on (1000, 750): x 200…1800 (17), y 650, 750, 850 (3) inside the region: P_T = 51 (hand-computed).
    const row = Array.from({ length: 17 }, (_, i) => ({ x: 200 + 100 * i, y: 650, hit: 'inside' as const }));
    const pc = await s.researcher.post(measurementsPath(s, s.imageId), { kind: 'point_count', grid: { spacingUm: 50 }, where: { type: 'region', annotationId: zone }, phaseName: 'ferrite', marks: row });
    expectStatus(pc, 201);
    expect(pc.body.result.gridPoints).to.equal(51);
    expect(pc.body.result.pointFraction).to.be.closeTo(1 / 3, 1e-12); // 17 / 51 (ASTM E562 P_p = P_i / P_T)

    const res = await s.researcher.post(measurementsPath(s, s.imageId), {
      kind: 'intercept', pattern: vertical, where: { type: 'region', annotationId: zone }, marks,
      rules: { count: 'intercepts', triplePoint: 1.5 }, phase: { name: 'ferrite', pointCountId: pc.body.id },
    });
    expectStatus(res, 201);
    // l̄α = V_V·L / N = (1/3)·570 µm / 4 = 47.5 µm (ASTM E112 two-phase note; hand-computed).
    expect(res.body.result.meanInterceptUm).to.be.closeTo(47.5, 1e-6);
    expect(res.body.result.phase).to.deep.include({ name: 'ferrite' });
    expect(res.body.result.phase.volumeFraction).to.be.closeTo(1 / 3, 1e-12);
    expect(res.body.result.phase.pointCount).to.deep.include({ id: pc.body.id, version: 1, phaseName: 'ferrite', whereLabel: 'region “near bond”' });
    expect(res.body.result.statements.join(' ')).to.contain('from the saved point count of “ferrite” on region “near bond” (version 1, P_p = 0.3333)');

    const elsewhere = await s.researcher.post(measurementsPath(s, s.imageId), {
      kind: 'intercept', pattern: vertical, marks: [], rules: { count: 'intercepts', triplePoint: 1.5 }, phase: { name: 'ferrite', pointCountId: pc.body.id },
    });
    expectStatus(elsewhere, 422);
    expect(elsewhere.body.error.details[0]).to.deep.equal({ field: 'body.phase.pointCountId', message: 'That point count was made on region “near bond”, not on whole image; choose a point count of the same place.' });

    // The point count changes: the two-phase result says so.
    const changed = await s.researcher.patch(`${measurementsPath(s, s.imageId)}/${pc.body.id}`, { version: 1, marks: row.slice(0, 10) });
    expectStatus(changed, 200);
    const stale = (await s.guest.get(`${measurementsPath(s, s.imageId)}/${res.body.id}`)).body.stale;
    expect(stale.changes).to.deep.equal(['The point count of “ferrite” that gave V_V was changed (version 1, now 2).']);
    const fresh = await s.researcher.post(`${measurementsPath(s, s.imageId)}/${res.body.id}/recompute`, { version: 1 });
    expectStatus(fresh, 200);
    // V_V = 10/51; l̄ = (10/51)·570 / 4 (hand-computed).
    expect(fresh.body.result.meanInterceptUm).to.be.closeTo(((10 / 51) * 570) / 4, 1e-6);
    expect(fresh.body.stale).to.equal(null);
  });

  it('when the bond interface a band measurement used is redrawn, then the measurement says which line changed, and recompute counts on the new band and keeps the old result in the history', async () => {
    const { s, interfaceId } = await scene();
    const res = await s.researcher.post(measurementsPath(s, s.imageId), { kind: 'intercept', pattern: vertical, where: { type: 'band', band: 1 }, marks: [{ x: 1000, y: 300, line: 1, kind: 'crossing' }] });
    expectStatus(res, 201);
    // Band 1 = y 0–750 on three lines: 3 × 750 px × 0.5 = 1125 µm (hand-computed).
    expect(res.body.result.lineLengthUm).to.be.closeTo(1125, 1e-6);
    const url = `${measurementsPath(s, s.imageId)}/${res.body.id}`;
    expect((await s.guest.get(url)).body.stale).to.equal(null);

    const moved = await s.researcher.patch(`/api/projects/${s.projectId}/images/${s.imageId}/annotations/${interfaceId}`, { version: 1, points: [[0, 550], [2000, 550]] });
    expectStatus(moved, 200);
    const detail = (await s.guest.get(url)).body;
    expect(detail.stale.changes).to.deep.equal(['Bond interface 1 was redrawn or changed (version 1, now 2).']);
    expect(detail.stale.measuredUmPerPx).to.equal(detail.stale.imageUmPerPx);
    expect(detail.stale.message).to.contain('Recompute');
    expect(detail.result.lineLengthUm).to.be.closeTo(1125, 1e-6); // untouched until someone recomputes
    const listed = (await s.guest.get(measurementsPath(s, s.imageId))).body;
    expect(listed[0].stale.changes).to.have.length(1);
    const summary = (await s.guest.get(`/api/projects/${s.projectId}/specimens/${s.specimenId}/measurements/summary`)).body;
    expect(summary.intercepts[0].staleFields).to.equal(1);
    const csv = String((await s.guest.get(`/api/projects/${s.projectId}/specimens/${s.specimenId}/measurements.csv`)).body).split(/\r?\n/);
    // Columns …, Pixel size (µm/px), Pixel size source, Stale, … (the pixel size itself did not change).
    expect(csv[0]).to.contain('Pixel size (µm/px),Pixel size source,Stale,');
    expect(csv[1], 'the field data CSV marks the row stale').to.contain(',0.5,user,yes,');

    const fresh = await s.researcher.post(`${url}/recompute`, { version: 1 });
    expectStatus(fresh, 200);
    // Band 1 is now y 0–550: 3 × 550 px × 0.5 = 825 µm (hand-computed); the mark at y = 300 still counts.
    expect(fresh.body.result.lineLengthUm).to.be.closeTo(825, 1e-6);
    expect(fresh.body.result.count).to.equal(1);
    expect(fresh.body).to.deep.include({ version: 2, stale: null });
    const history = (await s.guest.get(url)).body.history;
    expect(history).to.have.length(1);
    expect(history[0]).to.include({ version: 1, reason: 'recomputed' });
    expect(history[0].result.lineLengthUm).to.be.closeTo(1125, 1e-6);
    const [activity] = await sql<{ summary: string }>(`SELECT summary FROM activity_events WHERE image_id = $1 AND action = 'measurement.updated' ORDER BY seq DESC LIMIT 1`, [s.imageId]);
    expect(activity!.summary).to.contain('after 1 change to what it used');
  });

  it('when the phase has neither a volume fraction nor a point count, or names a measurement that is not a point count, then 422 and nothing is stored', async () => {
    const { s, zone } = await scene();
    const other = await s.researcher.post(measurementsPath(s, s.imageId), { kind: 'intercept', pattern: vertical, where: { type: 'region', annotationId: zone } });
    expectStatus(other, 201);
    const before = await measurementState(s.imageId);
    const intercepts = { count: 'intercepts', triplePoint: 1.5 };
    const bare = await s.researcher.post(measurementsPath(s, s.imageId), { kind: 'intercept', pattern: vertical, rules: intercepts, phase: { name: 'ferrite' } });
    expectStatus(bare, 422);
    expect(bare.body.error.details[0]).to.deep.equal({ field: 'body.phase.volumeFraction', message: 'Give the volume fraction of the phase, or choose a saved point count that measured it.' });
    const notCount = await s.researcher.post(measurementsPath(s, s.imageId), {
      kind: 'intercept', pattern: vertical, where: { type: 'region', annotationId: zone }, rules: intercepts, phase: { name: 'ferrite', pointCountId: other.body.id },
    });
    expectStatus(notCount, 422);
    expect(notCount.body.error.details[0].field).to.equal('body.phase.pointCountId');
    expect(notCount.body.error.details[0].message).to.contain('No saved point count with this id on this image');
    expect(await measurementState(s.imageId)).to.deep.equal(before);
  });

  it('when a new bond interface is drawn or the region outline is deleted, then the measurement names the change; a deleted region cannot be recomputed', async () => {
    const { s, zone } = await scene();
    const band = await s.researcher.post(measurementsPath(s, s.imageId), { kind: 'intercept', pattern: vertical, where: { type: 'band', band: 2 } });
    const region = await s.researcher.post(measurementsPath(s, s.imageId), { kind: 'intercept', pattern: vertical, where: { type: 'region', annotationId: zone } });
    const whole = await s.researcher.post(measurementsPath(s, s.imageId), { kind: 'intercept', pattern: vertical });
    for (const r of [band, region, whole]) expectStatus(r, 201);

    await draw(s, s.imageId, 'Bond interface', 'polyline', [[0, 1200], [2000, 1200]]);
    const del = await s.researcher.delete(`/api/projects/${s.projectId}/images/${s.imageId}/annotations/${zone}?version=1`);
    expectStatus(del, 204);
    const list = (await s.guest.get(measurementsPath(s, s.imageId))).body as { id: string; stale: { changes: string[] } | null }[];
    const of = (id: string) => list.find((m) => m.id === id)!.stale;
    expect(of(band.body.id)!.changes).to.deep.equal(['A bond interface was drawn since, so the bands have moved.']);
    expect(of(region.body.id)!.changes).to.deep.equal(['The region outline “near bond” was deleted.']);
    expect(of(whole.body.id), 'a whole-image count does not depend on where the lines lie').to.equal(null);

    const before = await measurementState(s.imageId);
    const refused = await s.researcher.post(`${measurementsPath(s, s.imageId)}/${region.body.id}/recompute`, { version: 1 });
    expectStatus(refused, 422);
    expect(refused.body.error.message).to.contain('No annotation with this id on this image');
    expect(await measurementState(s.imageId)).to.deep.equal(before);
  });
});
