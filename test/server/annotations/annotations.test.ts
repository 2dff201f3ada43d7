import { expect } from 'chai';
import { addDefaultAnnotationClasses } from '../../../server/annotations/default-classes';
import { Annotation } from '../../../server/annotations/annotation.entity';
import { mountApp, type ApiClient } from '../../support/api-client';
import { makeImageRow } from '../../support/catalogue-fixtures';
import { makeProject, makeUser, signedIn } from '../../support/fixtures';
import { runningServer } from '../../support/test-server';

describe('annotations: shapes on an image', () => {
  let app: Awaited<ReturnType<typeof mountApp>>;
  let researcher: ApiClient;
  let lead: ApiClient;
  let reviewer: ApiClient;
  let guest: ApiClient;
  let projectId: string;
  let imageId: string;
  let classes: Record<string, string>;
  const repo = () => runningServer().ctx.dataSource.getRepository(Annotation);
  const shapes = () => `/api/projects/${projectId}/images/${imageId}/annotations`;

  before(async () => {
    app = await mountApp();
    const [r, l, v, g] = await Promise.all([makeUser(), makeUser(), makeUser(), makeUser()]);
    projectId = (await makeProject([[r, 'researcher'], [l, 'lead'], [v, 'reviewer'], [g, 'guest']])).id;
    await addDefaultAnnotationClasses(runningServer().ctx.dataSource.manager, projectId);
    imageId = await makeImageRow(projectId, r);
    [researcher, lead, reviewer, guest] = await Promise.all([signedIn(app.url, r), signedIn(app.url, l), signedIn(app.url, v), signedIn(app.url, g)]);
    const list = (await guest.get(`/api/projects/${projectId}/annotation-classes`)).body as { id: string; name: string }[];
    classes = Object.fromEntries(list.map((c) => [c.name, c.id]));
  });
  after(() => app.close());

  const interface1 = () => ({ classId: classes['Bond interface'], kind: 'polyline', points: [[0, 1500], [2000, 1480], [4000, 1510]] });
  const oxide = () => ({ classId: classes['Oxide particle'], kind: 'polygon', points: [[100, 100], [140, 100], [140, 130], [100, 130]] });

  it('when a project starts, then it has the usual classes', () => {
    expect(Object.keys(classes)).to.include.members(['Bond interface', 'Oxide particle', 'Oxide chain', 'Deformation zone', 'Crack / delamination', 'Pore', 'Layer', 'Note']);
  });

  it('when a researcher draws an interface and an outline, then both read back with author and version 1', async () => {
    const a = await researcher.post(shapes(), interface1());
    const b = await researcher.post(shapes(), oxide());
    expect(a.status).to.equal(201);
    expect(b.status).to.equal(201);
    expect(a.body).to.include({ version: 1, kind: 'polyline' });
    const list = await guest.get(shapes());
    expect(list.body.map((x: { id: string }) => x.id)).to.include.members([a.body.id, b.body.id]);
  });

  it('when a reviewer or guest draws, then 403 and nothing is stored', async () => {
    const before = await repo().countBy({ imageId });
    expect((await reviewer.post(shapes(), interface1())).status).to.equal(403);
    expect((await guest.post(shapes(), interface1())).status).to.equal(403);
    expect(await repo().countBy({ imageId })).to.equal(before);
  });

  for (const [title, body, text] of [
    ['a self-crossing outline', { kind: 'polygon', points: [[0, 0], [10, 10], [10, 0], [0, 10]] }, 'crosses itself'],
    ['an outline with no area', { kind: 'polygon', points: [[0, 0], [5, 5], [10, 10]] }, 'no area'],
    ['a point outside the image', { kind: 'polygon', points: [[0, 0], [5000, 0], [0, 10]] }, 'outside the image'],
    ['a zero-length line', { kind: 'polyline', points: [[5, 5], [5, 5]], cls: 'Bond interface' }, 'zero length'],
    ['a line for an outline class', { kind: 'polyline', points: [[5, 5], [50, 5]], cls: 'Layer' }, 'cannot be'],
  ] as const) {
    it(`when a shape is ${title}, then 422 saying so and nothing is stored`, async () => {
      const before = await repo().countBy({ imageId });
      const cls = 'cls' in body ? body.cls : 'Oxide particle';
      const res = await researcher.post(shapes(), { classId: classes[cls], kind: body.kind, points: body.points });
      expect(res.status).to.equal(422);
      expect(res.body.error.message).to.contain(text);
      expect(await repo().countBy({ imageId })).to.equal(before);
    });
  }

  it('when two people edit the same shape, then the second gets 409 and the first edit stays', async () => {
    const created = (await researcher.post(shapes(), oxide())).body;
    const first = await researcher.patch(`${shapes()}/${created.id}`, { version: 1, label: 'first' });
    expect(first.status).to.equal(200);
    expect(first.body.version).to.equal(2);
    const second = await lead.patch(`${shapes()}/${created.id}`, { version: 1, label: 'second' });
    expect(second.status).to.equal(409);
    expect(second.body.error.message).to.match(/changed this shape after you loaded it/);
    expect((await repo().findOneByOrFail({ id: created.id })).label).to.equal('first');
  });

  it('when a shape is deleted with a stale version, then 409 and it stays; with the current one it goes', async () => {
    const created = (await researcher.post(shapes(), oxide())).body;
    await researcher.patch(`${shapes()}/${created.id}`, { version: 1, label: 'moved' });
    expect((await lead.delete(`${shapes()}/${created.id}?version=1`)).status).to.equal(409);
    expect(await repo().existsBy({ id: created.id })).to.equal(true);
    expect((await lead.delete(`${shapes()}/${created.id}?version=2`)).status).to.equal(204);
    expect(await repo().existsBy({ id: created.id })).to.equal(false);
  });

  it('when a class in use is deleted, then 409; with moveTo its shapes move and it goes', async () => {
    const cls = (await lead.post(`/api/projects/${projectId}/annotation-classes`, { name: 'Martensite island', colour: 'magenta', shapeKind: 'outline' })).body;
    expect((await researcher.post(`/api/projects/${projectId}/annotation-classes`, { name: 'x', colour: 'lime', shapeKind: 'line' })).status).to.equal(403);
    const shape = (await researcher.post(shapes(), { ...oxide(), classId: cls.id })).body;
    const refused = await lead.delete(`/api/projects/${projectId}/annotation-classes/${cls.id}`);
    expect(refused.status).to.equal(409);
    expect(await repo().existsBy({ id: shape.id, classId: cls.id })).to.equal(true);
    const moved = await lead.delete(`/api/projects/${projectId}/annotation-classes/${cls.id}?moveTo=${classes['Deformation zone']}`);
    expect(moved.status).to.equal(204);
    expect((await repo().findOneByOrFail({ id: shape.id })).classId).to.equal(classes['Deformation zone']);
  });

  it('when the image is not in the project, then 404', async () => {
    const res = await researcher.post(`/api/projects/${projectId}/images/${crypto.randomUUID()}/annotations`, interface1());
    expect(res.status).to.equal(404);
  });
});
