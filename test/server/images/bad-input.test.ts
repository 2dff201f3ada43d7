import { request } from 'node:http';
import { crc32, deflateSync } from 'node:zlib';
import { expect } from 'chai';
import { mountApp } from '../../support/api-client';
import { runningServer } from '../../support/test-server';
import { expectApiError, fieldsOf } from '../error-shape';
import { archiveScene, fieldsFor, leftovers, NOTHING_LEFT, png, tempUploads, upload, waitForState } from './image-fixtures';

/** A PNG that is only a header declaring `width` × `height` and a token of pixel data (PNG spec: signature, IHDR, IDAT, IEND). */
function pngHeaderOnly(width: number, height: number): Buffer {
  const chunk = (type: string, data: Buffer) => {
    const body = Buffer.concat([Buffer.from(type, 'latin1'), data]);
    const out = Buffer.alloc(12 + data.length);
    out.writeUInt32BE(data.length, 0);
    body.copy(out, 4);
    out.writeUInt32BE(crc32(body), 8 + data.length);
    return out;
  };
  const ihdr = Buffer.alloc(13);
  ihdr.writeUInt32BE(width, 0);
  ihdr.writeUInt32BE(height, 4);
  ihdr.set([8, 2, 0, 0, 0], 8); // 8-bit RGB, deflate, no filter, no interlace
  return Buffer.concat([Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]), chunk('IHDR', ihdr), chunk('IDAT', deflateSync(Buffer.alloc(16))), chunk('IEND', Buffer.alloc(0))]);
}

const wait = (ms: number) => new Promise((r) => setTimeout(r, ms));

