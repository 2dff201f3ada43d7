import { randomBytes } from 'node:crypto';
import { expect } from 'chai';
import { mountApp } from '../../support/api-client';
import { zipEntries } from '../../support/zip-entries';
import { sql } from '../db-state';
import { crossingsAlongRow, draw, measureScene, measurementsPath, type MeasureScene } from '../measurements/measurement-fixtures';

/** Files the scene's image at a new location and adds a 1000 × 750 px image at 1.0 µm/px beside it; returns the new image's id. */
async function colocatedImage(s: MeasureScene): Promise<string> {
  const [loc] = await sql<{ id: string }>(`INSERT INTO specimen_locations (specimen_id, name) VALUES ($1, 'field ' || left(md5(random()::text), 6)) RETURNING id`, [s.specimenId]);
  await sql('UPDATE images SET location_id = $1 WHERE id = $2', [loc!.id, s.imageId]);
  const [other] = await sql<{ id: string }>(
    `INSERT INTO images (project_id, specimen_id, location_id, uploader_id, modality, original_name, sha256, byte_size, format, width, height, bit_depth, channels,
                         original_key, pixel_size_um, pixel_size_source, state, pyramid_levels)
     SELECT project_id, specimen_id, location_id, uploader_id, 'sem_secondary', 'field-sem.tif', $2, byte_size, format, 1000, 750, bit_depth, channels,
            original_key, 1.0, 'user', 'ready', 11 FROM images WHERE id = $1 RETURNING id`,
    [s.imageId, randomBytes(32).toString('hex')],
  );
  return other!.id;
}

describe('exports: supplementary data', () => {
  let app: Awaited<ReturnType<typeof mountApp>>;
  before(async () => (app = await mountApp()));
  after(() => app.close());

  async function download(path: string, headers: Record<string, string>) {
    const res = await fetch(app.url + path, { headers });
    return { status: res.status, type: res.headers.get('content-type') ?? '', name: res.headers.get('content-disposition') ?? '', bytes: Buffer.from(await res.arrayBuffer()) };
  }

  it('when a reviewer exports the project, then one ZIP holds catalogue, images, annotations as GeoJSON, alignments, measurements, comments and history', async () => {
    const s = await measureScene(app.url);
    await draw(s, s.imageId, 'Bond interface', 'polyline', [[0, 700], [2000, 720]]);
    const other = await colocatedImage(s);
    // Hand-computed: other (100,100) → image (300,400) and other (900,100) → image (1900,400): 800 px become 1600 px,
    // no turn, so image = 2·other + (100, 200).
    const pairs = [{ image: [300, 400], other: [100, 100] }, { image: [1900, 400], other: [900, 100] }];
    const aligned = await s.researcher.request('PUT', `/api/projects/${s.projectId}/images/${s.imageId}/alignments/${other}`, { pairs });
    expect(aligned.status, JSON.stringify(aligned.body)).to.equal(200);
    const marks = crossingsAlongRow(0, 750, 0, 2000, 40);
    const saved = await s.researcher.post(measurementsPath(s, s.imageId), { kind: 'intercept', pattern: { type: 'lines', direction: 'horizontal', spacingUm: 100, count: 1 }, marks });
    expect(saved.status).to.equal(201);
    const out = await download(`/api/projects/${s.projectId}/export.zip`, await s.reviewer.authHeaders());
    expect(out.status).to.equal(200);
    expect(out.type).to.contain('application/zip');
    expect(out.name).to.match(/supplementary-data-\d{4}-\d{2}-\d{2}\.zip/);
    const entries = zipEntries(out.bytes);
    expect([...entries.keys()]).to.include.members(['catalogue.json', 'images.csv', `annotations/${s.imageId}.geojson`, 'alignments.json', 'measurements.csv', 'comments.json', 'history.csv', 'README.txt']);
    const geojson = JSON.parse(entries.get(`annotations/${s.imageId}.geojson`)!.toString());
    expect(geojson.features[0].geometry).to.deep.equal({ type: 'LineString', coordinates: [[0, 700], [2000, 720]] });
    const measurements = entries.get('measurements.csv')!.toString();
    // 40 crossings on one 2000 px line at 0.5 µm/px: L = 1000 µm, P_L = 40 mm⁻¹, l̄ = 25 µm (hand-computed).
    expect(measurements).to.contain('Mean intercept l̄ (µm)');
    expect(measurements).to.match(/,1000,40,40,25,/);
    expect(entries.get('images.csv')!.toString()).to.contain('pixel_size (µm/px)');
    expect(entries.get('history.csv')!.toString()).to.contain('measurement.created');
    const alignments = JSON.parse(entries.get('alignments.json')!.toString());
    expect(alignments).to.have.length(1);
    const [a] = alignments;
    expect(a).to.deep.include({
      image: { id: s.imageId, name: 'fixture.tif' }, // the name makeImageRow gives
      otherImage: { id: other, name: 'field-sem.tif' },
      kind: 'similarity',
      pairs,
      savedBy: s.researcherUser.displayName,
    });
    // Hand-computed above: a = d = 2, b = c = 0, e = 100, f = 200; both pairs land exactly.
    for (const [k, v] of Object.entries({ a: 2, b: 0, c: 0, d: 2, e: 100, f: 200 })) expect(a.transform[k], k).to.be.closeTo(v, 1e-9);
    for (const r of a.residualsPx) expect(r).to.be.closeTo(0, 1e-9);
    const [stored] = await sql<{ saved_at: Date }>('SELECT saved_at FROM image_alignments WHERE image_id = $1', [s.imageId]);
    expect(a.savedAt).to.equal(stored!.saved_at.toISOString());
    const readme = entries.get('README.txt')!.toString();
    expect(readme).to.contain('alignments.json');
    expect(readme).to.contain('do not certify material');
  });

  it('when someone outside the project asks for its export, then 404 and no file', async () => {
    const s = await measureScene(app.url);
    const other = await measureScene(app.url);
    const out = await download(`/api/projects/${s.projectId}/export.zip`, await other.researcher.authHeaders());
    expect(out.status).to.equal(404);
    expect(out.type).to.contain('json');
  });
});
