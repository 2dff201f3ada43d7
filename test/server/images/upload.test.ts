import { createHash } from 'node:crypto';
import { expect } from 'chai';
import exifr from 'exifr';
import { mountApp } from '../../support/api-client';
import { runningServer } from '../../support/test-server';
import { archiveScene, fieldsFor, jpeg, png, tiff, tiff16, upload, waitForState, webp } from './image-fixtures';

async function storedBytes(key: string): Promise<Buffer> {
  const chunks: Buffer[] = [];
  for await (const c of (await runningServer().ctx.files.get(key))!) chunks.push(c as Buffer);
  return Buffer.concat(chunks);
}

describe('images: upload happy paths', () => {
  let app: Awaited<ReturnType<typeof mountApp>>;
  before(async () => (app = await mountApp()));
  after(() => app.close());

  it('when a researcher uploads an 8-bit RGB TIFF, then 201, the original is kept byte for byte and its SHA-256 matches Node’s crypto', async () => {
    const s = await archiveScene(app.url);
    const bytes = await tiff(320, 240);
    const res = await upload(s.client, s.project.id, bytes, 'field 1.tif', fieldsFor(s, { tags: 'etched, interface', notes: 'first look' }));
    expect(res.status, JSON.stringify(res.body)).to.equal(201);
    const image = res.body.image;
    expect(image).to.include({ format: 'tiff', width: 320, height: 240, bitDepth: 8, channels: 3, pageCount: 1, originalName: 'field 1.tif', specimenId: s.specimenId, locationId: s.locationId });
    expect(image.tags).to.deep.equal(['etched', 'interface']);
    expect(image.uploaderName).to.equal(s.user.displayName);
    const sha = createHash('sha256').update(bytes).digest('hex');
    expect(image.sha256).to.equal(sha);
    const [row] = await runningServer().ctx.dataSource.query('SELECT original_key FROM images WHERE id = $1', [image.id]);
    const kept = await storedBytes(row.original_key);
    expect(createHash('sha256').update(kept).digest('hex')).to.equal(sha);
    expect(Buffer.compare(kept, bytes)).to.equal(0);
    expect((await waitForState(image.id))['state']).to.equal('ready');
  });

  it('when a TIFF carries resolution tags in centimetres, then the pixel size is 10000 / XRes, as exifr reads the tags', async () => {
    const s = await archiveScene(app.url);
    // sharp takes xres in px/mm; 4120 px/mm = 41200 px/cm.
    const bytes = await tiff(200, 100, { xres: 4120, yres: 4120, resolutionUnit: 'cm' });
    const tags = await exifr.parse(bytes, { tiff: true, translateValues: false });
    expect(tags.ResolutionUnit).to.equal(3);
    const res = await upload(s.client, s.project.id, bytes, 'cm.tif', fieldsFor(s));
    // TIFF 6.0 §8 ResolutionUnit 3 = cm; TRADE primer: µm/px = 10000/XRes [C].
    expect(res.body.image.pixelSize.xUm).to.be.closeTo(10_000 / tags.XResolution, 1e-9);
    expect(res.body.image.pixelSize.xUm).to.be.closeTo(0.2427, 5e-5);
    expect(res.body.image.pixelSize).to.include({ source: 'tiff_resolution', confirmed: false });
  });

  it('when a TIFF carries resolution tags in inches, then the pixel size is 25400 / XRes, as exifr reads the tags', async () => {
    const s = await archiveScene(app.url);
    const bytes = await tiff(200, 100, { xres: 2, yres: 2, resolutionUnit: 'inch' });
    const tags = await exifr.parse(bytes, { tiff: true, translateValues: false });
    expect(tags.ResolutionUnit).to.equal(2);
    const res = await upload(s.client, s.project.id, bytes, 'inch.tif', fieldsFor(s));
    // TIFF 6.0 §8 ResolutionUnit 2 = inch; TRADE primer: µm/px = 25400/XRes [C]; 2 px/mm = 50.8 dpi → 500 µm/px.
    expect(res.body.image.pixelSize.xUm).to.be.closeTo(25_400 / tags.XResolution, 1e-9);
    // TIFF stores the resolution as a rational, so allow its rounding.
    expect(res.body.image.pixelSize.xUm).to.be.closeTo(500, 1e-4);
  });

  it('when a TIFF says 72 dpi, then it is treated as uncalibrated and the uploader is told', async () => {
    const s = await archiveScene(app.url);
    const bytes = await tiff(200, 100, { xres: 72 / 25.4, yres: 72 / 25.4, resolutionUnit: 'inch' });
    expect(Math.round((await exifr.parse(bytes, { tiff: true })).XResolution)).to.equal(72);
    const res = await upload(s.client, s.project.id, bytes, '72dpi.tif', fieldsFor(s));
    // TRADE primer, Calibration: 72 dpi is a writer's default, not a calibration [P].
    expect(res.body.image.pixelSize).to.include({ xUm: null, source: 'none' });
    expect(res.body.notices.join(' ')).to.match(/No pixel size/);
  });

  it('when a TIFF carries OME-XML with PhysicalSizeX in nm, then that wins over its resolution tags', async () => {
    const s = await archiveScene(app.url);
    const ome = '<?xml version="1.0" encoding="UTF-8"?><OME xmlns="http://www.openmicroscopy.org/Schemas/OME/2016-06"><Image ID="Image:0"><Pixels ID="Pixels:0" DimensionOrder="XYCZT" Type="uint8" SizeX="200" SizeY="100" SizeC="3" SizeZ="1" SizeT="1" PhysicalSizeX="125" PhysicalSizeXUnit="nm" PhysicalSizeY="125" PhysicalSizeYUnit="nm"/></Image></OME>';
    const bytes = handMadeTiff(200, 100, { description: ome, pixelsPerCm: 41_200 });
    expect((await exifr.parse(bytes, { tiff: true })).ImageDescription).to.contain('PhysicalSizeX="125"');
    const res = await upload(s.client, s.project.id, bytes, 'ome.tif', fieldsFor(s));
    // OME schema: PhysicalSizeXUnit nm; 125 nm = 0.125 µm [C].
    expect(res.body.image.pixelSize).to.include({ source: 'ome_xml' });
    expect(res.body.image.pixelSize.xUm).to.be.closeTo(0.125, 1e-12);
  });

  for (const [format, make] of [['png', png], ['jpeg', jpeg], ['webp', webp]] as const) {
    it(`when a ${format.toUpperCase()} is uploaded, then it is identified by content and becomes ready`, async () => {
      const s = await archiveScene(app.url);
      // A misleading extension on purpose: the name plays no part.
      const res = await upload(s.client, s.project.id, await make(), `${format}-named.bin`, fieldsFor(s));
      expect(res.status, JSON.stringify(res.body)).to.equal(201);
      expect(res.body.image).to.include({ format, width: 300, height: 200, bitDepth: 8 });
      expect((await waitForState(res.body.image.id))['state']).to.equal('ready');
    });
  }

  it('when a 16-bit grey TIFF is uploaded, then it keeps its 16 bits and its tiles are stretched to the full 8-bit range', async () => {
    const s = await archiveScene(app.url);
    const bytes = await tiff16(400, 100, 1000, 5000);
    const res = await upload(s.client, s.project.id, bytes, 'sem16.tif', fieldsFor(s, { modality: 'sem_backscattered' }));
    expect(res.body.image).to.include({ bitDepth: 16, channels: 1 });
    await waitForState(res.body.image.id, ['ready']);
    // Level 8 of a 400 px wide image is 200 px: the whole ramp in one tile.
    const top = await storedBytes(`projects/${s.project.id}/images/${res.body.image.id}/tiles/8/0_0.jpg`);
    const stats = await (await import('sharp')).default(top).stats();
    // A percentile stretch of a 1000-5000 ramp reaches (nearly) black and white; unstretched it would be 4-19 of 255.
    expect(stats.channels).to.have.length(1);
    expect(stats.channels[0]!.min).to.be.at.most(5);
    expect(stats.channels[0]!.max).to.be.at.least(250);
  });

  it('when a multi-page TIFF is uploaded, then the page count is kept and the uploader is told only the first page is shown', async () => {
    const s = await archiveScene(app.url);
    const sharp = (await import('sharp')).default;
    const pages = await Promise.all([1, 2, 3].map(() => tiff(64, 64)));
    const bytes = await sharp(pages, { join: { animated: true } }).tiff({ compression: 'lzw' }).toBuffer();
    const res = await upload(s.client, s.project.id, bytes, 'stack.tif', fieldsFor(s));
    expect(res.status, JSON.stringify(res.body)).to.equal(201);
    expect(res.body.image.pageCount).to.equal(3);
    expect(res.body.notices.join(' ')).to.match(/3 pages.*first page/);
    expect((await waitForState(res.body.image.id))['state']).to.equal('ready');
  });

  it('when the same bytes are uploaded twice to a project, then the second is reported as a duplicate and nothing is stored twice', async () => {
    const s = await archiveScene(app.url);
    const bytes = await png();
    const first = await upload(s.client, s.project.id, bytes, 'a.png', fieldsFor(s));
    const second = await upload(s.client, s.project.id, bytes, 'b.png', fieldsFor(s));
    expect(second.status).to.equal(409);
    expect(second.body.error.code).to.equal('duplicate_image');
    expect(second.body.error.message).to.contain('a.png').and.contain(first.body.image.id);
    const rows = await runningServer().ctx.dataSource.query('SELECT count(*)::int AS n FROM images WHERE project_id = $1', [s.project.id]);
    expect(rows[0].n).to.equal(1);
    expect(await runningServer().ctx.files.list(`projects/${s.project.id}/originals/`)).to.have.length(1);
  });

  it('when the uploader types a pixel size, then it wins with source "user" and counts as confirmed', async () => {
    const s = await archiveScene(app.url);
    const res = await upload(s.client, s.project.id, await png(), 'typed.png', fieldsFor(s, { pixelSizeUm: '0.5', magnification: '200' }));
    expect(res.body.image.pixelSize).to.include({ xUm: 0.5, yUm: 0.5, source: 'user', confirmed: true });
    expect(res.body.image.magnification).to.equal(200);
  });
});

