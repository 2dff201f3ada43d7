import { expect } from 'chai';
import { mountApp } from '../../support/api-client';
import { makeImageRow } from '../../support/catalogue-fixtures';
import { sql } from '../db-state';
import { expectApiError } from '../error-shape';
import { crossingsAlongRow, draw, expectStatus, measureScene, measurementsPath, measurementState, type MeasureScene } from './measurement-fixtures';

describe('measurements: every bad input gets its own answer and nothing changes', () => {
  let app: Awaited<ReturnType<typeof mountApp>>;
  let s: MeasureScene;
  let zone: string;
  let interfaceId: string;
  before(async () => {
    app = await mountApp();
    s = await measureScene(app.url);
    // Interfaces at y = 500 and y = 1000 + 0.1·x: bands 1-3; a small outline between the pattern's lines.
    interfaceId = await draw(s, s.imageId, 'Bond interface', 'polyline', [[0, 500], [2000, 500]]);
    await draw(s, s.imageId, 'Bond interface', 'polyline', [[0, 1000], [2000, 1200]]);
    zone = await draw(s, s.imageId, 'Deformation zone', 'rectangle', [[100, 400], [300, 400], [300, 500], [100, 500]], 'small zone');
  });
  after(() => app.close());

  const lines = { type: 'lines', direction: 'horizontal', spacingUm: 100, count: 5 } as const; // rows y = 350 … 1150
  const oneLine = { type: 'lines', direction: 'horizontal', spacingUm: 100, count: 1 } as const; // row y = 750

  const CASES: [string, () => Record<string, unknown>, string, string][] = [
    ['a pattern that misses the region', () => ({ kind: 'intercept', pattern: lines, where: { type: 'region', annotationId: zone } }), 'body.pattern', 'The pattern misses region “small zone”: no test line lies in it (0 µm of line)'],
    ['a pattern that misses the band', () => ({ kind: 'intercept', pattern: oneLine, where: { type: 'band', band: 1 } }), 'body.pattern', 'The pattern misses band 1'],
    ['a band that does not exist', () => ({ kind: 'intercept', pattern: lines, where: { type: 'band', band: 4 } }), 'body.where.band', 'Band 4 does not exist: this image has 2 bond interfaces, so bands 1–3.'],
    ['an unknown annotation id', () => ({ kind: 'intercept', pattern: lines, where: { type: 'region', annotationId: crypto.randomUUID() } }), 'body.where.annotationId', 'No annotation with this id on this image'],
    ['a line annotation as region', () => ({ kind: 'intercept', pattern: lines, where: { type: 'region', annotationId: interfaceId } }), 'body.where.annotationId', 'That annotation is a polyline; a region must be an outline'],
    ['a mark outside the image', () => ({ kind: 'intercept', pattern: lines, marks: [{ x: 2500, y: 350, line: 0, kind: 'crossing' }] }), 'body.marks.0', 'Mark 1 at (2500, 350) lies outside the image (2000 × 1500 px).'],
    ['a mark on a line the pattern does not have', () => ({ kind: 'intercept', pattern: lines, marks: [{ x: 100, y: 350, line: 7, kind: 'crossing' }] }), 'body.marks.0.line', 'the pattern has lines 0–4'],
    ['a mark away from its line', () => ({ kind: 'intercept', pattern: lines, marks: [{ x: 100, y: 380, line: 0, kind: 'crossing' }] }), 'body.marks.0', 'lies 30 px from test line 0; place it on the line'],
    ['a line end on a circle', () => ({ kind: 'intercept', pattern: { type: 'circle', diameterUm: 500 }, marks: [{ x: 1500, y: 750, line: 0, kind: 'line_end' }] }), 'body.marks.0.kind', 'circles have no ends'],
    ['a two-phase count of intersections', () => ({ kind: 'intercept', pattern: lines, rules: { count: 'intersections', triplePoint: 1.5 }, phase: { name: 'ferrite', volumeFraction: 0.3 } }), 'body.rules.count', 'counts intercepts (N) of its phase'],
    ['a volume fraction above 1', () => ({ kind: 'intercept', pattern: lines, phase: { name: 'ferrite', volumeFraction: 1.3 } }), 'body.phase.volumeFraction', 'A volume fraction is at most 1.'],
    ['a pattern without lines', () => ({ kind: 'intercept', pattern: { ...lines, count: 0 } }), 'body.pattern.count', 'Lay at least one line.'],
    ['a sub-band that ends before it starts', () => ({ kind: 'intercept', pattern: lines, where: { type: 'band', band: 2, distanceUm: { min: 30, max: 20 } } }), 'body.where.distanceUm.max', 'farther from the interface than it starts'],
    ['an unknown kind', () => ({ kind: 'area', pattern: lines }), 'body.kind', 'Choose a kind'],
    ['a grid point marked twice', () => ({ kind: 'point_count', grid: { spacingUm: 100 }, phaseName: 'oxide', marks: [{ x: 1000, y: 750, hit: 'inside' }, { x: 1001, y: 750, hit: 'boundary' }] }), 'body.marks.1', 'marks the same grid point as mark 1'],
    ['a point mark off the grid', () => ({ kind: 'point_count', grid: { spacingUm: 100 }, phaseName: 'oxide', marks: [{ x: 1100, y: 750, hit: 'inside' }] }), 'body.marks.0', 'is not on a grid point'],
    ['a grid too coarse for the region', () => ({ kind: 'point_count', grid: { spacingUm: 400 }, phaseName: 'oxide', where: { type: 'region', annotationId: zone } }), 'body.grid', 'No grid point lies in region “small zone”'],
    ['thickness of a band at the image edge', () => ({ kind: 'thickness', where: { type: 'band', band: 1 }, spacingUm: 20 }), 'body.where.band', 'thickness needs a band between two bond interfaces (band 2)'],
  ];

  for (const [title, body, field, text] of CASES) {
    it(`when a measurement has ${title}, then 422 naming ${field} and nothing is stored`, async () => {
      const before = await measurementState(s.imageId);
      const res = await s.researcher.post(measurementsPath(s, s.imageId), body());
      const error = expectApiError(res, 422, 'validation_failed');
      expect(error.details!.map((d) => d.field)).to.include(field);
      expect(error.details!.map((d) => d.message).join(' | ')).to.contain(text);
      expect(await measurementState(s.imageId)).to.deep.equal(before);
    });
  }

  it('when the image has no pixel size, then measuring and suggesting answer 422 "calibrate the image first"', async () => {
    const bare = await makeImageRow(s.projectId, s.researcherUser, { width: 2000, height: 1500 }, null);
    for (const res of [await s.researcher.post(measurementsPath(s, bare), { kind: 'intercept', pattern: lines }), await s.researcher.post(`${measurementsPath(s, bare)}/suggest`, { pattern: lines })]) {
      expect(expectApiError(res, 422, 'validation_failed').message).to.contain('calibrate the image first');
    }
    expect(await measurementState(bare)).to.deep.equal({ rows: [], history: [], activity: [] });
  });

  it('when the image is not in the project or an id is malformed, then 404 or 422', async () => {
    expectApiError(await s.researcher.post(measurementsPath(s, crypto.randomUUID()), { kind: 'intercept', pattern: lines }), 404, 'not_found');
    const bad = expectApiError(await s.researcher.get(`${measurementsPath(s, s.imageId)}/not-an-id`), 422, 'validation_failed');
    expect(bad.details![0]).to.deep.equal({ field: 'params.measurementId', message: 'Not a valid measurement id.' });
  });

  it('when an image has no bond interfaces, then a band is refused with how to draw them', async () => {
    const other = await makeImageRow(s.projectId, s.researcherUser);
    const res = await s.researcher.post(measurementsPath(s, other), { kind: 'intercept', pattern: lines, where: { type: 'band', band: 1 } });
    expect(expectApiError(res, 422, 'validation_failed').message).to.contain('This image has no bond interfaces; draw them with the “Bond interface” class');
  });

  describe('changes to a stored measurement', () => {
    let url: string;
    before(async () => {
      const created = await s.researcher.post(measurementsPath(s, s.imageId), { kind: 'intercept', pattern: lines, marks: crossingsAlongRow(0, 350, 0, 2000, 20) });
      expectStatus(created, 201);
      url = `${measurementsPath(s, s.imageId)}/${created.body.id}`;
      expectStatus(await s.researcher.patch(url, { version: 1, note: 'second' }), 200);
    });

    for (const [title, send, status, text] of [
      ['a stale version', { version: 1, note: 'late' }, 409, 'changed this measurement after you loaded it (you had version 1, it is now 2)'],
      ['no version', { note: 'x' }, 422, 'Send the version you loaded.'],
      ['nothing to change', { version: 2 }, 422, 'Send at least one field to change'],
      ['a field of another kind', { version: 2, grid: { spacingUm: 10 } }, 422, 'This intercept measurement has no field grid.'],
      ['a mark outside the image', { version: 2, marks: [{ x: -5, y: 350, line: 0, kind: 'crossing' }] }, 422, 'lies outside the image'],
      ['a band that does not exist', { version: 2, where: { type: 'band', band: 9 } }, 422, 'Band 9 does not exist'],
    ] as const) {
      it(`when a PATCH carries ${title}, then ${status} and the measurement is unchanged`, async () => {
        const before = await measurementState(s.imageId);
        const res = await s.lead.patch(url, send);
        expect(expectApiError(res, status, status === 409 ? 'conflict' : 'validation_failed').message + JSON.stringify(res.body)).to.contain(text);
        expect(await measurementState(s.imageId)).to.deep.equal(before);
      });
    }

    it('when a DELETE carries a stale version or none, then 409 or 422 and the measurement stays', async () => {
      const before = await measurementState(s.imageId);
      expectApiError(await s.lead.delete(`${url}?version=1`), 409, 'conflict');
      expectApiError(await s.lead.delete(url), 422, 'validation_failed');
      expect(await measurementState(s.imageId)).to.deep.equal(before);
    });
  });

  describe('suggestions', () => {
    it('when the image was made in a way with no default detector, then 422 asking to choose one', async () => {
      const sem = await makeImageRow(s.projectId, s.researcherUser);
      await sql(`UPDATE images SET modality = 'sem_secondary' WHERE id = $1`, [sem]);
      const res = await s.researcher.post(`${measurementsPath(s, sem)}/suggest`, { pattern: lines });
      const error = expectApiError(res, 422, 'validation_failed');
      expect(error.details![0]!.field).to.equal('body.detector');
      expect(error.message).to.contain('choose valleys (dark boundaries) or steps');
    });

    it('when the original file is missing from the store, then 409 saying so', async () => {
      const res = await s.researcher.post(`${measurementsPath(s, s.imageId)}/suggest`, { pattern: lines });
      expect(expectApiError(res, 409, 'image_not_ready').message).to.contain('original file of this image is missing');
    });

    it('when the detector is unknown, then 422 naming the choices', async () => {
      const res = await s.researcher.post(`${measurementsPath(s, s.imageId)}/suggest`, { pattern: lines, detector: 'edges' });
      expect(expectApiError(res, 422, 'validation_failed').details![0]!.message).to.contain('Choose valleys');
    });
  });
});
