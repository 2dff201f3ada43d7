import { expect } from 'chai';
import sharp from 'sharp';
import { addDefaultAnnotationClasses } from '../../../server/annotations/default-classes';
import { ProjectMembership } from '../../../server/projects/project-membership.entity';
import { PROJECT_ROLES, type ProjectAction } from '../../../shared/roles';
import { ApiClient, mountApp } from '../../support/api-client';
import { makeImageRow } from '../../support/catalogue-fixtures';
import { makeProject, makeUser, signedIn } from '../../support/fixtures';
import { runningServer } from '../../support/test-server';
import { sql } from '../db-state';
import { ACTORS, expectedOutcome, who, type Actor } from '../role-actors';
import { expectStatus, giveOriginal, measurementState } from './measurement-fixtures';

interface Scene {
  projectId: string;
  specimenId: string;
  imageId: string;
  measurementId: string;
}

const pattern = { type: 'lines', direction: 'horizontal', spacingUm: 50, count: 3 } as const;
const base = (s: Scene) => `/api/projects/${s.projectId}/images/${s.imageId}/measurements`;
const specimen = (s: Scene) => `/api/projects/${s.projectId}/specimens/${s.specimenId}`;

const ROUTES: { route: string; action: ProjectAction; ok: number; call(c: ApiClient, s: Scene): Promise<{ status: number; body: unknown }> }[] = [
  { route: 'GET …/measurements', action: 'read', ok: 200, call: (c, s) => c.get(base(s)) },
  { route: 'POST …/measurements', action: 'measure', ok: 201, call: (c, s) => c.post(base(s), { kind: 'intercept', pattern }) },
  { route: 'GET …/measurements/:id', action: 'read', ok: 200, call: (c, s) => c.get(`${base(s)}/${s.measurementId}`) },
  { route: 'PATCH …/measurements/:id', action: 'measure', ok: 200, call: (c, s) => c.patch(`${base(s)}/${s.measurementId}`, { version: 1, note: 'changed' }) },
  { route: 'DELETE …/measurements/:id', action: 'measure', ok: 204, call: (c, s) => c.delete(`${base(s)}/${s.measurementId}?version=1`) },
  { route: 'POST …/measurements/:id/recompute', action: 'measure', ok: 200, call: (c, s) => c.post(`${base(s)}/${s.measurementId}/recompute`, { version: 1 }) },
  { route: 'POST …/measurements/suggest', action: 'measure', ok: 200, call: (c, s) => c.post(`${base(s)}/suggest`, { pattern }) },
  { route: 'GET /specimens/:id/measurements/summary', action: 'read', ok: 200, call: (c, s) => c.get(`${specimen(s)}/measurements/summary`) },
  { route: 'GET /specimens/:id/measurements/summary.csv', action: 'read', ok: 200, call: (c, s) => c.get(`${specimen(s)}/measurements/summary.csv`) },
  { route: 'GET /specimens/:id/measurements.csv', action: 'read', ok: 200, call: (c, s) => c.get(`${specimen(s)}/measurements.csv`) },
];

describe('measurements: the roles matrix on every measurement route (from PERMISSIONS)', () => {
  let app: Awaited<ReturnType<typeof mountApp>>;
  before(async () => (app = await mountApp()));
  after(() => app.close());

  /** A project led by someone else, with one 400 × 300 px image (a real file behind it) and one measurement on it. */
  async function scene(): Promise<Scene> {
    const owner = await makeUser();
    const projectId = (await makeProject([[owner, 'lead']])).id;
    await addDefaultAnnotationClasses(runningServer().ctx.dataSource.manager, projectId);
    const imageId = await makeImageRow(projectId, owner, { width: 400, height: 300 }, 0.5);
    await giveOriginal(projectId, imageId, await sharp({ create: { width: 400, height: 300, channels: 3, background: '#808080' } }).png().toBuffer());
    const [{ specimen_id: specimenId }] = await sql<{ specimen_id: string }>('SELECT specimen_id FROM images WHERE id = $1', [imageId]);
    const created = await (await signedIn(app.url, owner)).post(`/api/projects/${projectId}/images/${imageId}/measurements`, { kind: 'intercept', pattern });
    expectStatus(created, 201);
    return { projectId, specimenId: specimenId!, imageId, measurementId: created.body.id };
  }

  async function clientFor(actor: Actor, s: Scene): Promise<ApiClient> {
    if (actor === 'signed-out') {
      const c = new ApiClient(app.url);
      await c.loadSession();
      return c;
    }
    const user = await makeUser(actor === 'site-admin' ? 'admin' : 'member');
    if ((PROJECT_ROLES as readonly string[]).includes(actor)) {
      await runningServer().ctx.dataSource.getRepository(ProjectMembership).insert({ projectId: s.projectId, userId: user.id, role: actor as never });
    }
    return signedIn(app.url, user);
  }

  for (const r of ROUTES) {
    describe(`${r.route} (needs ${r.action})`, () => {
      for (const actor of ACTORS) {
        const outcome = expectedOutcome(actor, r.action);
        it(`when a ${who(actor)} calls it, then ${outcome === 'allowed' ? r.ok : outcome}${outcome === 'allowed' ? '' : ' and nothing changes'}`, async () => {
          const s = await scene();
          const client = await clientFor(actor, s);
          const before = await measurementState(s.imageId);
          const res = await r.call(client, s);
          expect(res.status, JSON.stringify(res.body)).to.equal(outcome === 'allowed' ? r.ok : outcome);
          if (outcome !== 'allowed') expect(await measurementState(s.imageId)).to.deep.equal(before);
        });
      }
    });
  }
});
