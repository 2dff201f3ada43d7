import { expect } from 'chai';
import { mountApp } from '../../support/api-client';
import { zipEntries } from '../../support/zip-entries';
import { crossingsAlongRow, draw, measureScene, measurementsPath } from '../measurements/measurement-fixtures';

describe('exports: supplementary data', () => {
  let app: Awaited<ReturnType<typeof mountApp>>;
  before(async () => (app = await mountApp()));
  after(() => app.close());

  async function download(path: string, headers: Record<string, string>) {
    const res = await fetch(app.url + path, { headers });
    return { status: res.status, type: res.headers.get('content-type') ?? '', name: res.headers.get('content-disposition') ?? '', bytes: Buffer.from(await res.arrayBuffer()) };
  }

  it('when a reviewer exports the project, then one ZIP holds catalogue, images, annotations as GeoJSON, measurements, comments and history', async () => {
    const s = await measureScene(app.url);
    await draw(s, s.imageId, 'Bond interface', 'polyline', [[0, 700], [2000, 720]]);
    const marks = crossingsAlongRow(0, 750, 0, 2000, 40);
    const saved = await s.researcher.post(measurementsPath(s, s.imageId), { kind: 'intercept', pattern: { type: 'lines', direction: 'horizontal', spacingUm: 100, count: 1 }, marks });
    expect(saved.status).to.equal(201);
    const out = await download(`/api/projects/${s.projectId}/export.zip`, await s.reviewer.authHeaders());
    expect(out.status).to.equal(200);
    expect(out.type).to.contain('application/zip');
    expect(out.name).to.match(/supplementary-data-\d{4}-\d{2}-\d{2}\.zip/);
    const entries = zipEntries(out.bytes);
    expect([...entries.keys()]).to.include.members(['catalogue.json', 'images.csv', `annotations/${s.imageId}.geojson`, 'measurements.csv', 'comments.json', 'history.csv', 'README.txt']);
    const geojson = JSON.parse(entries.get(`annotations/${s.imageId}.geojson`)!.toString());
    expect(geojson.features[0].geometry).to.deep.equal({ type: 'LineString', coordinates: [[0, 700], [2000, 720]] });
    const measurements = entries.get('measurements.csv')!.toString();
    // 40 crossings on one 2000 px line at 0.5 µm/px: L = 1000 µm, P_L = 40 mm⁻¹, l̄ = 25 µm (hand-computed).
    expect(measurements).to.contain('Mean intercept l̄ (µm)');
    expect(measurements).to.match(/,1000,40,40,25,/);
    expect(entries.get('images.csv')!.toString()).to.contain('pixel_size (µm/px)');
    expect(entries.get('history.csv')!.toString()).to.contain('measurement.created');
    expect(entries.get('README.txt')!.toString()).to.contain('do not certify material');
  });

  it('when someone outside the project asks for its export, then 404 and no file', async () => {
    const s = await measureScene(app.url);
    const other = await measureScene(app.url);
    const out = await download(`/api/projects/${s.projectId}/export.zip`, await other.researcher.authHeaders());
    expect(out.status).to.equal(404);
    expect(out.type).to.contain('json');
  });
});
