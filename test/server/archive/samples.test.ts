import { expect } from 'chai';
import { RouteStep } from '../../../server/archive/route-step.entity';
import { Sample } from '../../../server/archive/sample.entity';
import { mountApp, type ApiClient } from '../../support/api-client';
import { makeProject, makeUser, signedIn, unique } from '../../support/fixtures';
import { runningServer } from '../../support/test-server';

describe('archive: samples, stacks and routes', () => {
  let app: Awaited<ReturnType<typeof mountApp>>;
  let researcher: ApiClient;
  let reviewer: ApiClient;
  let projectId: string;
  let otherProjectId: string;
  let materialA: string;
  let materialB: string;
  let foreignMaterial: string;
  const ds = () => runningServer().ctx.dataSource;
  const samples = () => `/api/projects/${projectId}/samples`;

  before(async () => {
    app = await mountApp();
    const [r, v] = await Promise.all([makeUser(), makeUser()]);
    projectId = (await makeProject([[r, 'researcher'], [v, 'reviewer']])).id;
    otherProjectId = (await makeProject([[r, 'lead']])).id;
    [researcher, reviewer] = await Promise.all([signedIn(app.url, r), signedIn(app.url, v)]);
    const make = async (pid: string) => (await researcher.post(`/api/projects/${pid}/materials`, { designation: `M-${unique()}` })).body.id as string;
    [materialA, materialB, foreignMaterial] = await Promise.all([make(projectId), make(projectId), make(otherProjectId)]);
  });
  after(() => app.close());

  /** The demo's kind of laminate: two sheets, three 50 % passes with an anneal. */
  const laminate = () => ({
    code: `ARB-${unique()}`,
    name: 'two-material laminate',
    layers: [
      { materialId: materialA, thicknessMm: 1.5 },
      { materialId: materialB, thicknessMm: 1.5 },
    ],
    route: [
      { type: 'roll_bonding', date: '2026-02-03', params: { reductionPct: 50 } },
      { type: 'anneal', params: { temperatureC: 800, timeMin: 30, atmosphere: 'argon' } },
      { type: 'cut_and_stack', params: { pieces: 2 } },
      { type: 'roll_bonding', params: { reductionPct: 50 } },
      { type: 'cut_and_stack', params: { pieces: 2 } },
      { type: 'roll_bonding', params: { reductionPct: 50 } },
    ],
  });

  it('when a researcher creates a sample with a stack and route, then the page data carries what the route implies', async () => {
    const res = await researcher.post(samples(), laminate());
    expect(res.status).to.equal(201);
    expect(res.body.layers.map((l: { thicknessMm: number }) => l.thicknessMm)).to.deep.equal([1.5, 1.5]);
    expect(res.body.route).to.have.length(6);
    expect(res.body.states).to.have.length(7);
    const last = res.body.states.at(-1);
    // Saito et al., Acta Mater. 47 (1999) 579: after N = 3 cycles, 2^N layers, t0/2^N each, ε = N·0.80 [S].
    expect(last.layerCount).to.equal(8);
    expect(last.originalLayerThicknessMm[0]).to.be.closeTo(1.5 / 8, 1e-9);
    expect(last.vonMisesStrain).to.be.closeTo(3 * 0.8004, 3e-4);
  });

  it('when a layer uses another project’s material, then 422 naming that layer and nothing is stored', async () => {
    const body = laminate();
    body.layers[1]!.materialId = foreignMaterial;
    const res = await researcher.post(samples(), body);
    expect(res.status).to.equal(422);
    expect(res.body.error.details[0].field).to.equal('body.layers.1.materialId');
    expect(await ds().getRepository(Sample).existsBy({ code: body.code })).to.equal(false);
  });

  it('when a rolling pass has no reduction or an anneal no temperature, then 422 for each step', async () => {
    const body = { ...laminate(), route: [{ type: 'cold_rolling', params: {} }, { type: 'anneal', params: { timeMin: 10 } }] };
    const res = await researcher.post(samples(), body);
    expect(res.status).to.equal(422);
    const fields = res.body.error.details.map((d: { field: string }) => d.field);
    expect(fields).to.include.members(['body.route.0.params.reductionPct', 'body.route.1.params.temperatureC']);
  });

  it('when the route is edited, then steps sent back keep their ids', async () => {
    const created = (await researcher.post(samples(), laminate())).body;
    const route = created.route.map(({ id, type, params }: { id: string; type: string; params: object }) => ({ id, type, params }));
    route.splice(1, 0, { type: 'surface_preparation', params: { details: 'wire brushing' } });
    const res = await researcher.patch(`${samples()}/${created.id}`, { route });
    expect(res.status).to.equal(200);
    expect(res.body.route).to.have.length(7);
    expect(res.body.route[0].id).to.equal(created.route[0].id);
    expect(res.body.route[2].id).to.equal(created.route[1].id);
  });

  it('when a step a specimen was cut after is dropped, then 409 and the route stays as it was', async () => {
    const created = (await researcher.post(samples(), laminate())).body;
    const anneal = created.route[1];
    const specimen = await researcher.post(`/api/projects/${projectId}/specimens`, {
      sampleId: created.id, code: 'SP-1', afterStepId: anneal.id, sectionPlane: 'longitudinal',
    });
    expect(specimen.status).to.equal(201);
    const res = await researcher.patch(`${samples()}/${created.id}`, { route: [created.route[0]] });
    expect(res.status).to.equal(409);
    expect(res.body.error.message).to.contain('SP-1');
    expect(await ds().getRepository(RouteStep).countBy({ sampleId: created.id })).to.equal(6);
  });

  it('when a sample has specimens, then deleting it is 409; without them the lead-only delete is 403 for a researcher', async () => {
    const created = (await researcher.post(samples(), laminate())).body;
    expect((await researcher.delete(`${samples()}/${created.id}`)).status).to.equal(403);
    await researcher.post(`/api/projects/${projectId}/specimens`, { sampleId: created.id, code: 'SP-X', sectionPlane: 'transverse' });
    const lead = await signedIn(app.url, await makeUserAsLead());
    expect((await lead.delete(`${samples()}/${created.id}`)).status).to.equal(409);
    expect(await ds().getRepository(Sample).existsBy({ id: created.id })).to.equal(true);
  });

  it('when a reviewer creates a sample, then 403; when they read the list, then they see counts', async () => {
    expect((await reviewer.post(samples(), laminate())).status).to.equal(403);
    await researcher.post(samples(), laminate());
    const list = await reviewer.get(samples());
    expect(list.status).to.equal(200);
    expect(list.body[0]).to.have.keys(['id', 'projectId', 'code', 'name', 'stack', 'stepCount', 'specimenCount', 'updatedAt']);
  });

  it('when the code is taken in the project, then 409 naming body.code', async () => {
    const body = laminate();
    await researcher.post(samples(), body);
    const res = await researcher.post(samples(), body);
    expect(res.status).to.equal(409);
    expect(res.body.error.details[0].field).to.equal('body.code');
  });

  async function makeUserAsLead() {
    const user = await makeUser();
    await ds().query(`INSERT INTO project_memberships (project_id, user_id, role) VALUES ($1, $2, 'lead')`, [projectId, user.id]);
    return user;
  }
});