describe('images: every bad upload gets its own error and leaves nothing behind', () => {
  let app: Awaited<ReturnType<typeof mountApp>>;
  before(async () => (app = await mountApp()));
  after(() => app.close());

  const notImages: [string, string, Buffer][] = [
    ['a text file renamed .tif', 'notes.tif', Buffer.from('Grain size per layer, see lab book p. 12.\n'.repeat(20))],
    ['an SVG drawing', 'drawing.png', Buffer.from('<?xml version="1.0"?><svg xmlns="http://www.w3.org/2000/svg" width="10" height="10"><rect width="10" height="10"/></svg>')],
    ['a PDF', 'report.tif', Buffer.from('%PDF-1.7\n%âãÏÓ\n1 0 obj << /Type /Catalog >> endobj\n'.repeat(4))],
    ['an HTML page', 'page.jpg', Buffer.from('<!DOCTYPE html><html><body><script>alert(1)</script></body></html>')],
    ['a zip archive', 'images.tif', Buffer.concat([Buffer.from([0x50, 0x4b, 0x03, 0x04]), Buffer.alloc(200, 1)])],
  ];
  for (const [what, name, bytes] of notImages) {
    it(`when ${what} is uploaded, then 415 unsupported_format and nothing is left`, async () => {
      const s = await archiveScene(app.url);
      const res = await upload(s.client, s.project.id, bytes, name, fieldsFor(s));
      expectApiError(res as never, 415, 'unsupported_format');
      expect(await leftovers(s.project.id)).to.deep.equal(NOTHING_LEFT);
    });
  }

  it('when a truncated PNG is uploaded, then 422 image_corrupt saying it was cut short, and nothing is left', async () => {
    const s = await archiveScene(app.url);
    const whole = await png(400, 300);
    const res = await upload(s.client, s.project.id, whole.subarray(0, Math.floor(whole.length * 0.6)), 'cut.png', fieldsFor(s));
    expectApiError(res as never, 422, 'image_corrupt');
    expect(res.body.error.message).to.match(/cut short/);
    expect(await leftovers(s.project.id)).to.deep.equal(NOTHING_LEFT);
  });

  it('when a file declares 60000 × 60000 px, then 422 image_too_large before decoding, and nothing is left', async () => {
    const s = await archiveScene(app.url);
    const res = await upload(s.client, s.project.id, pngHeaderOnly(60_000, 60_000), 'bomb.png', fieldsFor(s));
    expectApiError(res as never, 422, 'image_too_large');
    expect(res.body.error.message).to.contain('60000 × 60000');
    expect(await leftovers(s.project.id)).to.deep.equal(NOTHING_LEFT);
  });

  it('when a file declares 20000 × 20000 px (a stitched panorama), then the pixel limit admits it; its missing pixels fail the job with the reason', async () => {
    const s = await archiveScene(app.url);
    // Structurally whole (it reaches IEND) but with almost no pixel data: accepted, then the decode fails.
    const res = await upload(s.client, s.project.id, pngHeaderOnly(20_000, 20_000), 'panorama.png', fieldsFor(s));
    expect(res.status, JSON.stringify(res.body)).to.equal(201);
    expect(res.body.image).to.include({ width: 20_000, height: 20_000 });
    const row = await waitForState(res.body.image.id, ['failed']);
    expect(row['failure_reason']).to.match(/could not be decoded/);
    expect(await runningServer().ctx.files.list(`projects/${s.project.id}/images/`)).to.deep.equal([]);
  });

  it('when a 0-byte file is uploaded, then 422 empty_file and nothing is left', async () => {
    const s = await archiveScene(app.url);
    const res = await upload(s.client, s.project.id, Buffer.alloc(0), 'empty.tif', fieldsFor(s));
    expectApiError(res as never, 422, 'empty_file');
    expect(await leftovers(s.project.id)).to.deep.equal(NOTHING_LEFT);
  });

  it('when a file is over the size limit, then 413 file_too_large and nothing is left', async () => {
    const ctx = runningServer().ctx;
    const small = await mountApp({ config: { ...ctx.config, images: { ...ctx.config.images, uploadMaxBytes: 50_000 } } });
    try {
      const s = await archiveScene(small.url);
      const bytes = await png(300, 200);
      expect(bytes.length).to.be.above(50_000);
      const res = await upload(s.client, s.project.id, bytes, 'big.png', fieldsFor(s));
      expectApiError(res as never, 413, 'file_too_large');
      expect(await leftovers(s.project.id)).to.deep.equal(NOTHING_LEFT);
    } finally {
      await small.close();
    }
  });

  for (const name of ['../../etc/passwd.png', '..\\..\\boot.ini.png', 'evil\r\nX-Injected: 1.png']) {
    it(`when the file name is ${JSON.stringify(name)}, then 422 invalid_file_name and nothing is left`, async () => {
      const s = await archiveScene(app.url);
      const res = await upload(s.client, s.project.id, await png(), name, fieldsFor(s));
      expectApiError(res as never, 422, 'invalid_file_name');
      expect(await leftovers(s.project.id)).to.deep.equal(NOTHING_LEFT);
    });
  }

  it('when the specimen id is unknown, then 422 naming body.specimenId and nothing is left', async () => {
    const s = await archiveScene(app.url);
    const res = await upload(s.client, s.project.id, await png(), 'ok.png', fieldsFor(s, { specimenId: '00000000-0000-4000-8000-000000000000', locationId: '' }));
    expectApiError(res as never, 422, 'validation_failed');
    expect(fieldsOf(res as never)).to.include('body.specimenId');
    expect(await leftovers(s.project.id)).to.deep.equal(NOTHING_LEFT);
  });

  it('when the location belongs to another specimen, then 422 naming body.locationId and nothing is left', async () => {
    const s = await archiveScene(app.url);
    const other = await archiveScene(app.url);
    const res = await upload(s.client, s.project.id, await png(), 'ok.png', fieldsFor(s, { locationId: other.locationId }));
    expectApiError(res as never, 422, 'validation_failed');
    expect(fieldsOf(res as never)).to.include('body.locationId');
    expect(await leftovers(s.project.id)).to.deep.equal(NOTHING_LEFT);
  });

  it('when the fields are invalid (a magnification that is not a number, an EDS map without element), then 422 naming the field and nothing is left', async () => {
    const s = await archiveScene(app.url);
    const badNumber = await upload(s.client, s.project.id, await png(), 'ok.png', { specimenId: s.specimenId, modality: 'other', magnification: 'lots' });
    expectApiError(badNumber as never, 422, 'validation_failed');
    expect(fieldsOf(badNumber as never)).to.include('body.magnification');
    const noElement = await upload(s.client, s.project.id, await png(), 'ok.png', { specimenId: s.specimenId, modality: 'eds_element' });
    expectApiError(noElement as never, 422, 'validation_failed');
    expect(fieldsOf(noElement as never)).to.include('body.element');
    expect(await leftovers(s.project.id)).to.deep.equal(NOTHING_LEFT);
  });

  it('when a guest uploads, then 403 and nothing is stored', async () => {
    const s = await archiveScene(app.url, 'guest');
    const res = await upload(s.client, s.project.id, await png(), 'guest.png', fieldsFor(s));
    expectApiError(res as never, 403, 'forbidden');
    expect(await leftovers(s.project.id)).to.deep.equal(NOTHING_LEFT);
  });

  it('when the client disconnects halfway through the file, then the partial file is removed and no row is made', async () => {
    const s = await archiveScene(app.url);
    const bytes = await png(800, 600);
    const boundary = '----etchfile-test-boundary';
    const fields = Object.entries(fieldsFor(s))
      .map(([k, v]) => `--${boundary}\r\nContent-Disposition: form-data; name="${k}"\r\n\r\n${v}\r\n`)
      .join('');
    const head = Buffer.from(`${fields}--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="half.png"\r\nContent-Type: image/png\r\n\r\n`);
    const url = new URL(`${app.url}/api/projects/${s.project.id}/images`);
    const req = request({
      host: url.hostname,
      port: url.port,
      path: url.pathname,
      method: 'POST',
      headers: { ...(await s.client.authHeaders()), 'content-type': `multipart/form-data; boundary=${boundary}`, 'content-length': String(head.length + bytes.length + 100) },
    });
    req.on('error', () => {});
    req.write(head);
    req.write(bytes.subarray(0, bytes.length / 2));
    // Let the server start writing the temporary file, then go away.
    for (let i = 0; i < 50 && (await tempUploads()).length === 0; i++) await wait(20);
    expect((await tempUploads()).length, 'a temporary file while the upload runs').to.equal(1);
    req.destroy();
    for (let i = 0; i < 100 && (await tempUploads()).length > 0; i++) await wait(20);
    expect(await leftovers(s.project.id)).to.deep.equal(NOTHING_LEFT);
  });
});
