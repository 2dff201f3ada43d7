import { createHash } from 'node:crypto';
import { expect } from 'chai';
import sharp from 'sharp';
import { mountApp } from '../../support/api-client';
import { runningServer } from '../../support/test-server';
import { pyramidLevels } from '../../../shared/tile-pyramid';
import { archiveScene, fieldsFor, tiff, upload, waitForState, type ArchiveScene } from './image-fixtures';

describe('images: serving derivatives, IIIF and the original', () => {
  let app: Awaited<ReturnType<typeof mountApp>>;
  let s: ArchiveScene;
  let imageId: string;
  let bytes: Buffer;
  const W = 1000;
  const H = 601;

  before(async function () {
    this.timeout(60_000);
    app = await mountApp();
    s = await archiveScene(app.url);
    bytes = await tiff(W, H);
    const res = await upload(s.client, s.project.id, bytes, 'Schliff "Nr. 2"; µ-Gefüge.tif', fieldsFor(s));
    imageId = res.body.image.id;
    await waitForState(imageId, ['ready']);
  });
  after(() => app.close());

  const url = (p: string) => `${app.url}/api/projects/${s.project.id}/images/${imageId}${p}`;
  const get = async (p: string, headers: Record<string, string> = {}) => fetch(url(p), { headers: { ...(await s.client.authHeaders()), ...headers } });

  it('when the tiles are listed in the store, then each level has the Deep Zoom tile grid and nothing else is stored', async () => {
    const keys = await runningServer().ctx.files.list(`projects/${s.project.id}/images/${imageId}/`);
    const tiles = keys.filter((k) => k.includes('/tiles/'));
    // Deep Zoom rules (TRADE primer): levels 0…⌈log2(1000)⌉ = 10, ⌈size/256⌉ columns and rows each [C].
    const levels = pyramidLevels(W, H);
    expect(levels).to.have.length(11);
    for (const l of levels) {
      const here = tiles.filter((k) => k.includes(`/tiles/${l.level}/`));
      expect(here, `level ${l.level}`).to.have.length(l.columns * l.rows);
    }
    expect(keys.filter((k) => !k.includes('/tiles/')).map((k) => k.split('/').at(-1))).to.have.members(['thumbnail.jpg', 'preview.jpg']);
    expect(keys.some((k) => k.includes('vips-properties'))).to.equal(false);
  });

  it('when a tile on the edge is fetched, then it is a JPEG clipped to the image, with long-lived private caching and an ETag', async () => {
    const res = await get('/tiles/10/3_2.jpg');
    expect(res.status).to.equal(200);
    expect(res.headers.get('content-type')).to.equal('image/jpeg');
    expect(res.headers.get('cache-control')).to.equal('private, max-age=31536000, immutable');
    expect(res.headers.get('etag')).to.match(/^".+"$/);
    const meta = await sharp(Buffer.from(await res.arrayBuffer())).metadata();
    // Column 3 spans x 768…999 (232 px), row 2 spans y 512…600 (89 px) [C].
    expect([meta.width, meta.height]).to.deep.equal([232, 89]);
  });

  it('when the client sends the ETag back, then 304 with no body', async () => {
    const first = await get('/thumbnail');
    const etag = first.headers.get('etag')!;
    const again = await get('/thumbnail', { 'if-none-match': etag });
    expect(again.status).to.equal(304);
    expect((await again.arrayBuffer()).byteLength).to.equal(0);
  });

  it('when the thumbnail and preview are fetched, then they fit 256 px and 1600 px', async () => {
    const thumb = await sharp(Buffer.from(await (await get('/thumbnail')).arrayBuffer())).metadata();
    expect(Math.max(thumb.width!, thumb.height!)).to.equal(256);
    const preview = await sharp(Buffer.from(await (await get('/preview')).arrayBuffer())).metadata();
    // Smaller than 1600 px, so kept at full size (never enlarged).
    expect([preview.width, preview.height]).to.deep.equal([W, H]);
  });

  it('when the tiler’s metadata file or a path outside the tiles is asked for, then nothing is served', async () => {
    for (const p of ['/tiles/vips-properties.xml', '/tiles/10/vips-properties.xml', '/tiles/10/..%2F..%2Fthumbnail.jpg', '/tiles/10/0_0.jpeg']) {
      const res = await get(p);
      expect([404, 422], p).to.include(res.status);
      expect(res.headers.get('content-type') ?? '', p).to.match(/json/);
    }
  });

  it('when info.json is read, then it is an IIIF Image API 3.0 level-0 description of the tile set', async () => {
    const res = await get('/iiif/info.json');
    expect(res.status).to.equal(200);
    expect(res.headers.get('content-type')).to.match(/^application\/ld\+json/);
    const info = await res.json();
    // IIIF Image API 3.0, §5.1-5.6: the required properties and the tiles object [S].
    expect(info['@context']).to.equal('http://iiif.io/api/image/3/context.json');
    expect(info).to.include({ type: 'ImageService3', protocol: 'http://iiif.io/api/image', profile: 'level0', width: W, height: H });
    expect(info.id).to.equal(url('/iiif'));
    expect(info.tiles).to.deep.equal([{ width: 256, height: 256, scaleFactors: [1, 2, 4] }]);
    expect(info.sizes).to.deep.include({ width: 250, height: 151 });
  });

  it('when a viewer asks for a tile by its IIIF URL, then it gets the same bytes as the Deep Zoom tile', async () => {
    // Scale factor 2, column 1, row 1: region x=512, y=512, w=min(512, 1000-512)=488, h=min(512, 601-512)=89; size ⌈488/2⌉,⌈89/2⌉ (IIIF 3.0 §4) [C].
    const iiif = await get('/iiif/512,512,488,89/244,45/0/default.jpg');
    expect(iiif.status).to.equal(200);
    const dz = await get('/tiles/9/1_1.jpg');
    const hash = async (r: Response) => createHash('sha256').update(Buffer.from(await r.arrayBuffer())).digest('hex');
    expect(await hash(iiif)).to.equal(await hash(dz));
    const full = await get('/iiif/full/250,151/0/default.jpg');
    expect(full.status).to.equal(200);
  });

  it('when an IIIF request asks for something a level-0 service lacks, then 400', async () => {
    for (const p of ['/iiif/0,0,100,100/100,100/0/default.jpg', '/iiif/0,0,256,256/256,256/90/default.jpg', '/iiif/0,0,256,256/256,256/0/gray.jpg']) {
      expect((await get(p)).status, p).to.equal(400);
    }
  });

  it('when the original is downloaded, then the bytes are the uploaded ones and the name travels safely in Content-Disposition', async () => {
    const res = await get('/original');
    expect(res.status).to.equal(200);
    expect(res.headers.get('content-type')).to.equal('image/tiff');
    const got = Buffer.from(await res.arrayBuffer());
    expect(createHash('sha256').update(got).digest('hex')).to.equal(createHash('sha256').update(bytes).digest('hex'));
    const cd = res.headers.get('content-disposition')!;
    // RFC 6266 / RFC 8187: an ASCII fallback without quotes, and the exact name percent-encoded.
    expect(cd.split("; filename*=")[0]).to.equal('attachment; filename="Schliff _Nr. 2__ _-Gef_ge.tif"');
    expect(decodeURIComponent(cd.split("UTF-8''")[1]!)).to.equal('Schliff "Nr. 2"; µ-Gefüge.tif');
    expect(res.headers.get('etag')).to.equal(`"sha256-${createHash('sha256').update(bytes).digest('hex')}"`);
  });

  it('when an image is not ready yet, then its views answer 409 image_not_ready with its state', async () => {
    const ds = runningServer().ctx.dataSource;
    await ds.query(`UPDATE images SET state = 'processing', progress = 40 WHERE id = $1`, [imageId]);
    try {
      const res = await get('/tiles/0/0_0.jpg');
      expect(res.status).to.equal(409);
      expect((await res.json()).error).to.include({ code: 'image_not_ready' });
    } finally {
      await ds.query(`UPDATE images SET state = 'ready', progress = 100 WHERE id = $1`, [imageId]);
    }
  });
});
