import { expect } from 'chai';
import { mountApp } from '../../support/api-client';
import { sql } from '../db-state';
import { expectApiError } from '../error-shape';
import { archiveScene, fieldsFor, png, upload } from './image-fixtures';

describe('images: specimens and locations keep their images', () => {
  let app: Awaited<ReturnType<typeof mountApp>>;
  before(async () => (app = await mountApp()));
  after(() => app.close());

  it('when a specimen or location with an image is deleted, then 409 and both stay; counts show the image', async () => {
    const s = await archiveScene(app.url, 'lead');
    const res = await upload(s.client, s.project.id, await png(), 'kept.png', fieldsFor(s));
    expect(res.status).to.equal(201);
    expectApiError(await s.client.delete(`/api/projects/${s.project.id}/specimens/${s.specimenId}/locations/${s.locationId}`), 409, 'conflict');
    expectApiError(await s.client.delete(`/api/projects/${s.project.id}/specimens/${s.specimenId}`), 409, 'conflict');
    expect(await sql('SELECT 1 FROM specimen_locations WHERE id = $1', [s.locationId])).to.have.length(1);
    const specimen = await s.client.get(`/api/projects/${s.project.id}/specimens/${s.specimenId}`);
    expect(specimen.body.locations[0].imageCount).to.equal(1);
  });

  it('when the image is moved to another location by PATCH and then deleted, then the location can go', async () => {
    const s = await archiveScene(app.url, 'lead');
    const res = await upload(s.client, s.project.id, await png(), 'moved.png', fieldsFor(s));
    const id = res.body.image.id;
    const patched = await s.client.patch(`/api/projects/${s.project.id}/images/${id}`, { locationId: null, tags: ['moved'] });
    expect(patched.status, JSON.stringify(patched.body)).to.equal(200);
    expect(patched.body).to.include({ locationId: null });
    expect((await s.client.delete(`/api/projects/${s.project.id}/specimens/${s.specimenId}/locations/${s.locationId}`)).status).to.equal(204);
    expect((await s.client.delete(`/api/projects/${s.project.id}/images/${id}`)).status).to.equal(204);
    expect(await sql('SELECT 1 FROM images WHERE id = $1', [id])).to.have.length(0);
  });

  it('when the pixel size is confirmed or entered by PATCH, then the record says who and the source follows', async () => {
    const s = await archiveScene(app.url, 'lead');
    const res = await upload(s.client, s.project.id, await png(), 'cal.png', fieldsFor(s));
    const id = res.body.image.id;
    expectApiError(await s.client.patch(`/api/projects/${s.project.id}/images/${id}`, { confirmPixelSize: true }), 422, 'validation_failed');
    const entered = await s.client.patch(`/api/projects/${s.project.id}/images/${id}`, { pixelSizeUm: 0.25 });
    expect(entered.body.pixelSize).to.include({ xUm: 0.25, yUm: 0.25, source: 'user', confirmed: true });
    expect(entered.body.pixelSize.note).to.contain(s.user.displayName);
  });
});
