import { expect } from 'chai';
import { addDefaultAnnotationClasses } from '../../../server/annotations/default-classes';
import { Annotation } from '../../../server/annotations/annotation.entity';
import { mountApp, type ApiClient } from '../../support/api-client';
import { makeImageRow } from '../../support/catalogue-fixtures';
import { makeProject, makeUser, signedIn } from '../../support/fixtures';
import { runningServer } from '../../support/test-server';

describe('annotations: GeoJSON exchange', () => {
  let app: Awaited<ReturnType<typeof mountApp>>;
  let researcher: ApiClient;
  let projectId: string;
  let source: string;
  let target: string;
  let smallTarget: string;
  const repo = () => runningServer().ctx.dataSource.getRepository(Annotation);
  const path = (imageId: string) => `/api/projects/${projectId}/images/${imageId}/annotations`;
  const importTo = (imageId: string, fc: unknown) =>
    researcher.raw('POST', `${path(imageId)}.geojson`, JSON.stringify(fc), { 'content-type': 'application/geo+json' });

  before(async () => {
    app = await mountApp();
    const r = await makeUser();
    projectId = (await makeProject([[r, 'researcher']])).id;
    await addDefaultAnnotationClasses(runningServer().ctx.dataSource.manager, projectId);
    [source, target, smallTarget] = [await makeImageRow(projectId, r), await makeImageRow(projectId, r), await makeImageRow(projectId, r, { width: 100, height: 100 })];
    researcher = await signedIn(app.url, r);
    const classes = Object.fromEntries(((await researcher.get(`/api/projects/${projectId}/annotation-classes`)).body as { id: string; name: string }[]).map((c) => [c.name, c.id]));
    await researcher.post(path(source), { classId: classes['Bond interface'], kind: 'polyline', points: [[0, 1500], [4000, 1520]] });
    await researcher.post(path(source), { classId: classes['Oxide particle'], kind: 'polygon', points: [[100, 100], [140, 100], [140, 130]] });
    await researcher.post(path(source), { classId: classes['Pore'], kind: 'point', points: [[2000, 900]] });
    await researcher.post(path(source), { classId: classes['Note'], kind: 'text', points: [[50, 60]], label: 'brushing marks' });
  });
  after(() => app.close());

  it('exports a FeatureCollection with closed polygon rings and pixel coordinates declared', async () => {
    const res = await researcher.get(`${path(source)}.geojson`);
    expect(res.status).to.equal(200);
    expect(res.headers.get('content-type')).to.contain('application/geo+json');
    const fc = res.body;
    expect(fc.type).to.equal('FeatureCollection');
    expect(fc['etchfile:coordinates']).to.equal('image-pixels');
    const polygon = fc.features.find((f: { geometry: { type: string } }) => f.geometry.type === 'Polygon');
    // RFC 7946 §3.1.6: a linear ring's first and last positions are equivalent.
    const ring = polygon.geometry.coordinates[0];
    expect(ring[0]).to.deep.equal(ring[ring.length - 1]);
    expect(ring).to.have.length(4);
  });

  it('imports the export onto another image and gets the same shapes back (round trip)', async () => {
    const fc = (await researcher.get(`${path(source)}.geojson`)).body;
    const res = await importTo(target, fc);
    expect(res.status).to.equal(201);
    expect(res.body.imported).to.equal(4);
    const back = (await researcher.get(`${path(target)}.geojson`)).body;
    const strip = (f: { geometry: unknown; properties: { kind: string; class: string; label: string } }) => ({ g: f.geometry, k: f.properties.kind, c: f.properties.class, l: f.properties.label });
    expect(back.features.map(strip)).to.deep.equal(fc.features.map(strip));
  });

  it('when a geometry type is unsupported or a class unknown, then 422 per feature and nothing is imported', async () => {
    const before = await repo().countBy({ imageId: target });
    const res = await importTo(target, {
      type: 'FeatureCollection',
      features: [
        { type: 'Feature', geometry: { type: 'MultiPolygon', coordinates: [] }, properties: { class: 'Pore' } },
        { type: 'Feature', geometry: { type: 'Point', coordinates: [10, 10] }, properties: { class: 'Dislocation' } },
        { type: 'Feature', geometry: { type: 'Point', coordinates: [10, 10] }, properties: { class: 'Pore' } },
      ],
    });
    expect(res.status).to.equal(422);
    expect(res.body.error.details).to.have.length(2);
    expect(res.body.error.details[0].message).to.contain('MultiPolygon');
    expect(res.body.error.details[1].message).to.contain('Dislocation');
    expect(await repo().countBy({ imageId: target })).to.equal(before);
  });

  it('when coordinates fall outside the image, then 422 and nothing is imported', async () => {
    const fc = (await researcher.get(`${path(source)}.geojson`)).body;
    const res = await importTo(smallTarget, fc);
    expect(res.status).to.equal(422);
    expect(res.body.error.message).to.contain('outside the image');
    expect(await repo().countBy({ imageId: smallTarget })).to.equal(0);
  });

  it('when the file is not GeoJSON, then 422; when it is not JSON, then 400', async () => {
    expect((await importTo(target, { hello: 'world' })).status).to.equal(422);
    const broken = await researcher.raw('POST', `${path(target)}.geojson`, '{"type": "Feature', { 'content-type': 'application/geo+json' });
    expect(broken.status).to.equal(400);
  });
});