/**
 * A minimal uncompressed 8-bit grey TIFF written by hand (TIFF 6.0, Section 2 and the baseline
 * tags), because sharp cannot set ImageDescription: here it carries OME-XML.
 */
function handMadeTiff(width: number, height: number, opts: { description: string; pixelsPerCm: number }): Buffer {
  const text = Buffer.from(`${opts.description}\0`, 'utf8');
  const pixels = Buffer.alloc(width * height, 128);
  const entries: [number, number, number, number | Buffer][] = [
    [256, 4, 1, width], // ImageWidth
    [257, 4, 1, height], // ImageLength
    [258, 3, 1, 8], // BitsPerSample
    [259, 3, 1, 1], // Compression: none
    [262, 3, 1, 1], // PhotometricInterpretation: BlackIsZero
    [270, 2, text.length, text], // ImageDescription
    [273, 4, 1, 0], // StripOffsets (filled below)
    [277, 3, 1, 1], // SamplesPerPixel
    [278, 4, 1, height], // RowsPerStrip
    [279, 4, 1, pixels.length], // StripByteCounts
    [282, 5, 1, Buffer.alloc(8)], // XResolution (filled below)
    [283, 5, 1, Buffer.alloc(8)], // YResolution
    [296, 3, 1, 3], // ResolutionUnit: centimetre
  ];
  const ifdSize = 2 + entries.length * 12 + 4;
  let extra = 8 + ifdSize;
  const blobs: Buffer[] = [];
  const ifd = Buffer.alloc(ifdSize);
  ifd.writeUInt16LE(entries.length, 0);
  const rational = Buffer.alloc(8);
  rational.writeUInt32LE(opts.pixelsPerCm, 0);
  rational.writeUInt32LE(1, 4);
  const stripAt = 8 + ifdSize + text.length + 16;
  entries.forEach(([tag, type, count, value], i) => {
    const at = 2 + i * 12;
    ifd.writeUInt16LE(tag, at);
    ifd.writeUInt16LE(type, at + 2);
    ifd.writeUInt32LE(count, at + 4);
    if (Buffer.isBuffer(value)) {
      const blob = type === 5 ? rational : value;
      ifd.writeUInt32LE(extra, at + 8);
      blobs.push(blob);
      extra += blob.length;
    } else if (tag === 273) ifd.writeUInt32LE(stripAt, at + 8);
    else if (type === 3) ifd.writeUInt16LE(value, at + 8);
    else ifd.writeUInt32LE(value, at + 8);
  });
  const header = Buffer.from([0x49, 0x49, 0x2a, 0x00, 8, 0, 0, 0]);
  return Buffer.concat([header, ifd, ...blobs, pixels]);
}
