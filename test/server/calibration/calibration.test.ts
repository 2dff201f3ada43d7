import { expect } from 'chai';
import type { User } from '../../../server/auth/user.entity';
import { mountApp, type ApiClient } from '../../support/api-client';
import { makeImageRow } from '../../support/catalogue-fixtures';
import { makeProject, makeUser, signedIn, unique } from '../../support/fixtures';
import { runningServer } from '../../support/test-server';

describe('calibration: drawn lines, presets and history', () => {
  let app: Awaited<ReturnType<typeof mountApp>>;
  let researcher: ApiClient;
  let reviewer: ApiClient;
  let projectId: string;
  let researcherName: string;
  let uploader: User;
  const ds = () => runningServer().ctx.dataSource;
  const pixelSize = async (imageId: string) => (await ds().query('SELECT pixel_size_um AS um, pixel_size_source AS source FROM images WHERE id = $1', [imageId]))[0];

  before(async () => {
    app = await mountApp();
    const [r, v] = await Promise.all([makeUser(), makeUser()]);
    researcherName = r.displayName;
    uploader = r;
    projectId = (await makeProject([[r, 'researcher'], [v, 'reviewer']])).id;
    [researcher, reviewer] = await Promise.all([signedIn(app.url, r), signedIn(app.url, v)]);
  });
  after(() => app.close());

  const drawn = (imageId: string) => `/api/projects/${projectId}/images/${imageId}/calibration/drawn`;

  it('when a line of 412 px is drawn along 100 µm, then the image gets 0.2427 µm/px from a drawn source, on record', async () => {
    const imageId = await makeImageRow(projectId, uploader, { width: 2000, height: 1500 }, null);
    const res = await researcher.post(drawn(imageId), { start: [100, 700], end: [512, 700], trueLengthUm: 100 });
    expect(res.status).to.equal(200);
    // TRADE primer: 100 µm over 412 px = 0.2427 µm/px [C].
    expect(res.body.pixelSize.xUm).to.be.closeTo(0.2427, 5e-5);
    expect(res.body.pixelSize.source).to.equal('drawn');
    expect(res.body.pixelSize.note).to.contain(researcherName);
    const history = (await reviewer.get(`/api/projects/${projectId}/images/${imageId}/calibration/history`)).body;
    expect(history).to.have.length(1);
    expect(history[0]).to.include({ oldUmPerPx: null, source: 'drawn', byName: researcherName });
    expect(history[0].newUmPerPx).to.be.closeTo(0.2427, 5e-5);
  });

  it('when the implied pixel size is implausible, then 422 with the warning until the person accepts it', async () => {
    const imageId = await makeImageRow(projectId, uploader, { width: 2000, height: 1500 }, 0.5);
    const body = { start: [0, 0], end: [100, 0], trueLengthUm: 1e6 };
    const refused = await researcher.post(drawn(imageId), body);
    expect(refused.status).to.equal(422);
    expect(refused.body.error.message).to.contain('outside the usual');
    expect((await pixelSize(imageId)).um).to.equal(0.5);
    const kept = await researcher.post(drawn(imageId), { ...body, acceptImplausible: true });
    expect(kept.status).to.equal(200);
    expect((await pixelSize(imageId)).um).to.equal(1e4);
  });

  for (const [title, body, text] of [
    ['a zero-length line', { start: [10, 10], end: [10, 10], trueLengthUm: 50 }, 'shorter than one pixel'],
    ['a true length of 0', { start: [0, 0], end: [100, 0], trueLengthUm: 0 }, 'above 0'],
    ['a negative true length', { start: [0, 0], end: [100, 0], trueLengthUm: -5 }, 'above 0'],
    ['a line off the image', { start: [0, 0], end: [9000, 0], trueLengthUm: 5 }, 'lie on the image'],
  ] as const) {
    it(`when the calibration is ${title}, then 422 and the pixel size stays`, async () => {
        const imageId = await makeImageRow(projectId, uploader, { width: 2000, height: 1500 }, 0.5);
      const res = await researcher.post(drawn(imageId), body);
      expect(res.status).to.equal(422);
      expect(res.body.error.message).to.contain(text);
      expect(await pixelSize(imageId)).to.deep.equal({ um: 0.5, source: 'user' });
      expect((await ds().query('SELECT count(*)::int AS n FROM calibration_changes WHERE image_id = $1', [imageId]))[0].n).to.equal(0);
    });
  }

  it('when a pixel size is typed on the image form, then the change is on record too', async () => {
    const imageId = await makeImageRow(projectId, uploader, undefined, 0.5);
    const res = await researcher.patch(`/api/projects/${projectId}/images/${imageId}`, { pixelSizeUm: 0.3 });
    expect(res.status).to.equal(200);
    const history = (await reviewer.get(`/api/projects/${projectId}/images/${imageId}/calibration/history`)).body;
    expect(history[0]).to.include({ oldUmPerPx: 0.5, newUmPerPx: 0.3, source: 'user' });
  });

  it('when a reviewer calibrates, then 403', async () => {
    const imageId = await makeImageRow(projectId, uploader);
    expect((await reviewer.post(drawn(imageId), { start: [0, 0], end: [100, 0], trueLengthUm: 10 })).status).to.equal(403);
  });

  it('when a preset is applied to several images, then each gets its pixel size and a history line; a foreign image stops all', async () => {
    const a = await makeImageRow(projectId, uploader, undefined, null);
    const b = await makeImageRow(projectId, uploader, undefined, null);
    const other = (await makeProject([])).id;
    const foreign = await makeImageRow(other, uploader, undefined, null);
    const preset = await researcher.post(`/api/projects/${projectId}/calibration-presets`, { name: `50x ${unique()}`, instrument: 'LOM-2', objective: '50x / 0.80', camera: '5 MP', umPerPx: 0.1376 });
    expect(preset.status).to.equal(201);
    const apply = `/api/projects/${projectId}/calibration-presets/${preset.body.id}/apply`;
    const refused = await researcher.post(apply, { imageIds: [a, foreign] });
    expect(refused.status).to.equal(422);
    expect((await pixelSize(a)).um).to.equal(null);
    const res = await researcher.post(apply, { imageIds: [a, b] });
    expect(res.status).to.equal(200);
    expect(res.body.updated).to.equal(2);
    expect(await pixelSize(b)).to.deep.equal({ um: 0.1376, source: 'preset' });
    expect((await researcher.get(`/api/projects/${projectId}/images/${a}/calibration/history`)).body[0].note).to.contain('applied by');
  });

  it('when a preset has an implausible pixel size, then 422', async () => {
    const res = await researcher.post(`/api/projects/${projectId}/calibration-presets`, { name: 'bad', umPerPx: 5000 });
    expect(res.status).to.equal(422);
    expect(res.body.error.details[0].field).to.equal('body.umPerPx');
  });
});
