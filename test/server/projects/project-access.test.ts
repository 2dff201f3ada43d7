import { expect } from 'chai';
import { mountApp, type ApiResponse } from '../../support/api-client';
import { makeUser, unique } from '../../support/fixtures';
import type { ProjectAction } from '../../../shared/roles';
import { projectIdByCode, projectState, sql } from '../db-state';
import { expectApiError } from '../error-shape';
import { ACTORS, expectedAllowed, expectedOutcome, type Scene, sceneFor, who } from '../role-actors';

/** One project route: what it needs, how to call it, and how to see that it did (or did not) act. */
interface RouteCase {
  route: string;
  action: ProjectAction;
  okStatus: number;
  arrange?: () => Promise<{ email: string }>;
  call(scene: Scene, extra: { email: string } | undefined): Promise<ApiResponse>;
  acted(scene: Scene, res: ApiResponse, extra: { email: string } | undefined): Promise<void>;
}

const ROUTES: RouteCase[] = [
  {
    route: 'GET /api/projects/:id',
    action: 'read',
    okStatus: 200,
    call: (s) => s.client.get(`/api/projects/${s.project.id}`),
    acted: async (s, res) => {
      expect(res.body.id).to.equal(s.project.id);
    },
  },
  {
    route: 'PATCH /api/projects/:id',
    action: 'editProject',
    okStatus: 200,
    call: (s) => s.client.patch(`/api/projects/${s.project.id}`, { name: 'Renamed by the matrix' }),
    acted: async (s) => {
      expect((await sql('SELECT name FROM projects WHERE id = $1', [s.project.id]))[0]!['name']).to.equal('Renamed by the matrix');
    },
  },
  {
    route: 'POST /api/projects/:id/members',
    action: 'manageMembers',
    okStatus: 201,
    arrange: () => makeUser(),
    call: (s, newcomer) => s.client.post(`/api/projects/${s.project.id}/members`, { email: newcomer!.email, role: 'guest' }),
    acted: async (s, _res, newcomer) => {
      const rows = await sql('SELECT 1 FROM project_memberships m JOIN users u ON u.id = m.user_id WHERE m.project_id = $1 AND u.email = $2', [s.project.id, newcomer!.email]);
      expect(rows).to.have.length(1);
    },
  },
  {
    route: 'PATCH /api/projects/:id/members/:userId',
    action: 'manageMembers',
    okStatus: 200,
    call: (s) => s.client.patch(`/api/projects/${s.project.id}/members/${s.target.id}`, { role: 'researcher' }),
    acted: async (s) => {
      const rows = await sql('SELECT role FROM project_memberships WHERE project_id = $1 AND user_id = $2', [s.project.id, s.target.id]);
      expect(rows[0]!['role']).to.equal('researcher');
    },
  },
  {
    route: 'DELETE /api/projects/:id/members/:userId',
    action: 'manageMembers',
    okStatus: 204,
    call: (s) => s.client.delete(`/api/projects/${s.project.id}/members/${s.target.id}`),
    acted: async (s) => {
      expect(await sql('SELECT 1 FROM project_memberships WHERE project_id = $1 AND user_id = $2', [s.project.id, s.target.id])).to.have.length(0);
    },
  },
];

describe('projects: the roles matrix on every project route (from PERMISSIONS)', () => {
  let app: Awaited<ReturnType<typeof mountApp>>;
  before(async () => (app = await mountApp()));
  after(() => app.close());

  for (const r of ROUTES) {
    describe(`${r.route} (needs ${r.action})`, () => {
      for (const actor of ACTORS) {
        const outcome = expectedOutcome(actor, r.action);
        const title =
          outcome === 'allowed'
            ? `when a ${who(actor)} calls it, then ${r.okStatus} and it takes effect`
            : `when a ${who(actor)} calls it, then ${outcome} and nothing changes`;
        it(title, async () => {
          const scene = await sceneFor(app.url, actor);
          const extra = await r.arrange?.();
          const before = await projectState(scene.project.id);

          const res = await r.call(scene, extra);

          if (outcome === 'allowed') {
            expect(res.status, JSON.stringify(res.body)).to.equal(r.okStatus);
            await r.acted(scene, res, extra);
          } else {
            const code = { 401: 'not_signed_in', 403: 'forbidden', 404: 'not_found' } as const;
            expectApiError(res, outcome, code[outcome]);
            expect(await projectState(scene.project.id)).to.deep.equal(before);
          }
        });
      }
    });
  }

  describe('GET /api/projects/:id tells each role what it may do', () => {
    for (const actor of ['lead', 'researcher', 'reviewer', 'guest', 'site-admin'] as const) {
      it(`when a ${who(actor)} opens the project, then "allowed" lists exactly the actions PERMISSIONS gives them`, async () => {
        const scene = await sceneFor(app.url, actor);
        const res = await scene.client.get(`/api/projects/${scene.project.id}`);
        expect(res.status).to.equal(200);
        expect(res.body.allowed).to.deep.equal(expectedAllowed(actor));
        expect(res.body.myRole).to.equal(actor === 'site-admin' ? null : actor);
      });
    }
  });

  describe('GET and POST /api/projects (no project yet, so only signed-in matters)', () => {
    for (const actor of ACTORS) {
      const signedOut = actor === 'signed-out';
      it(`when a ${who(actor)} lists projects, then ${signedOut ? '401' : '200 with a page'}`, async () => {
        const { client } = await sceneFor(app.url, actor);
        const res = await client.get('/api/projects');
        if (signedOut) expectApiError(res, 401, 'not_signed_in');
        else {
          expect(res.status).to.equal(200);
          expect(res.body).to.include.keys('items', 'total', 'page', 'pageSize');
        }
      });

      it(`when a ${who(actor)} creates a project, then ${signedOut ? '401 and nothing is stored' : '201 and they are its lead'}`, async () => {
        const { client, user } = await sceneFor(app.url, actor);
        const code = `MX-${unique().toUpperCase()}`;

        const res = await client.post('/api/projects', { code, name: 'Matrix creation' });

        if (signedOut) {
          expectApiError(res, 401, 'not_signed_in');
          expect(await projectIdByCode(code)).to.equal(null);
        } else {
          expect(res.status).to.equal(201);
          const rows = await sql('SELECT role FROM project_memberships WHERE project_id = $1 AND user_id = $2', [res.body.id, user!.id]);
          expect(rows).to.deep.equal([{ role: 'lead' }]);
        }
      });
    }
  });
});
