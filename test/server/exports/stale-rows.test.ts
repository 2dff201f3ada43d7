import { expect } from 'chai';
import { mountApp } from '../../support/api-client';
import { zipEntries } from '../../support/zip-entries';
import { draw, expectStatus, measureScene, measurementsPath, type MeasureScene } from '../measurements/measurement-fixtures';

/**
 * Every table of field results says "stale" by the same test (pixel size, or the shapes and point count a
 * result used): the specimen's field-data CSV, the project ZIP's measurements.csv and the CSV behind a figure.
 *
 * Scene: a 2000 × 1500 px image row at 0.5 µm/px, one bond interface straight across at y = 750, one
 * intercept count in band 1 (above the interface). The pixel size never changes here, so only the redrawn
 * interface can make the row stale.
 */
describe('exports: the ZIP and figure CSVs mark a row stale when an interface it used is redrawn', () => {
  let app: Awaited<ReturnType<typeof mountApp>>;
  before(async () => (app = await mountApp()));
  after(() => app.close());

  async function scene(): Promise<{ s: MeasureScene; interfaceId: string; figureId: string }> {
    const s = await measureScene(app.url);
    const interfaceId = await draw(s, s.imageId, 'Bond interface', 'polyline', [[0, 750], [2000, 750]]);
    const saved = await s.researcher.post(measurementsPath(s, s.imageId), {
      kind: 'intercept', pattern: { type: 'lines', direction: 'vertical', spacingUm: 200, count: 3 }, where: { type: 'band', band: 1 }, marks: [{ x: 1000, y: 300, line: 1, kind: 'crossing' }],
    });
    expectStatus(saved, 201);
    const figure = await s.researcher.post(`/api/projects/${s.projectId}/figures`, { title: 'Band 1', columns: 1, panels: [{ imageId: s.imageId, region: { x: 0, y: 0, width: 2000, height: 1500 } }] });
    expectStatus(figure, 201);
    return { s, interfaceId, figureId: figure.body.id };
  }

  async function download(s: MeasureScene, path: string): Promise<Buffer> {
    const res = await fetch(app.url + path, { headers: await s.reviewer.authHeaders() });
    expect(res.status, path).to.equal(200);
    return Buffer.from(await res.arrayBuffer());
  }

  /** The cells of one CSV line (RFC 4180: quoted cells may hold commas and doubled quotes; no line breaks here). */
  const cells = (line: string) => [...line.matchAll(/(?:^|,)("(?:[^"]|"")*"|[^,]*)/g)].map((m) => m[1]!.replace(/^"|"$/g, '').replace(/""/g, '"'));
  /** The data rows of a field-data CSV (header, blank line and caution left out). */
  const dataRows = (text: string) => text.split('\r\n').slice(1).filter((l) => l !== '' && !l.startsWith('"Note:') && !l.startsWith('Note:')).map(cells);

  /** The Stale cell of every row of the three CSVs, read by the header's column names. */
  async function staleCells(s: MeasureScene, figureId: string): Promise<Record<string, string[]>> {
    const texts = {
      specimen: (await download(s, `/api/projects/${s.projectId}/specimens/${s.specimenId}/measurements.csv`)).toString(),
      zip: zipEntries(await download(s, `/api/projects/${s.projectId}/export.zip`)).get('measurements.csv')!.toString(),
      figure: (await download(s, `/api/projects/${s.projectId}/figures/${figureId}/measurements.csv`)).toString(),
    };
    return Object.fromEntries(
      Object.entries(texts).map(([where, text]) => {
        const header = cells(text.replace(/^\uFEFF/, '').split('\r\n')[0]!);
        const [pixel, stale] = [header.indexOf('Pixel size (µm/px)'), header.indexOf('Stale')];
        expect(stale, `${where}: a Stale column right after the pixel size and its source`).to.equal(pixel + 2);
        return [where, dataRows(text).map((row) => `${row[pixel]} ${row[stale]}`)];
      }),
    );
  }

  it('when nothing it used has changed, then all three CSVs say no; after the interface is redrawn, all three say yes at the same pixel size', async () => {
    const { s, interfaceId, figureId } = await scene();
    // One intercept field, one row (one direction, no sub-bands): pixel size 0.5 µm/px as measured.
    expect(await staleCells(s, figureId)).to.deep.equal({ specimen: ['0.5 no'], zip: ['0.5 no'], figure: ['0.5 no'] });

    const moved = await s.researcher.patch(`/api/projects/${s.projectId}/images/${s.imageId}/annotations/${interfaceId}`, { version: 1, points: [[0, 550], [2000, 550]] });
    expectStatus(moved, 200);
    expect(await staleCells(s, figureId)).to.deep.equal({ specimen: ['0.5 yes'], zip: ['0.5 yes'], figure: ['0.5 yes'] });
  });

  it('when the stale row is recomputed, then the ZIP and figure CSVs say no again', async () => {
    const { s, interfaceId, figureId } = await scene();
    expectStatus(await s.researcher.patch(`/api/projects/${s.projectId}/images/${s.imageId}/annotations/${interfaceId}`, { version: 1, points: [[0, 550], [2000, 550]] }), 200);
    const [row] = (await s.guest.get(measurementsPath(s, s.imageId))).body as { id: string }[];
    expectStatus(await s.researcher.post(`${measurementsPath(s, s.imageId)}/${row!.id}/recompute`, { version: 1 }), 200);
    expect(await staleCells(s, figureId)).to.deep.equal({ specimen: ['0.5 no'], zip: ['0.5 no'], figure: ['0.5 no'] });
  });
});
