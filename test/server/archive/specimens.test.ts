import { expect } from 'chai';
import { SpecimenLocation } from '../../../server/archive/specimen-location.entity';
import { Specimen } from '../../../server/archive/specimen.entity';
import { mountApp, type ApiClient } from '../../support/api-client';
import { makeProject, makeUser, signedIn, unique } from '../../support/fixtures';
import { runningServer } from '../../support/test-server';

describe('archive: specimens and locations', () => {
  let app: Awaited<ReturnType<typeof mountApp>>;
  let researcher: ApiClient;
  let guest: ApiClient;
  let projectId: string;
  let sample: { id: string; route: { id: string }[] };
  let otherSample: { id: string; route: { id: string }[] };
  const ds = () => runningServer().ctx.dataSource;
  const specimens = () => `/api/projects/${projectId}/specimens`;

  before(async () => {
    app = await mountApp();
    const [r, g] = await Promise.all([makeUser(), makeUser()]);
    projectId = (await makeProject([[r, 'researcher'], [g, 'guest']])).id;
    [researcher, guest] = await Promise.all([signedIn(app.url, r), signedIn(app.url, g)]);
    const material = (await researcher.post(`/api/projects/${projectId}/materials`, { designation: `M-${unique()}` })).body.id;
    const make = async () =>
      (await researcher.post(`/api/projects/${projectId}/samples`, {
        code: `S-${unique()}`, name: 's', layers: [{ materialId: material, thicknessMm: 2 }],
        route: [{ type: 'cold_rolling', params: { reductionPct: 30 } }, { type: 'anneal', params: { temperatureC: 700, timeMin: 60 } }],
      })).body;
    [sample, otherSample] = await Promise.all([make(), make()]);
  });
  after(() => app.close());

  const specimen = (fields: object = {}) => ({
    sampleId: sample.id, code: `SP-${unique()}`, afterStepId: sample.route[1]!.id, sectionPlane: 'longitudinal',
    preparation: { steps: ['SiC P1200', '3 µm diamond'], etchant: '2 % nital', etchingTimeS: 10 }, ...fields,
  });

  it('when a researcher files a specimen after a step, then it reads back with the step named', async () => {
    const res = await researcher.post(specimens(), specimen());
    expect(res.status).to.equal(201);
    expect(res.body.afterStepLabel).to.equal('after step 2: Anneal');
    expect(res.body.preparation.etchant).to.equal('2 % nital');
    const list = await guest.get(`${specimens()}?sampleId=${sample.id}`);
    expect(list.body.map((s: { id: string }) => s.id)).to.include(res.body.id);
  });

  it('when the step belongs to another sample, then 422 naming body.afterStepId and nothing is stored', async () => {
    const body = specimen({ afterStepId: otherSample.route[0]!.id });
    const res = await researcher.post(specimens(), body);
    expect(res.status).to.equal(422);
    expect(res.body.error.details[0].field).to.equal('body.afterStepId');
    expect(await ds().getRepository(Specimen).existsBy({ code: body.code })).to.equal(false);
  });

  it('when the section plane is not one we know, then 422', async () => {
    const res = await researcher.post(specimens(), specimen({ sectionPlane: 'diagonal' }));
    expect(res.status).to.equal(422);
    expect(res.body.error.details[0].field).to.equal('body.sectionPlane');
  });

  it('when locations are added, then names are unique per specimen and positions are kept in mm', async () => {
    const created = (await researcher.post(specimens(), specimen())).body;
    const path = `${specimens()}/${created.id}/locations`;
    const first = await researcher.post(path, { name: 'interface 2, centre', xMm: 4.5, yMm: 0.25 });
    expect(first.status).to.equal(201);
    expect(first.body).to.include({ xMm: 4.5, yMm: 0.25, imageCount: 0 });
    const again = await researcher.post(path, { name: 'interface 2, centre' });
    expect(again.status).to.equal(409);
    expect(await ds().getRepository(SpecimenLocation).countBy({ specimenId: created.id })).to.equal(1);
    const detail = await guest.get(`${specimens()}/${created.id}`);
    expect(detail.body.locations.map((l: { name: string }) => l.name)).to.deep.equal(['interface 2, centre']);
  });

  it('when a guest adds a location, then 403 and nothing is stored', async () => {
    const created = (await researcher.post(specimens(), specimen())).body;
    const res = await guest.post(`${specimens()}/${created.id}/locations`, { name: 'edge' });
    expect(res.status).to.equal(403);
    expect(await ds().getRepository(SpecimenLocation).countBy({ specimenId: created.id })).to.equal(0);
  });

  it('when a location is renamed or deleted, then the change shows; unknown ids are 404', async () => {
    const created = (await researcher.post(specimens(), specimen())).body;
    const path = `${specimens()}/${created.id}/locations`;
    const loc = (await researcher.post(path, { name: 'edge' })).body;
    const renamed = await researcher.request<any>('PUT', `${path}/${loc.id}`, { name: 'edge, left', xMm: 0.5, yMm: null });
    expect(renamed.status).to.equal(200);
    expect(renamed.body.name).to.equal('edge, left');
    expect((await researcher.request<any>('PUT', `${path}/${crypto.randomUUID()}`, { name: 'x' })).status).to.equal(404);
  });
});
