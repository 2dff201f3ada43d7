import { mkdtemp, writeFile } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import { expect } from 'chai';
import sharp from 'sharp';
import type { ProjectAction } from '../../../shared/roles';
import { PROJECT_ROLES } from '../../../shared/roles';
import { Image } from '../../../server/images/image.entity';
import { imageKeys } from '../../../server/images/image-keys';
import { ApiClient, mountApp } from '../../support/api-client';
import { makeUser, signedIn, unique } from '../../support/fixtures';
import { runningServer } from '../../support/test-server';
import { sql } from '../db-state';
import { ACTORS, expectedOutcome, type Actor, who } from '../role-actors';
import { archiveScene, fieldsFor, png, upload, type ArchiveScene } from './image-fixtures';
import { ProjectMembership } from '../../../server/projects/project-membership.entity';

/** A ready 256 px image made directly (row + files), so each route has something real to act on. */
async function readyImage(s: ArchiveScene): Promise<string> {
  const ctx = runningServer().ctx;
  const sha = Array.from({ length: 8 }, unique).join('').slice(0, 64);
  const image = await ctx.dataSource.getRepository(Image).save({
    projectId: s.project.id, specimenId: s.specimenId, uploaderId: s.user.id, modality: 'other', originalName: 'r.png', sha256: sha, byteSize: '10',
    format: 'png', width: 256, height: 256, bitDepth: 8, channels: 3, originalKey: imageKeys.original(s.project.id, sha), state: 'failed', failureReason: 'simulated', pyramidLevels: 9,
  } as Partial<Image>);
  const dir = await mkdtemp(path.join(os.tmpdir(), 'etchfile-roles-'));
  const jpg = await sharp({ create: { width: 4, height: 4, channels: 3, background: '#888' } }).jpeg().toBuffer();
  for (const key of [imageKeys.original(s.project.id, sha), imageKeys.thumbnail(s.project.id, image.id), imageKeys.preview(s.project.id, image.id), imageKeys.tile(s.project.id, image.id, 8, 0, 0)]) {
    const f = path.join(dir, unique());
    await writeFile(f, jpg);
    await ctx.files.putFile(key, f, 'image/jpeg');
  }
  return image.id;
}

interface RouteCase {
  route: string;
  action: ProjectAction;
  ok: number;
  /** Whether the route needs the image ready (the others act on the failed image, so retry is possible). */
  ready?: boolean;
  call(c: ApiClient, s: ArchiveScene, id: string): Promise<{ status: number }>;
}

const base = (s: ArchiveScene, id: string) => `/api/projects/${s.project.id}/images/${id}`;
const ROUTES: RouteCase[] = [
  { route: 'GET /images', action: 'read', ok: 200, call: (c, s) => c.get(`/api/projects/${s.project.id}/images`) },
  { route: 'POST /images (upload)', action: 'upload', ok: 201, call: async (c, s) => upload(c, s.project.id, await png(64, 64), 'r.png', fieldsFor(s)) },
  { route: 'GET /images/:id', action: 'read', ok: 200, call: (c, s, id) => c.get(base(s, id)) },
  { route: 'PATCH /images/:id', action: 'editMetadata', ok: 200, call: (c, s, id) => c.patch(base(s, id), { notes: 'changed' }) },
  { route: 'DELETE /images/:id', action: 'delete', ok: 204, call: (c, s, id) => c.delete(base(s, id)) },
  { route: 'POST /images/:id/retry', action: 'upload', ok: 202, call: (c, s, id) => c.post(base(s, id) + '/retry') },
  { route: 'GET /images/:id/original', action: 'read', ok: 200, call: (c, s, id) => c.get(base(s, id) + '/original') },
  { route: 'GET /images/:id/thumbnail', action: 'read', ok: 200, ready: true, call: (c, s, id) => c.get(base(s, id) + '/thumbnail') },
  { route: 'GET /images/:id/preview', action: 'read', ok: 200, ready: true, call: (c, s, id) => c.get(base(s, id) + '/preview') },
  { route: 'GET /images/:id/tiles/:level/:tile', action: 'read', ok: 200, ready: true, call: (c, s, id) => c.get(base(s, id) + '/tiles/8/0_0.jpg') },
  { route: 'GET /images/:id/tiles.dzi', action: 'read', ok: 200, ready: true, call: (c, s, id) => c.get(base(s, id) + '/tiles.dzi') },
  { route: 'GET /images/:id/iiif/info.json', action: 'read', ok: 200, ready: true, call: (c, s, id) => c.get(base(s, id) + '/iiif/info.json') },
  { route: 'GET /images/:id/iiif/…/default.jpg', action: 'read', ok: 200, ready: true, call: (c, s, id) => c.get(base(s, id) + '/iiif/full/256,256/0/default.jpg') },
];

describe('images: the roles matrix on every image route (from PERMISSIONS)', () => {
  let app: Awaited<ReturnType<typeof mountApp>>;
  before(async () => (app = await mountApp()));
  after(() => app.close());

  for (const r of ROUTES) {
    describe(`${r.route} (needs ${r.action})`, () => {
      for (const actor of ACTORS) {
        const outcome = expectedOutcome(actor, r.action);
        it(`when a ${who(actor)} calls it, then ${outcome === 'allowed' ? r.ok : outcome}`, async () => {
          const s = await archiveScene(app.url, 'lead');
          const id = await readyImage(s);
          if (r.ready) await sql(`UPDATE images SET state = 'ready', failure_reason = NULL WHERE id = $1`, [id]);
          const client = await clientFor(app.url, actor, s);
          const before = await sql('SELECT * FROM images WHERE project_id = $1 ORDER BY id', [s.project.id]);
          const res = await r.call(client, s, id);
          expect(res.status, JSON.stringify((res as { body?: unknown }).body)).to.equal(outcome === 'allowed' ? r.ok : outcome);
          if (outcome !== 'allowed') expect(await sql('SELECT * FROM images WHERE project_id = $1 ORDER BY id', [s.project.id])).to.deep.equal(before);
        });
      }
    });
  }
});

async function clientFor(url: string, actor: Actor, s: ArchiveScene): Promise<ApiClient> {
  if (actor === 'signed-out') {
    const c = new ApiClient(url);
    await c.loadSession();
    return c;
  }
  const user = await makeUser(actor === 'site-admin' ? 'admin' : 'member');
  if ((PROJECT_ROLES as readonly string[]).includes(actor)) {
    await runningServer().ctx.dataSource.getRepository(ProjectMembership).insert({ projectId: s.project.id, userId: user.id, role: actor as never });
  }
  return signedIn(url, user);
}
