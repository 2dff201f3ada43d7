import { expect } from 'chai';
import { Material } from '../../../server/archive/material.entity';
import { mountApp, type ApiClient } from '../../support/api-client';
import { makeProject, makeUser, signedIn, unique } from '../../support/fixtures';
import { runningServer } from '../../support/test-server';

describe('archive: materials', () => {
  let app: Awaited<ReturnType<typeof mountApp>>;
  let lead: ApiClient;
  let guest: ApiClient;
  let outsider: ApiClient;
  let projectId: string;
  const repo = () => runningServer().ctx.dataSource.getRepository(Material);
  const path = () => `/api/projects/${projectId}/materials`;

  before(async () => {
    app = await mountApp();
    const [l, g, o] = await Promise.all([makeUser(), makeUser(), makeUser()]);
    projectId = (await makeProject([[l, 'lead'], [g, 'guest']])).id;
    [lead, guest, outsider] = await Promise.all([signedIn(app.url, l), signedIn(app.url, g), signedIn(app.url, o)]);
  });
  after(() => app.close());

  const twip = () => ({ designation: `T-${unique()}`, materialClass: 'austenitic, twinning', composition: { wtPct: { Mn: 22, C: 0.6 }, balance: 'Fe' } });

  it('when a lead creates a material with a composition, then 201 and the list shows it', async () => {
    const body = twip();
    const res = await lead.post(path(), body);
    expect(res.status).to.equal(201);
    expect(res.body).to.include({ designation: body.designation, usedInSamples: 0 });
    expect(res.body.composition).to.deep.equal(body.composition);
    const list = await guest.get(path());
    expect(list.body.map((m: { designation: string }) => m.designation)).to.include(body.designation);
  });

  it('when an element symbol is unknown or mis-cased, then 422 naming it and nothing is stored', async () => {
    const body = { ...twip(), composition: { wtPct: { MN: 22, Xx: 1 }, balance: 'Fe' } };
    const res = await lead.post(path(), body);
    expect(res.status).to.equal(422);
    const fields = res.body.error.details.map((d: { field: string }) => d.field);
    expect(fields).to.include.members(['body.composition.wtPct.MN', 'body.composition.wtPct.Xx']);
    expect(await repo().existsBy({ designation: body.designation })).to.equal(false);
  });

  it('when the listed contents add up to more than 100.5 wt.%, then 422 saying the sum', async () => {
    const res = await lead.post(path(), { ...twip(), composition: { wtPct: { Cr: 60, Ni: 40.6 }, balance: null } });
    expect(res.status).to.equal(422);
    expect(res.body.error.details[0].message).to.contain('100.60');
  });

  it('when a content is negative or above 100, then 422 for each', async () => {
    const res = await lead.post(path(), { ...twip(), composition: { wtPct: { Cr: -1, Ni: 101 }, balance: null } });
    expect(res.status).to.equal(422);
    expect(res.body.error.details).to.have.length(2);
  });

  it('when the designation is taken in the project, then 409 naming body.designation', async () => {
    const body = twip();
    await lead.post(path(), body);
    const res = await lead.post(path(), { ...body, notes: 'again' });
    expect(res.status).to.equal(409);
    expect(res.body.error.details[0].field).to.equal('body.designation');
    expect(await repo().countBy({ projectId, designation: body.designation })).to.equal(1);
  });

  it('when a guest creates a material, then 403 and nothing is stored', async () => {
    const body = twip();
    const res = await guest.post(path(), body);
    expect(res.status).to.equal(403);
    expect(await repo().existsBy({ designation: body.designation })).to.equal(false);
  });

  it('when someone outside the project lists its materials, then 404', async () => {
    expect((await outsider.get(path())).status).to.equal(404);
  });

  it('when a lead edits a material, then the change is saved; a guest may not delete it', async () => {
    const created = (await lead.post(path(), twip())).body;
    const res = await lead.patch(`${path()}/${created.id}`, { notes: 'Re-analysed 2026-04.' });
    expect(res.status).to.equal(200);
    expect(res.body.notes).to.equal('Re-analysed 2026-04.');
    expect((await guest.delete(`${path()}/${created.id}`)).status).to.equal(403);
    expect((await lead.delete(`${path()}/${created.id}`)).status).to.equal(204);
    expect(await repo().existsBy({ id: created.id })).to.equal(false);
  });

  it('when a material is in a sample stack, then deleting it is 409 and it stays', async () => {
    const material = (await lead.post(path(), twip())).body;
    const sample = await lead.post(`/api/projects/${projectId}/samples`, {
      code: `S-${unique()}`,
      name: 'uses the material',
      layers: [{ materialId: material.id, thicknessMm: 1 }],
    });
    expect(sample.status).to.equal(201);
    const res = await lead.delete(`${path()}/${material.id}`);
    expect(res.status).to.equal(409);
    expect(res.body.error.message).to.contain('1 sample');
    expect(await repo().existsBy({ id: material.id })).to.equal(true);
  });
});
