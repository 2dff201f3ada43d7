import { expect } from 'chai';
import { addDefaultAnnotationClasses } from '../../../server/annotations/default-classes';
import { mountApp, type ApiClient } from '../../support/api-client';
import { makeImageRow } from '../../support/catalogue-fixtures';
import { makeProject, makeUser, signedIn, unique } from '../../support/fixtures';
import { runningServer } from '../../support/test-server';
import sharp from 'sharp';
import { archiveScene, fieldsFor, upload, waitForState } from '../images/image-fixtures';

describe('activity history', () => {
  let app: Awaited<ReturnType<typeof mountApp>>;
  let researcher: ApiClient;
  let guest: ApiClient;
  let outsider: ApiClient;
  let projectId: string;
  let imageId: string;
  const ds = () => runningServer().ctx.dataSource;

  before(async () => {
    app = await mountApp();
    const [r, g, o] = await Promise.all([makeUser(), makeUser(), makeUser()]);
    projectId = (await makeProject([[r, 'researcher'], [g, 'guest']])).id;
    await addDefaultAnnotationClasses(ds().manager, projectId);
    imageId = await makeImageRow(projectId, r, undefined, 0.5);
    [researcher, guest, outsider] = await Promise.all([signedIn(app.url, r), signedIn(app.url, g), signedIn(app.url, o)]);
  });
  after(() => app.close());

  it('when people work, then the project timeline lists who did what, newest first, and an image’s own timeline only its events', async () => {
    await researcher.post(`/api/projects/${projectId}/materials`, { designation: `KV-${unique()}` });
    const classes = (await guest.get(`/api/projects/${projectId}/annotation-classes`)).body as { id: string; name: string }[];
    const pore = classes.find((c) => c.name === 'Pore')!.id;
    const shape = (await researcher.post(`/api/projects/${projectId}/images/${imageId}/annotations`, { classId: pore, kind: 'point', points: [[10, 10]] })).body;
    await researcher.delete(`/api/projects/${projectId}/images/${imageId}/annotations/${shape.id}?version=1`);
    await researcher.post(`/api/projects/${projectId}/images/${imageId}/calibration/drawn`, { start: [0, 0], end: [400, 0], trueLengthUm: 100 });

    const project = (await guest.get(`/api/projects/${projectId}/activity`)).body;
    expect(project.items.map((e: { action: string }) => e.action)).to.deep.equal([
      'image.pixel_size_changed', 'annotation.deleted', 'annotation.created', 'catalogue.created',
    ]);
    expect(project.items[0].summary).to.contain('0.5 µm/px to 0.25 µm/px');
    const image = (await guest.get(`/api/projects/${projectId}/activity?imageId=${imageId}`)).body;
    expect(image.total).to.equal(3);
  });

  it('when an image is uploaded, described and deleted, then each is on the timeline', async () => {
    const scene = await archiveScene(app.url);
    const bytes = await sharp({ create: { width: 64, height: 48, channels: 3, background: '#888' } }).png().toBuffer();
    const up = await upload(scene.client, scene.project.id, bytes, 'field.png', fieldsFor(scene));
    expect(up.status).to.equal(201);
    const id = up.body.image.id;
    expect((await scene.client.patch(`/api/projects/${scene.project.id}/images/${id}`, { notes: 'etched twice' })).status).to.equal(200);
    const lead = await makeUser();
    await ds().query(`INSERT INTO project_memberships (project_id, user_id, role) VALUES ($1, $2, 'lead')`, [scene.project.id, lead.id]);
    const leadClient = await signedIn(app.url, lead);
    await waitForState(id);
    expect((await leadClient.delete(`/api/projects/${scene.project.id}/images/${id}`)).status).to.equal(204);
    const events = (await leadClient.get(`/api/projects/${scene.project.id}/activity?imageId=${id}`)).body;
    expect(events.items.map((e: { action: string }) => e.action)).to.deep.equal(['image.deleted', 'image.updated', 'image.uploaded']);
    expect(events.items[2].summary).to.equal('uploaded field.png');
  });

  it('when anyone tries to change or delete a recorded event, then the database refuses', async () => {
    const [event] = await ds().query('SELECT id FROM activity_events WHERE project_id = $1 LIMIT 1', [projectId]);
    let refused = '';
    await ds().query(`UPDATE activity_events SET summary = 'rewritten' WHERE id = $1`, [event.id]).catch((e: Error) => (refused = e.message));
    expect(refused).to.contain('append-only');
    refused = '';
    await ds().query('DELETE FROM activity_events WHERE id = $1', [event.id]).catch((e: Error) => (refused = e.message));
    expect(refused).to.contain('append-only');
  });

  it('when an outsider asks for the timeline, then 404; there is no route to write it', async () => {
    expect((await outsider.get(`/api/projects/${projectId}/activity`)).status).to.equal(404);
    expect((await researcher.post(`/api/projects/${projectId}/activity`, { summary: 'x' })).status).to.equal(404);
  });
});
