import { randomBytes } from 'node:crypto';
import { expect } from 'chai';
import type { User } from '../../../server/auth/user.entity';
import { invert } from '../../../shared/viewer/alignment';
import { mountApp, type ApiClient } from '../../support/api-client';
import { makeImageRow } from '../../support/catalogue-fixtures';
import { makeProject, makeUser, signedIn } from '../../support/fixtures';
import { sql } from '../db-state';
import { expectApiError } from '../error-shape';
import { ACTORS, expectedOutcome, sceneFor, who } from '../role-actors';

type Pt = [number, number];
const pair = (image: Pt, other: Pt) => ({ image, other });

/**
 * Two images of one location: the main one (4000 × 3000 px at 0.5 µm/px, from `makeImageRow`) and another
 * on the same specimen and location (2000 × 1500 px at 1.0 µm/px), made by copying the first row.
 */
async function colocatedPair(projectId: string, uploader: User): Promise<{ main: string; other: string }> {
  const main = await makeImageRow(projectId, uploader, { width: 4000, height: 3000 }, 0.5);
  const [loc] = await sql<{ id: string }>(
    `INSERT INTO specimen_locations (specimen_id, name) SELECT specimen_id, 'field ' || left(md5(random()::text), 6) FROM images WHERE id = $1 RETURNING id`,
    [main],
  );
  await sql('UPDATE images SET location_id = $1 WHERE id = $2', [loc!.id, main]);
  const [other] = await sql<{ id: string }>(
    `INSERT INTO images (project_id, specimen_id, location_id, uploader_id, modality, original_name, sha256, byte_size, format, width, height, bit_depth, channels,
                         original_key, pixel_size_um, pixel_size_source, state, pyramid_levels)
     SELECT project_id, specimen_id, location_id, uploader_id, 'sem_secondary', 'field-sem.tif', $2, byte_size, format, 2000, 1500, bit_depth, channels,
            original_key, 1.0, 'user', 'ready', 12 FROM images WHERE id = $1 RETURNING id`,
    [main, randomBytes(32).toString('hex')],
  );
  return { main, other: other!.id };
}

/** Hand-computed: B(100,100)→A(300,400) and B(1100,100)→A(2300,400): 1000 px become 2000 px, no turn, so A = 2·B + (100, 200). */
const TWO_PAIRS = [pair([300, 400], [100, 100]), pair([2300, 400], [1100, 100])];

