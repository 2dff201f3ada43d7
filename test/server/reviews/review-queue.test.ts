import { expect } from 'chai';
import type { User } from '../../../server/auth/user.entity';
import { ApiClient, mountApp } from '../../support/api-client';
import { makeImageRow } from '../../support/catalogue-fixtures';
import { makeProject, makeUser, signedIn } from '../../support/fixtures';
import { sql } from '../db-state';
import { expectApiError, fieldsOf } from '../error-shape';
import { ACTORS, expectedOutcome, isProjectRole, who } from '../role-actors';
import { move } from './review-fixtures';

describe('reviews: the reviewer’s queue', () => {
  let app: Awaited<ReturnType<typeof mountApp>>;
  let reviewer: ApiClient;
  let submitters: { one: User; two: User };
  let projects: { p1: string; p2: string; elsewhere: string };
  /** Image ids by letter, in the order they were submitted. */
  const images: Record<string, string> = {};

  /** An image in `projectId` of `modality`, submitted by `by` (each submission later than the one before). */
  async function submitted(projectId: string, by: User, modality: string): Promise<string> {
    const imageId = await makeImageRow(projectId, by);
    await sql('UPDATE images SET modality = $2 WHERE id = $1', [imageId, modality]);
    await move(await signedIn(app.url, by), { projectId }, imageId, 'submit');
    return imageId;
  }

  before(async () => {
    app = await mountApp();
    const [v, one, two, other] = await Promise.all([makeUser(), makeUser(), makeUser(), makeUser()]);
    submitters = { one, two };
    projects = {
      p1: (await makeProject([[v, 'reviewer'], [one, 'researcher'], [two, 'researcher']])).id,
      p2: (await makeProject([[v, 'reviewer'], [two, 'lead']])).id,
      // Here the reviewer is a researcher: its submissions are not theirs to review.
      elsewhere: (await makeProject([[v, 'researcher'], [other, 'lead']])).id,
    };
    reviewer = await signedIn(app.url, v);
    images['a'] = await submitted(projects.p1, one, 'sem_secondary');
    images['b'] = await submitted(projects.p2, two, 'lom_bright_field');
    images['c'] = await submitted(projects.p1, two, 'lom_bright_field');
    images['d'] = await submitted(projects.elsewhere, other, 'lom_bright_field');
    images['e'] = await submitted(projects.p1, one, 'ebsd_phase');
    await move(reviewer, { projectId: projects.p1 }, images['e']!, 'clear');
    images['f'] = await makeImageRow(projects.p1, one);
  });
  after(() => app.close());

  const ids = (body: { items: { subjectId: string }[] }) => body.items.map((i) => Object.keys(images).find((k) => images[k] === i.subjectId));

  it('when a reviewer opens the queue, then it lists what waits for them in every project they review, oldest submission first', async () => {
    const res = await reviewer.get('/api/review-queue');
    expect(res.status).to.equal(200);
    expect(ids(res.body)).to.deep.equal(['a', 'b', 'c']);
    expect(res.body).to.include({ total: 3, page: 0, pageSize: 20 });
    expect(res.body.items[0]).to.deep.include({ projectId: projects.p1, modality: 'sem_secondary', subjectType: 'image', name: 'fixture.tif', openThreads: 0, submittedBy: { id: submitters.one.id, name: submitters.one.displayName } });
    expect(res.body.items[0].specimenCode).to.match(/^SP-/);
  });

  for (const [title, query, expected] of [
    ['one project', () => `projectId=${projects.p1}`, ['a', 'c']],
    ['one modality', () => 'modality=lom_bright_field', ['b', 'c']],
    ['two modalities', () => 'modality=lom_bright_field,sem_secondary', ['a', 'b', 'c']],
    ['one submitter', () => `submitterId=${submitters.two.id}`, ['b', 'c']],
    ['project, modality and submitter together', () => `projectId=${projects.p1}&modality=lom_bright_field&submitterId=${submitters.one.id}`, []],
  ] as const) {
    it(`when the queue is filtered by ${title}, then only those images remain, in the same order`, async () => {
      const res = await reviewer.get(`/api/review-queue?${query()}`);
      expect(res.status).to.equal(200);
      expect(ids(res.body)).to.deep.equal(expected);
      expect(res.body.total).to.equal(expected.length);
    });
  }

  it('when the queue is paged, then each page continues where the last stopped and the total stays', async () => {
    const second = (await reviewer.get('/api/review-queue?pageSize=2&page=1')).body;
    expect(ids(second)).to.deep.equal(['c']);
    expect(second.total).to.equal(3);
  });

  it('when a reviewer decides on an image, then it leaves the queue; a new submission joins at the end', async () => {
    const [x, y] = [await submitted(projects.p2, submitters.two, 'other'), await submitted(projects.p2, submitters.two, 'other')];
    await move(reviewer, { projectId: projects.p2 }, x, 'request-changes', 'Add the scale bar.');
    const queue = (await reviewer.get(`/api/review-queue?projectId=${projects.p2}`)).body;
    expect(queue.items.map((i: { subjectId: string }) => i.subjectId)).to.deep.equal([images['b'], y]);
  });

  for (const [title, query, field] of [
    ['a page size of 0', 'pageSize=0', 'query.pageSize'],
    ['an unknown modality', 'modality=xray', 'query.modality.0'],
    ['a project id that is not one', 'projectId=KV-LAM-24', 'query.projectId'],
    ['an unknown field', 'state=cleared', 'query'],
  ] as const) {
    it(`when the queue is asked for with ${title}, then 422 naming ${field}`, async () => {
      const res = await reviewer.get(`/api/review-queue?${query}`);
      expectApiError(res, 422, 'validation_failed');
      expect(fieldsOf(res)).to.deep.equal([field]);
    });
  }

  // One project's queue is a reviewer's view of it: the roles matrix for 'decideReview' decides who may ask.
  for (const actor of ACTORS) {
    const outcome = expectedOutcome(actor, 'decideReview');
    it(`when a ${who(actor)} asks for one project’s queue, then ${outcome === 'allowed' ? 200 : outcome}`, async () => {
      const user = actor === 'signed-out' ? null : await makeUser(actor === 'site-admin' ? 'admin' : 'member');
      const lead = await makeUser();
      const projectId = (await makeProject(user && isProjectRole(actor) ? [[lead, 'lead'], [user, actor]] : [[lead, 'lead']])).id;
      const client = user ? await signedIn(app.url, user) : new ApiClient(app.url);
      const res = await client.get(`/api/review-queue?projectId=${projectId}`);
      expect(res.status, JSON.stringify(res.body)).to.equal(outcome === 'allowed' ? 200 : outcome);
      if (outcome === 403) expect(res.body.error.message).to.contain('does not review');
    });
  }

  it('when a signed-in person reviews nowhere, then their queue is empty', async () => {
    const nobody = await signedIn(app.url, await makeUser());
    expect((await nobody.get('/api/review-queue')).body).to.deep.equal({ items: [], total: 0, page: 0, pageSize: 20 });
  });
});
