import { createHash } from 'node:crypto';
import { expect } from 'chai';
import exifr from 'exifr';
import sharp from 'sharp';
import { addDefaultAnnotationClasses } from '../../../server/annotations/default-classes';
import { mountApp, type ApiClient } from '../../support/api-client';
import { makeUser, signedIn } from '../../support/fixtures';
import { runningServer } from '../../support/test-server';
import { archiveScene, fieldsFor, upload, waitForState, type ArchiveScene } from '../images/image-fixtures';

/** A mid-grey 800 × 600 micrograph at 0.5 µm/px (2000 px/mm in the TIFF tags). */
const micrograph = () =>
  sharp({ create: { width: 800, height: 600, channels: 3, background: { r: 150, g: 150, b: 150 } } })
    .tiff({ xres: 2000, yres: 2000, resolutionUnit: 'cm' })
    .toBuffer();

describe('figures: composition and export', function () {
  this.timeout(60_000);
  let app: Awaited<ReturnType<typeof mountApp>>;
  let scene: ArchiveScene;
  let reviewer: ApiClient;
  let imageIds: string[];
  let interfaceClass: string;
  let originalSha: string;
  const path = () => `/api/projects/${scene.project.id}/figures`;

  before(async () => {
    app = await mountApp();
    scene = await archiveScene(app.url);
    const ds = runningServer().ctx.dataSource;
    await addDefaultAnnotationClasses(ds.manager, scene.project.id);
    const r = await makeUser();
    await ds.query(`INSERT INTO project_memberships (project_id, user_id, role) VALUES ($1, $2, 'reviewer')`, [scene.project.id, r.id]);
    reviewer = await signedIn(app.url, r);
    const bytes = await micrograph();
    originalSha = createHash('sha256').update(bytes).digest('hex');
    imageIds = [];
    for (const [i, b] of [bytes, await sharp(bytes).negate().tiff({ xres: 2000, yres: 2000, resolutionUnit: 'cm' }).toBuffer()].entries()) {
      const res = await upload(scene.client, scene.project.id, b, `field-${i}.tif`, fieldsFor(scene));
      expect(res.status).to.equal(201);
      imageIds.push(res.body.image.id);
      await waitForState(res.body.image.id, ['ready']);
    }
    const classes = (await scene.client.get(`/api/projects/${scene.project.id}/annotation-classes`)).body as { id: string; name: string }[];
    interfaceClass = classes.find((c) => c.name === 'Bond interface')!.id;
    // A horizontal interface across the middle of the first image.
    const drawn = await scene.client.post(`/api/projects/${scene.project.id}/images/${imageIds[0]}/annotations`, { classId: interfaceClass, kind: 'polyline', points: [[0, 300], [800, 300]] });
    expect(drawn.status).to.equal(201);
  });
  after(() => app.close());

  const twoPanels = () => ({
    title: 'Interface 1, two fields',
    columns: 2,
    gapMm: 2,
    panels: imageIds.map((imageId, i) => ({ imageId, region: { x: 0, y: 0, width: 800, height: 600 }, classIds: i === 0 ? [interfaceClass] : [], letter: 'ab'[i]!, legend: i === 0 })),
  });

  async function exportAs(figureId: string, format: 'png' | 'tiff', widthMm: number, dpi: number) {
    const res = await fetch(`${app.url}${path()}/${figureId}/export`, {
      method: 'POST',
      headers: { ...(await scene.client.authHeaders()), 'content-type': 'application/json' },
      body: JSON.stringify({ format, widthMm, dpi }),
    });
    return { status: res.status, headers: res.headers, bytes: Buffer.from(await res.arrayBuffer()) };
  }

  it('when a two-panel figure is exported as TIFF at 80 mm and 300 dpi, then the file has that size and resolution, annotations drawn, originals untouched', async () => {
    const figure = (await scene.client.post(path(), twoPanels())).body;
    const out = await exportAs(figure.id, 'tiff', 80, 300);
    expect(out.status).to.equal(200);
    expect(out.headers.get('content-type')).to.equal('image/tiff');
    const meta = await sharp(out.bytes).metadata();
    // 80 mm at 300 dpi = 80 / 25.4 · 300 = 944.9 → 945 px wide (hand-computed).
    expect(meta.width).to.equal(945);
    // TIFF 6.0: XResolution (282) with ResolutionUnit (296) = 2, inch; read back with exifr as the reference reader.
    const tags = await exifr.parse(out.bytes, { translateValues: false, pick: ['XResolution', 'ResolutionUnit'] });
    expect(tags.ResolutionUnit).to.equal(2);
    expect(tags.XResolution).to.be.closeTo(300, 0.01);
    // The interface line runs across panel a at mid-height: its pixels carry the class colour (cobalt #3a5bd9).
    const { data, info } = await sharp(out.bytes).raw().toBuffer({ resolveWithObject: true });
    const panelWidth = Math.floor((945 - Math.round((2 * 300) / 25.4)) / 2);
    const y = Math.round((panelWidth * 0.75) / 2);
    const at = (x: number) => [...data.subarray((y * info.width + x) * info.channels, (y * info.width + x) * info.channels + 3)];
    expect(at(Math.round(panelWidth / 2))).to.deep.equal([0x3a, 0x5b, 0xd9]);
    // The archived original is byte for byte what was uploaded.
    const [row] = await runningServer().ctx.dataSource.query('SELECT sha256 FROM images WHERE id = $1', [imageIds[0]]);
    expect(row.sha256).to.equal(originalSha);
  });

  it('when exported as PNG, then the dpi is written in the file (pHYs)', async () => {
    const figure = (await scene.client.post(path(), twoPanels())).body;
    const out = await exportAs(figure.id, 'png', 60, 600);
    expect(out.status).to.equal(200);
    // PNG pHYs stores pixels per metre: 600 dpi = 23622 px/m; sharp reports it back as density in dpi.
    expect((await sharp(out.bytes).metadata()).density).to.be.closeTo(600, 0.5);
  });

  it('when a reviewer composes a figure, then 403; when they export one, then it works', async () => {
    expect((await reviewer.post(path(), twoPanels())).status).to.equal(403);
    const figure = (await scene.client.post(path(), twoPanels())).body;
    const res = await fetch(`${app.url}${path()}/${figure.id}/export`, {
      method: 'POST',
      headers: { ...(await reviewer.authHeaders()), 'content-type': 'application/json' },
      body: JSON.stringify({ format: 'png', widthMm: 40, dpi: 150 }),
    });
    expect(res.status).to.equal(200);
  });

  it('when a panel reaches outside its image, then 422 naming the panel and nothing is stored', async () => {
    const body = twoPanels();
    body.panels[1]!.region = { x: 100, y: 0, width: 800, height: 600 };
    const res = await scene.client.post(path(), body);
    expect(res.status).to.equal(422);
    expect(res.body.error.details[0].field).to.equal('body.panels.1.region');
  });

  it('when an export would pass the pixel limit, then 422 saying how to make it smaller', async () => {
    const one = { ...twoPanels(), columns: 1, panels: [twoPanels().panels[0]!] };
    const figure = (await scene.client.post(path(), one)).body;
    const out = await exportAs(figure.id, 'tiff', 500, 1200);
    expect(out.status).to.equal(422);
    expect(JSON.parse(out.bytes.toString()).error.message).to.contain('Lower the width or the dpi');
  });

  it('when the measurements behind a figure are asked for, then a CSV with units and the research caution comes back', async () => {
    const figure = (await scene.client.post(path(), twoPanels())).body;
    const res = await fetch(`${app.url}${path()}/${figure.id}/measurements.csv`, { headers: await reviewer.authHeaders() });
    expect(res.status).to.equal(200);
    expect(res.headers.get('content-type')).to.contain('text/csv');
    const text = await res.text();
    expect(text).to.contain('P_L or N_L (mm⁻¹)');
    expect(text).to.contain('do not certify material');
  });

  it('when two people edit the same figure, then the second gets 409', async () => {
    const figure = (await scene.client.post(path(), twoPanels())).body;
    expect((await scene.client.patch(`${path()}/${figure.id}`, { version: 1, title: 'first' })).status).to.equal(200);
    expect((await scene.client.patch(`${path()}/${figure.id}`, { version: 1, title: 'second' })).status).to.equal(409);
  });
});
