import { expect } from 'chai';
import type { User } from '../../../server/auth/user.entity';
import { mountApp, type ApiResponse } from '../../support/api-client';
import { makeUser, unique } from '../../support/fixtures';
import { passwordTokens, sql, userIdByEmail, userState } from '../db-state';
import { expectApiError } from '../error-shape';
import { ACTORS, type Actor, type Scene, sceneFor, who } from '../role-actors';

/** One admin route: how to call it about a fresh target user, and how to see that it acted. */
interface AdminRoute {
  route: string;
  okStatus: number;
  call(scene: Scene, target: User, email: string): Promise<ApiResponse>;
  acted(res: ApiResponse, target: User, email: string): Promise<void>;
}

const ROUTES: AdminRoute[] = [
  {
    route: 'GET /api/admin/users',
    okStatus: 200,
    call: (s, target) => s.client.get(`/api/admin/users?q=${encodeURIComponent(target.email)}`),
    acted: async (res, target) => {
      expect(res.body.items.map((u: { id: string }) => u.id)).to.deep.equal([target.id]);
    },
  },
  {
    route: 'POST /api/admin/users',
    okStatus: 201,
    call: (s, _t, email) => s.client.post('/api/admin/users', { email, displayName: 'Invited by the matrix' }),
    acted: async (_res, _t, email) => {
      expect(await userIdByEmail(email)).to.be.a('string');
    },
  },
  {
    route: 'PATCH /api/admin/users/:id',
    okStatus: 200,
    call: (s, target) => s.client.patch(`/api/admin/users/${target.id}`, { displayName: 'Renamed by the matrix' }),
    acted: async (_res, target) => {
      expect((await userState(target.id))!['display_name']).to.equal('Renamed by the matrix');
    },
  },
  {
    route: 'POST /api/admin/users/:id/reset',
    okStatus: 202,
    call: (s, target) => s.client.post(`/api/admin/users/${target.id}/reset`),
    acted: async (_res, target) => {
      expect(await passwordTokens(target.id)).to.have.length(1);
    },
  },
  {
    route: 'GET /api/admin/mail',
    okStatus: 200,
    call: (s) => s.client.get('/api/admin/mail'),
    acted: async (res) => {
      expect(res.body).to.be.an('array');
    },
  },
];

function outcome(actor: Actor): 'allowed' | 401 | 403 {
  if (actor === 'signed-out') return 401;
  return actor === 'site-admin' ? 'allowed' : 403;
}

describe('admin: only site admins reach /api/admin, whatever their project roles', () => {
  let app: Awaited<ReturnType<typeof mountApp>>;
  before(async () => (app = await mountApp()));
  after(() => app.close());

  for (const r of ROUTES) {
    describe(r.route, () => {
      for (const actor of ACTORS) {
        const expected = outcome(actor);
        const title = expected === 'allowed' ? `when a ${who(actor)} calls it, then ${r.okStatus} and it acts` : `when a ${who(actor)} calls it, then ${expected} and nothing changes`;
        it(title, async () => {
          const scene = await sceneFor(app.url, actor);
          const target = await makeUser();
          const email = `invitee-${unique()}@example.test`;
          const before = await userState(target.id);

          const res = await r.call(scene, target, email);

          if (expected === 'allowed') {
            expect(res.status, JSON.stringify(res.body)).to.equal(r.okStatus);
            await r.acted(res, target, email);
          } else {
            expectApiError(res, expected, expected === 401 ? 'not_signed_in' : 'forbidden');
            expect(await userState(target.id)).to.deep.equal(before);
            expect(await passwordTokens(target.id)).to.have.length(0);
            expect(await sql('SELECT 1 FROM users WHERE email = $1', [email])).to.have.length(0);
          }
        });
      }
    });
  }
});
