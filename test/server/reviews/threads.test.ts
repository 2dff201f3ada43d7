import { expect } from 'chai';
import { mountApp } from '../../support/api-client';
import { makeImageRow } from '../../support/catalogue-fixtures';
import { makeProject, makeUser } from '../../support/fixtures';
import { sql } from '../db-state';
import { expectApiError, fieldsOf } from '../error-shape';
import { measurementRow, notificationsFor, reviewRecords, reviewScene, threadsPath, type ReviewScene } from './review-fixtures';

describe('reviews: comment threads pinned to an image', () => {
  let app: Awaited<ReturnType<typeof mountApp>>;
  let s: ReviewScene;
  const fresh = () => makeImageRow(s.projectId, s.people.researcher, { width: 2000, height: 1500 }, 0.5);
  const point = (at: [number, number] = [100, 200]) => ({ kind: 'point', at });

  before(async () => {
    app = await mountApp();
    s = await reviewScene(app.url);
  });
  after(() => app.close());

  it('when a reviewer pins a thread to a point and mentions the researcher, then it reads back open, with the mention by name, and the researcher is told', async () => {
    const imageId = await fresh();
    const res = await s.reviewer.post(threadsPath(s, imageId), { anchor: point(), body: '  Is this dark line a crack or a scratch?  ', mentions: [s.people.researcher.id] });

    expect(res.status, JSON.stringify(res.body)).to.equal(201);
    expect(res.body).to.deep.include({ imageId, status: 'open', anchor: point(), anchorPresent: true, resolvedBy: null });
    expect(res.body.comments).to.have.length(1);
    expect(res.body.comments[0]).to.deep.include({ body: 'Is this dark line a crack or a scratch?', author: { id: s.people.reviewer.id, name: s.people.reviewer.displayName } });
    expect(res.body.comments[0].mentions).to.deep.equal([{ id: s.people.researcher.id, name: s.people.researcher.displayName }]);
    expect((await s.guest.get(threadsPath(s, imageId))).body.map((t: { id: string }) => t.id)).to.deep.equal([res.body.id]);
    const told = await notificationsFor(s.people.researcher.id, imageId);
    expect(told.map((n) => [n.kind, n.thread_id, n.facts['excerpt']])).to.deep.equal([['mention', res.body.id, 'Is this dark line a crack or a scratch?']]);
    const [activity] = await sql<{ action: string; summary: string }>('SELECT action, summary FROM activity_events WHERE image_id = $1', [imageId]);
    expect(activity).to.deep.equal({ action: 'comment.added', summary: 'opened a thread on a point (100, 200)' });
  });

  it('when threads are pinned to a region and to a measurement, then both keep their anchors, and a deleted measurement leaves its thread', async () => {
    const imageId = await fresh();
    const measurementId = await measurementRow(s, imageId);
    const ring = [[100, 100], [400, 100], [400, 300], [100, 300]];
    const region = await s.researcher.post(threadsPath(s, imageId), { anchor: { kind: 'region', ring }, body: 'Oxide chain along the interface.' });
    const onMeasurement = await s.reviewer.post(threadsPath(s, imageId), { anchor: { kind: 'measurement', measurementId }, body: 'Five fields are too few here.' });
    expect([region.status, onMeasurement.status]).to.deep.equal([201, 201]);
    expect(region.body.anchor).to.deep.equal({ kind: 'region', ring });

    await sql('DELETE FROM measurements WHERE id = $1', [measurementId]);
    const [, pinned] = (await s.guest.get(threadsPath(s, imageId))).body;
    expect(pinned).to.deep.include({ id: onMeasurement.body.id, anchor: { kind: 'measurement', measurementId }, anchorPresent: false });
  });

  it('when a member replies, then the reply follows the first comment, those mentioned hear of the mention and everyone else in the thread of the reply', async () => {
    const imageId = await fresh();
    const opened = (await s.reviewer.post(threadsPath(s, imageId), { anchor: point(), body: 'Which etchant?', mentions: [s.people.lead.id] })).body;
    const reply = await s.researcher.post(`${threadsPath(s, imageId)}/${opened.id}/comments`, { body: 'Beraha, 12 s. @guest can confirm.', mentions: [s.people.guest.id] });

    expect(reply.status, JSON.stringify(reply.body)).to.equal(201);
    expect(reply.body.comments.map((c: { body: string }) => c.body)).to.deep.equal(['Which etchant?', 'Beraha, 12 s. @guest can confirm.']);
    const kinds = async (who: keyof ReviewScene['people']) => (await notificationsFor(s.people[who].id, imageId)).map((n) => n.kind);
    expect(await kinds('guest')).to.deep.equal(['mention']);
    expect(await kinds('reviewer')).to.deep.equal(['reply']);
    expect(await kinds('lead')).to.deep.equal(['mention', 'reply']);
    expect(await kinds('researcher'), 'nobody hears of their own comment').to.deep.equal([]);
  });

  it('when a thread is resolved and reopened, then its status, who resolved it and the open counts follow', async () => {
    const imageId = await fresh();
    const other = await fresh();
    const [a, b] = [(await s.reviewer.post(threadsPath(s, imageId), { anchor: point(), body: 'One.' })).body, (await s.reviewer.post(threadsPath(s, imageId), { anchor: point([5, 5]), body: 'Two.' })).body];
    await s.reviewer.post(threadsPath(s, other), { anchor: point(), body: 'Three.' });
    const counts = () => s.guest.get(`/api/projects/${s.projectId}/comment-counts?imageId=${imageId},${other}`);
    const before = (await counts()).body;
    expect(before.images).to.deep.equal({ [imageId]: 2, [other]: 1 });

    const resolved = await s.researcher.post(`${threadsPath(s, imageId)}/${a.id}/resolve`);
    expect(resolved.status).to.equal(200);
    expect(resolved.body).to.deep.include({ status: 'resolved', resolvedBy: { id: s.people.researcher.id, name: s.people.researcher.displayName } });
    const after = (await counts()).body;
    expect(after.images).to.deep.equal({ [imageId]: 1, [other]: 1 });
    expect(after.unresolved).to.equal(before.unresolved - 1);
    expect((await s.guest.get(`${threadsPath(s, imageId)}?status=open`)).body.map((t: { id: string }) => t.id)).to.deep.equal([b.id]);

    const reopened = await s.reviewer.post(`${threadsPath(s, imageId)}/${a.id}/reopen`, {});
    expect(reopened.body).to.deep.include({ status: 'open', resolvedBy: null, resolvedAt: null });
    expect((await counts()).body.images[imageId]).to.equal(2);
    const actions = await sql<{ action: string }>(`SELECT action FROM activity_events WHERE image_id = $1 AND action LIKE 'comment.re%' ORDER BY seq`, [imageId]);
    expect(actions.map((x) => x.action)).to.deep.equal(['comment.resolved', 'comment.reopened']);
  });

  it('when an open thread is reopened, or a resolved one resolved again or replied to, then 409 saying what to do and nothing changes', async () => {
    const imageId = await fresh();
    const open = (await s.reviewer.post(threadsPath(s, imageId), { anchor: point(), body: 'Check the scale.' })).body;
    const done = (await s.reviewer.post(threadsPath(s, imageId), { anchor: point([9, 9]), body: 'Check the etch.' })).body;
    await s.researcher.post(`${threadsPath(s, imageId)}/${done.id}/resolve`);
    const before = await reviewRecords(s.projectId, imageId);
    expect(expectApiError(await s.researcher.post(`${threadsPath(s, imageId)}/${open.id}/reopen`), 409, 'conflict').message).to.equal('This thread is already open.');
    expect(expectApiError(await s.reviewer.post(`${threadsPath(s, imageId)}/${done.id}/resolve`), 409, 'conflict').message).to.equal(`${s.people.researcher.displayName} already resolved this thread.`);
    const reply = await s.reviewer.post(`${threadsPath(s, imageId)}/${done.id}/comments`, { body: 'One more thing.' });
    expect(expectApiError(reply, 409, 'conflict').message).to.equal('This thread is resolved; reopen it to reply.');
    expect(await reviewRecords(s.projectId, imageId)).to.deep.equal(before);
  });

  const BAD_THREADS = [
    { title: 'an empty comment', body: { anchor: { kind: 'point', at: [1, 1] }, body: '   ' }, field: 'body.body', says: 'it is empty' },
    { title: 'no comment at all', body: { anchor: { kind: 'point', at: [1, 1] } }, field: 'body.body', says: 'Write a comment' },
    { title: 'a region that crosses itself', body: { anchor: { kind: 'region', ring: [[0, 0], [100, 100], [100, 0], [0, 100]] }, body: 'Here.' }, field: 'body.anchor.ring', says: 'The region crosses itself' },
    { title: 'a region of two points', body: { anchor: { kind: 'region', ring: [[0, 0], [100, 100]] }, body: 'Here.' }, field: 'body.anchor.ring', says: 'at least three points' },
    { title: 'a region reaching outside the image', body: { anchor: { kind: 'region', ring: [[0, 0], [2500, 0], [0, 100]] }, body: 'Here.' }, field: 'body.anchor.ring.1', says: 'outside the image (2000 × 1500 px)' },
    { title: 'a point outside the image', body: { anchor: { kind: 'point', at: [-1, 10] }, body: 'Here.' }, field: 'body.anchor.at', says: 'outside the image' },
    { title: 'an anchor of an unknown kind', body: { anchor: { kind: 'circle', at: [1, 1] }, body: 'Here.' }, field: 'body.anchor.kind', says: 'point, a region or a measurement' },
    { title: 'an unknown field', body: { anchor: { kind: 'point', at: [1, 1] }, body: 'Here.', status: 'resolved' }, field: 'body', says: 'Unknown field' },
  ] as const;
  for (const c of BAD_THREADS) {
    it(`when a thread is opened with ${c.title}, then 422 naming ${c.field} and nothing is stored`, async () => {
      const imageId = await fresh();
      const before = await reviewRecords(s.projectId, imageId);
      const res = await s.reviewer.post(threadsPath(s, imageId), c.body);
      expect(expectApiError(res, 422, 'validation_failed').message).to.contain(c.says);
      expect(fieldsOf(res)).to.include(c.field);
      expect(await reviewRecords(s.projectId, imageId)).to.deep.equal(before);
    });
  }

  it('when a thread is pinned to a measurement of another image, then 422 and nothing is stored', async () => {
    const [imageId, other] = [await fresh(), await fresh()];
    const measurementId = await measurementRow(s, other);
    const before = await reviewRecords(s.projectId, imageId);
    const res = await s.reviewer.post(threadsPath(s, imageId), { anchor: { kind: 'measurement', measurementId }, body: 'This one?' });
    expect(expectApiError(res, 422, 'validation_failed').message).to.contain('not');
    expect(fieldsOf(res)).to.deep.equal(['body.anchor.measurementId']);
    expect(await reviewRecords(s.projectId, imageId)).to.deep.equal(before);
  });

  it('when a reply is empty, then 422 and nothing is stored', async () => {
    const imageId = await fresh();
    const thread = (await s.reviewer.post(threadsPath(s, imageId), { anchor: point(), body: 'First.' })).body;
    const before = await reviewRecords(s.projectId, imageId);
    const res = await s.researcher.post(`${threadsPath(s, imageId)}/${thread.id}/comments`, { body: '\n\t ' });
    expect(expectApiError(res, 422, 'validation_failed').message).to.equal('Check body.body: Write a comment; it is empty.');
    expect(await reviewRecords(s.projectId, imageId)).to.deep.equal(before);
  });

  it('when a comment mentions someone outside the project, then 422 naming that id and nothing is stored, in a new thread or a reply', async () => {
    const imageId = await fresh();
    const stranger = await makeUser();
    const thread = (await s.reviewer.post(threadsPath(s, imageId), { anchor: point(), body: 'First.' })).body;
    const before = await reviewRecords(s.projectId, imageId);
    for (const [path, body] of [
      [threadsPath(s, imageId), { anchor: point(), body: 'Look.', mentions: [s.people.lead.id, stranger.id] }],
      [`${threadsPath(s, imageId)}/${thread.id}/comments`, { body: 'Look.', mentions: [s.people.lead.id, stranger.id] }],
    ] as const) {
      const res = await s.reviewer.post(path, body);
      const error = expectApiError(res, 422, 'validation_failed');
      expect(error.message).to.equal(`Mention only members of this project: ${stranger.id} is not.`);
      expect(error.details).to.deep.equal([{ field: 'body.mentions.1', message: `${stranger.id} is not a member of this project; mention only members.` }]);
    }
    expect(await reviewRecords(s.projectId, imageId)).to.deep.equal(before);
    expect(await notificationsFor(stranger.id, imageId)).to.deep.equal([]);
  });

  it('when someone comments on an image they cannot see, then 404 and nothing is stored', async () => {
    const imageId = await fresh();
    const elsewhere = await makeProject([[s.people.researcher, 'lead']]);
    const hidden = await makeImageRow(elsewhere.id, s.people.researcher);
    const before = await reviewRecords(s.projectId, imageId);
    const asOutsider = await s.outsider.post(threadsPath(s, imageId), { anchor: point(), body: 'Hello?' });
    expect(expectApiError(asOutsider, 404, 'not_found').message).to.equal('The project was not found.');
    const wrongProject = await s.reviewer.post(threadsPath(s, hidden), { anchor: point(), body: 'Hello?' });
    expect(expectApiError(wrongProject, 404, 'not_found').message).to.equal('The image was not found.');
    expect(await reviewRecords(s.projectId, imageId)).to.deep.equal(before);
    expect(await sql('SELECT 1 FROM comment_threads WHERE image_id = $1', [hidden])).to.deep.equal([]);
  });
});
