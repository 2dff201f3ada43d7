import { expect } from 'chai';
import { mountApp } from '../../support/api-client';
import { sql } from '../db-state';
import { crossingsAlongRow, expectStatus, measureScene, measurementsPath, measurementState, type MeasureScene } from './measurement-fixtures';

describe('measurements: a changed pixel size makes a result stale; recompute keeps the old one', () => {
  let app: Awaited<ReturnType<typeof mountApp>>;
  before(async () => (app = await mountApp()));
  after(() => app.close());

  // 2000 px lines at 0.25 µm/px: 500 µm each; 5 lines of 50 crossings → L = 2500 µm, P = 250, l̄ = 10.0 µm (G 10 anchor, E112) (hand-computed).
  const fiveLines = { type: 'lines', direction: 'horizontal', spacingUm: 50, count: 5 } as const;
  async function measured(): Promise<{ s: MeasureScene; id: string; url: string }> {
    const s = await measureScene(app.url, { width: 2000, height: 1500 }, 0.25);
    // 50 µm = 200 px at 0.25 µm/px: rows y = 350 … 1150 (hand-computed).
    const marks = [350, 550, 750, 950, 1150].flatMap((y, line) => crossingsAlongRow(line, y, 0, 2000, 50));
    const res = await s.researcher.post(measurementsPath(s, s.imageId), { kind: 'intercept', pattern: fiveLines, marks });
    expectStatus(res, 201);
    expect(res.body.result.meanInterceptUm).to.be.closeTo(10, 1e-9);
    expect(res.body.result.g).to.be.closeTo(10, 0.001); // E112 anchor G 10 → 10.0 µm (TRADE primer [C])
    return { s, id: res.body.id, url: `${measurementsPath(s, s.imageId)}/${res.body.id}` };
  }

  it('when the image is recalibrated to 0.24 µm/px, then GET says the result is stale, and recompute scales L and l̄ by 0.24/0.25 and keeps the old result', async () => {
    const { s, url } = await measured();
    const patched = await s.researcher.patch(`/api/projects/${s.projectId}/images/${s.imageId}`, { pixelSizeUm: 0.24 });
    expectStatus(patched, 200);
    const stale = (await s.guest.get(url)).body;
    expect(stale.stale).to.deep.include({ measuredUmPerPx: 0.25, imageUmPerPx: 0.24 });
    expect(stale.stale.message).to.equal('Measured at 0.25 µm/px; the image now has 0.24 µm/px; recompute to update the result.');
    expect(stale.result.meanInterceptUm).to.be.closeTo(10, 1e-9); // untouched until someone recomputes

    const res = await s.researcher.post(`${url}/recompute`, { version: 1 });
    expectStatus(res, 200);
    // Same marks on the same pixels: L = 10 000 px × 0.24 = 2400 µm, P = 250, l̄ = 9.6 µm (hand-computed); G by the E112 relation = 10.118.
    expect(res.body.result.lineLengthUm).to.be.closeTo(2400, 1e-9);
    expect(res.body.result.count).to.equal(250);
    expect(res.body.result.meanInterceptUm).to.be.closeTo(9.6, 1e-9);
    expect(res.body.result.g).to.be.closeTo(-6.643856 * Math.log10(0.0096) - 3.288, 1e-9);
    expect(res.body).to.deep.include({ version: 2, stale: null, pixelSize: { umPerPx: 0.24, source: 'user' } });

    const detail = (await s.guest.get(url)).body;
    expect(detail.history).to.have.length(1);
    expect(detail.history[0]).to.include({ version: 1, reason: 'recomputed', umPerPx: 0.25 });
    expect(detail.history[0].result.meanInterceptUm).to.be.closeTo(10, 1e-9);
  });

  it('when someone tries to rewrite or erase the history in the database, then PostgreSQL refuses', async () => {
    const { s, url } = await measured();
    await s.researcher.patch(`/api/projects/${s.projectId}/images/${s.imageId}`, { pixelSizeUm: 0.3 });
    expectStatus(await s.researcher.post(`${url}/recompute`, { version: 1 }), 200);
    const before = await measurementState(s.imageId);
    let refused = '';
    try {
      await sql(`UPDATE measurement_history SET um_per_px = 1 WHERE image_id = $1`, [s.imageId]);
    } catch (err) {
      // The append-only trigger raises; that is the behaviour under test.
      refused = (err as Error).message;
    }
    expect(refused).to.contain('append-only');
    try {
      await sql(`DELETE FROM measurement_history WHERE image_id = $1`, [s.imageId]);
      refused = '';
    } catch (err) {
      refused = (err as Error).message;
    }
    expect(refused).to.contain('append-only');
    expect(await measurementState(s.imageId)).to.deep.equal(before);
  });

  it('when a measurement is deleted, then its last result stays in the history', async () => {
    const { s, id, url } = await measured();
    expectStatus(await s.researcher.delete(`${url}?version=1`), 204);
    const [row] = await sql<{ reason: string; version: number }>('SELECT reason, version FROM measurement_history WHERE measurement_id = $1', [id]);
    expect(row).to.deep.equal({ reason: 'deleted', version: 1 });
    expectStatus(await s.guest.get(url), 404);
  });

  it('when recompute is sent with a stale version, then 409 and nothing changes', async () => {
    const { s, url } = await measured();
    await s.researcher.patch(`/api/projects/${s.projectId}/images/${s.imageId}`, { pixelSizeUm: 0.24 });
    expectStatus(await s.lead.patch(url, { version: 1, note: 'first' }), 200);
    const before = await measurementState(s.imageId);
    const res = await s.researcher.post(`${url}/recompute`, { version: 1 });
    expectStatus(res, 409);
    expect(res.body.error.message).to.match(/changed this measurement after you loaded it \(you had version 1, it is now 2\)/);
    expect(await measurementState(s.imageId)).to.deep.equal(before);
  });

  it('when the image has lost its pixel size, then recompute answers 422 "calibrate the image first" and nothing changes', async () => {
    const { s, url } = await measured();
    await sql(`UPDATE images SET pixel_size_um = NULL, pixel_size_y_um = NULL, pixel_size_source = 'none' WHERE id = $1`, [s.imageId]);
    expect((await s.guest.get(url)).body.stale.message).to.contain('no pixel size');
    const before = await measurementState(s.imageId);
    const res = await s.researcher.post(`${url}/recompute`, { version: 1 });
    expectStatus(res, 422);
    expect(res.body.error.message).to.contain('calibrate the image first');
    expect(await measurementState(s.imageId)).to.deep.equal(before);
  });

  it('when nothing changed, then recompute answers the measurement as it is and writes no history', async () => {
    const { s, url } = await measured();
    const res = await s.researcher.post(`${url}/recompute`, { version: 1 });
    expectStatus(res, 200);
    expect(res.body.version).to.equal(1);
    expect((await s.guest.get(url)).body.history).to.deep.equal([]);
  });

  it('when a cleared image gets a recomputed measurement, then its review goes back to draft in the same change', async () => {
    const { s, url } = await measured();
    await s.researcher.patch(`/api/projects/${s.projectId}/images/${s.imageId}`, { pixelSizeUm: 0.24 });
    await sql(
      `INSERT INTO review_states (subject_type, subject_id, project_id, image_id, state, submitted_by, submitted_at, updated_by)
       VALUES ('image', $1, $2, $1, 'cleared', $3, now(), $3)
       ON CONFLICT (subject_type, subject_id) DO UPDATE SET state = 'cleared'`,
      [s.imageId, s.projectId, s.researcherUser.id],
    );
    expectStatus(await s.researcher.post(`${url}/recompute`, { version: 1 }), 200);
    const [review] = await sql<{ state: string }>(`SELECT state FROM review_states WHERE subject_type = 'image' AND subject_id = $1`, [s.imageId]);
    expect(review!.state).to.equal('draft');
  });
});
