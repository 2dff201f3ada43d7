import { expect } from 'chai';
import type { ProjectAction } from '../../../shared/roles';
import type { ApiClient } from '../../support/api-client';
import { mountApp } from '../../support/api-client';
import { ACTORS, expectedOutcome, sceneFor, who, type Scene } from '../role-actors';

/** One review or comment route: the permission it needs, its success status, what it needs to be possible, and the call. */
export interface ReviewRouteCase<R> {
  route: string;
  action: ProjectAction;
  ok: number;
  /** The review state the subject must be in for the move to be possible. */
  state?: 'with_reviewers' | 'cleared';
  /** The status the thread must have for the route to be possible. */
  thread?: 'open' | 'resolved';
  call(c: ApiClient, s: Scene, r: R): Promise<{ status: number; body: unknown }>;
}

/**
 * Calls every route as every kind of caller (shared/roles.ts PERMISSIONS via role-actors): allowed callers
 * get `ok`, the others the status the matrix names, and then `records` must read as before the call.
 * `on` names the subject in the titles ('' for images, as their tests have always read).
 */
export function eachReviewRouteForEachActor<R>(
  routes: readonly ReviewRouteCase<R>[],
  ready: (s: Scene, r: ReviewRouteCase<R>) => Promise<R>,
  records: (s: Scene, target: R) => Promise<unknown>,
  on: '' | 'figure' = '',
): void {
  let app: Awaited<ReturnType<typeof mountApp>>;
  before(async () => (app = await mountApp()));
  after(() => app.close());

  for (const r of routes) {
    describe(`${on ? `${on} ` : ''}${r.route} (needs ${r.action})`, () => {
      for (const actor of ACTORS) {
        const outcome = expectedOutcome(actor, r.action);
        it(`when a ${who(actor)} calls it${on ? ` on a ${on}` : ''}, then ${outcome === 'allowed' ? r.ok : outcome}${outcome === 'allowed' ? '' : ' and nothing changes'}`, async () => {
          const s = await sceneFor(app.url, actor);
          const target = await ready(s, r);
          const before = await records(s, target);
          const res = await r.call(s.client, s, target);
          expect(res.status, JSON.stringify(res.body)).to.equal(outcome === 'allowed' ? r.ok : outcome);
          if (outcome !== 'allowed') expect(await records(s, target)).to.deep.equal(before);
        });
      }
    });
  }
}