describe('alignments of co-located images: save, read, permissions and bad input', () => {
  let app: Awaited<ReturnType<typeof mountApp>>;
  let researcher: ApiClient;
  let reviewer: ApiClient;
  let projectId: string;
  let uploader: User;

  before(async () => {
    app = await mountApp();
    const [r, v] = await Promise.all([makeUser(), makeUser()]);
    uploader = r;
    projectId = (await makeProject([[r, 'researcher'], [v, 'reviewer']])).id;
    [researcher, reviewer] = await Promise.all([signedIn(app.url, r), signedIn(app.url, v)]);
  });
  after(() => app.close());

  const url = (imageId: string, otherId: string) => `/api/projects/${projectId}/images/${imageId}/alignments/${otherId}`;
  const rows = (a: string, b: string) => sql('SELECT * FROM image_alignments WHERE (image_id = $1 AND other_image_id = $2) OR (image_id = $2 AND other_image_id = $1)', [a, b]);
  const events = (imageId: string) => sql<{ action: string; summary: string }>(`SELECT action, summary FROM activity_events WHERE image_id = $1 AND action LIKE 'alignment.%' ORDER BY seq`, [imageId]);

  it('when a researcher saves two point pairs, then the similarity is stored, on record, and readable from both images', async () => {
    const { main, other } = await colocatedPair(projectId, uploader);
    const res = await researcher.request<any>('PUT', url(main, other), { pairs: TWO_PAIRS });
    expect(res.status, JSON.stringify(res.body)).to.equal(200);
    expect(res.body).to.include({ imageId: main, otherImageId: other, kind: 'similarity' });
    // Hand-computed above: a = d = 2, b = c = 0, e = 100, f = 200.
    for (const [k, v] of Object.entries({ a: 2, b: 0, c: 0, d: 2, e: 100, f: 200 })) expect(res.body.transform[k], k).to.be.closeTo(v, 1e-9);
    expect(res.body.residualsPx.every((r: number) => r < 1e-9)).to.equal(true);

    const [row] = await rows(main, other);
    expect(row).to.include({ image_id: main, other_image_id: other, kind: 'similarity' });
    expect(row!['pairs']).to.deep.equal(TWO_PAIRS);
    expect(await events(main)).to.deep.equal([{ action: 'alignment.saved', summary: 'aligned field-sem.tif onto fixture.tif with 2 point pairs (scale, rotation, shift)' }]);

    // From the other image (a reviewer may read): pairs swapped, transform inverted: B = A/2 − (50, 100).
    const back = await reviewer.get(url(other, main));
    expect(back.status).to.equal(200);
    expect(back.body.pairs).to.deep.equal(TWO_PAIRS.map((p) => ({ image: p.other, other: p.image })));
    for (const [k, v] of Object.entries({ a: 0.5, b: 0, c: 0, d: 0.5, e: -50, f: -100 })) expect(back.body.transform[k], k).to.be.closeTo(v, 1e-9);
    const list = await reviewer.get(`/api/projects/${projectId}/images/${main}/alignments`);
    expect(list.body.map((a: { otherImageId: string }) => a.otherImageId)).to.deep.equal([other]);
  });

  it('when three pairs are saved from the other image, then they replace the earlier alignment as one affine row', async () => {
    const { main, other } = await colocatedPair(projectId, uploader);
    expect((await researcher.request<any>('PUT', url(main, other), { pairs: TWO_PAIRS })).status).to.equal(200);
    // Hand-computed: A = (3·x + 0.5·y + 5, 1·x + 2·y + 7) of B, seen from B: B's points (0,0), (100,0), (0,100) map to these A points.
    const three = [pair([0, 0], [5, 7]), pair([100, 0], [305, 107]), pair([0, 100], [55, 207])];
    const res = await researcher.request<any>('PUT', url(other, main), { pairs: three });
    expect(res.status, JSON.stringify(res.body)).to.equal(200);
    expect(res.body.kind).to.equal('affine');
    const stored = await rows(main, other);
    expect(stored).to.have.length(1);
    expect(stored[0]).to.include({ image_id: other, other_image_id: main, kind: 'affine' });
    // Saved from B, the fit maps A points to B: the inverse of M = {3, 1, 0.5, 2, 5, 7}; seen from A it is M itself.
    const m = { a: 3, b: 1, c: 0.5, d: 2, e: 5, f: 7 };
    const inverse = invert(m);
    for (const k of ['a', 'b', 'c', 'd', 'e', 'f'] as const) expect(res.body.transform[k], `from B: ${k}`).to.be.closeTo(inverse[k], 1e-9);
    const fromMain = await researcher.get(url(main, other));
    for (const k of ['a', 'b', 'c', 'd', 'e', 'f'] as const) expect(fromMain.body.transform[k], `from A: ${k}`).to.be.closeTo(m[k], 1e-9);
  });

  it('when an alignment is removed, then it is gone from both sides and the removal is on record', async () => {
    const { main, other } = await colocatedPair(projectId, uploader);
    await researcher.request<any>('PUT', url(main, other), { pairs: TWO_PAIRS });
    expect((await researcher.delete(url(other, main))).status).to.equal(204);
    expect(await rows(main, other)).to.deep.equal([]);
    expectApiError(await researcher.get(url(main, other)), 404, 'not_found');
    expect((await events(other)).map((e) => e.action)).to.deep.equal(['alignment.removed']);
  });

  describe('bad input: 422 with the reason, and nothing stored or recorded', () => {
    const cases: [string, (ids: { main: string; other: string }) => { path: 'forward' | 'self'; body: unknown }, string, RegExp][] = [
      ['one pair', () => ({ path: 'forward', body: { pairs: [TWO_PAIRS[0]] } }), 'body.pairs', /at least 2 pairs/],
      ['two clicks on one spot', () => ({ path: 'forward', body: { pairs: [pair([300, 400], [100, 100]), pair([2300, 400], [101, 101])] } }), 'body.pairs', /same place/],
      ['three points on one line', () => ({ path: 'forward', body: { pairs: [pair([0, 0], [0, 0]), pair([1000, 0], [500, 0]), pair([2000, 10], [1000, 5])] } }), 'body.pairs', /lie on one line/],
      // Hand-computed: 1000 px of the other image onto 4 px of the main one is a scale of 0.004, under 1/100.
      ['an absurd scale', () => ({ path: 'forward', body: { pairs: [pair([10, 10], [0, 0]), pair([14, 10], [1000, 0])] } }), 'body.pairs', /cannot be the same field/],
      ['a point off the other image', () => ({ path: 'forward', body: { pairs: [pair([300, 400], [100, 100]), pair([2300, 400], [2100, 100])] } }), 'body.pairs.1.other', /must lie on field-sem\.tif/],
      ['an unknown field', () => ({ path: 'forward', body: { pairs: TWO_PAIRS, transform: {} } }), 'body', /Unknown field/],
      ['a coordinate that is not a number', () => ({ path: 'forward', body: { pairs: [pair([300, 400], [100, 100]), { image: ['a', 1], other: [1, 1] }] } }), 'body.pairs.1.image.0', /number/],
      ['the image itself', () => ({ path: 'self', body: { pairs: TWO_PAIRS } }), 'params.otherImageId', /with itself/],
    ];
    for (const [what, input, field, message] of cases) {
      it(`when the request has ${what}, then 422 naming ${field}`, async () => {
        const ids = await colocatedPair(projectId, uploader);
        const { path, body } = input(ids);
        const res = await researcher.request<any>('PUT', url(ids.main, path === 'self' ? ids.main : ids.other), body);
        const error = expectApiError(res, 422, 'validation_failed');
        expect(error.details?.map((d) => d.field)).to.include(field);
        expect(error.message).to.match(message);
        expect(await rows(ids.main, ids.other)).to.deep.equal([]);
        expect(await events(ids.main)).to.deep.equal([]);
      });
    }

    it('when the other image is at another location, then 422', async () => {
      const a = await colocatedPair(projectId, uploader);
      const b = await colocatedPair(projectId, uploader);
      const error = expectApiError(await researcher.request<any>('PUT', url(a.main, b.other), { pairs: TWO_PAIRS }), 422, 'validation_failed');
      expect(error.message).to.contain('same location');
      expect(await rows(a.main, b.other)).to.deep.equal([]);
    });

    it('when the other image belongs to another project, then 404', async () => {
      const { main } = await colocatedPair(projectId, uploader);
      const foreign = await colocatedPair((await makeProject([[uploader, 'researcher']])).id, uploader);
      expectApiError(await researcher.request<any>('PUT', url(main, foreign.other), { pairs: TWO_PAIRS }), 404, 'not_found');
      expect(await rows(main, foreign.other)).to.deep.equal([]);
    });

    it('when a reviewer tries to save, then 403 and nothing is stored', async () => {
      const { main, other } = await colocatedPair(projectId, uploader);
      expectApiError(await reviewer.request<any>('PUT', url(main, other), { pairs: TWO_PAIRS }), 403, 'forbidden');
      expect(await rows(main, other)).to.deep.equal([]);
    });
  });

  describe('permissions per role (shared/roles.ts: saving needs "annotate", reading needs "read")', () => {
    for (const actor of ACTORS) {
      it(`when a ${who(actor)} saves and reads an alignment, then the answers follow the roles table`, async () => {
        const s = await sceneFor(app.url, actor);
        const { main, other } = await colocatedPair(s.project.id, s.owner);
        const path = `/api/projects/${s.project.id}/images/${main}/alignments/${other}`;
        const put = await s.client.request<any>('PUT', path, { pairs: TWO_PAIRS });
        const saveOutcome = expectedOutcome(actor, 'annotate');
        expect(put.status, `PUT: ${JSON.stringify(put.body)}`).to.equal(saveOutcome === 'allowed' ? 200 : saveOutcome);
        // Make sure there is one to read, whoever the actor is.
        if (saveOutcome !== 'allowed') await sql(`INSERT INTO image_alignments (project_id, image_id, other_image_id, kind, pairs, transform, saved_by) VALUES ($1, $2, $3, 'similarity', $4, '{}', $5)`, [s.project.id, main, other, JSON.stringify(TWO_PAIRS), s.owner.id]);
        const get = await s.client.get(path);
        const readOutcome = expectedOutcome(actor, 'read');
        expect(get.status).to.equal(readOutcome === 'allowed' ? 200 : readOutcome);
        const del = await s.client.delete(path);
        expect(del.status).to.equal(saveOutcome === 'allowed' ? 204 : saveOutcome);
      });
    }
  });
});
